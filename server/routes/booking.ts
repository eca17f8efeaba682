import { Router } from 'express';
import { cancelSchema, fitterSettingsSchema, holdSlotSchema, noShowSchema, paymentSchema, rescheduleSchema } from '@shared/booking';
import { requireRole } from '../middleware/require-role';
import { validateBody } from '../middleware/validate';
import type { AppContext } from '../context';
import * as fitters from '../controllers/fitters';
import { createConsultationController } from '../controllers/consultations';

/** Fitters, availability, slots, holds, payment, rescheduling and cancellation. */
export function createBookingRouter(ctx: AppContext): Router {
  const router = Router();
  const consultations = createConsultationController(ctx);

  router.get('/fitters', requireRole('rider'), fitters.list);
  router.get('/fitters/:id/slots', requireRole('rider', 'fitter'), fitters.slots);
  router.get('/fitter/settings', requireRole('fitter'), fitters.ownSettings);
  router.put('/fitter/settings', requireRole('fitter'), validateBody(fitterSettingsSchema), fitters.saveSettings);

  router.get('/payments/card-entry', requireRole('rider'), consultations.cardEntry);
  router.post('/consultations', requireRole('rider'), validateBody(holdSlotSchema), consultations.hold);
  router.get('/consultations', requireRole('rider', 'fitter'), consultations.list);
  router.get('/consultations/:id', requireRole('rider', 'fitter', 'physio'), consultations.show);
  router.get('/consultations/:id/cancellation-terms', requireRole('rider', 'fitter'), consultations.terms);
  router.post('/consultations/:id/payment', requireRole('rider'), validateBody(paymentSchema), consultations.pay);
  router.post('/consultations/:id/reschedule', requireRole('rider', 'fitter'), validateBody(rescheduleSchema), consultations.move);
  router.post('/consultations/:id/cancel', requireRole('rider', 'fitter', 'admin'), validateBody(cancelSchema), consultations.cancel);
  router.post('/consultations/:id/no-show', requireRole('fitter'), validateBody(noShowSchema), consultations.noShow);
  return router;
}
