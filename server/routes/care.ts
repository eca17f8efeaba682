import { Router } from 'express';
import { checkInFormSchema, clearHoldSchema, createReferralSchema, declineReferralSchema, physioResponseSchema, referralConsentSchema } from '@shared/care';
import { requireRole } from '../middleware/require-role';
import { validateBody } from '../middleware/validate';
import type { AppContext } from '../context';
import { createCareController } from '../controllers/care';

/** Check-ins, referrals to a physio, the physio's inbox and responses. */
export function createCareRouter(ctx: AppContext): Router {
  const router = Router();
  const care = createCareController(ctx);
  const rider = requireRole('rider');
  const fitter = requireRole('fitter');
  const physio = requireRole('physio');

  router.post('/plans/:planId/steps/:index/check-ins', rider, validateBody(checkInFormSchema), care.checkIn);
  router.post('/plans/:planId/steps/:index/revert', rider, care.undoStep);
  router.get('/rider/check-ins', rider, care.ownTrend);
  router.get('/consultations/:id/check-ins', requireRole('fitter', 'physio'), care.consultationTrend);
  router.post('/check-ins/:id/review', fitter, care.review);

  router.get('/physios', fitter, care.physios);
  router.post('/consultations/:id/referrals', fitter, validateBody(createReferralSchema), care.refer);
  router.get('/consultations/:id/referrals', requireRole('rider', 'fitter'), care.consultationReferrals);
  router.post('/referrals/:id/confirm', fitter, validateBody(createReferralSchema), care.confirm);
  router.get('/rider/referrals', rider, care.riderReferrals);
  router.post('/rider/referrals/:id/consent', rider, validateBody(referralConsentSchema), care.consent);

  router.get('/physio/referrals', physio, care.inbox);
  router.get('/physio/referrals/:id/case', physio, care.caseView);
  router.post('/physio/referrals/:id/receive', physio, care.physioAction('receive'));
  router.post('/physio/referrals/:id/accept', physio, care.physioAction('accept'));
  router.post('/physio/referrals/:id/start', physio, care.physioAction('start'));
  router.post('/physio/referrals/:id/decline', physio, validateBody(declineReferralSchema), care.decline);
  router.post('/physio/referrals/:id/respond', physio, validateBody(physioResponseSchema), care.respond);
  router.post('/physio/referrals/:id/clear-hold', physio, validateBody(clearHoldSchema), care.release);
  return router;
}
