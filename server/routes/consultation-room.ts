import { Router } from 'express';
import { applyStepSchema, noteSchema, revertSchema, saveMeasurementSchema, sendPlanSchema } from '@shared/plan';
import { requireRole } from '../middleware/require-role';
import { validateBody } from '../middleware/validate';
import type { AppContext } from '../context';
import { createPlanController } from '../controllers/plans';

/** The fitter's workspace (case, measuring, plans, notes) and the rider's plan. */
export function createConsultationRoomRouter(ctx: AppContext): Router {
  const router = Router();
  const plans = createPlanController(ctx);
  const fitter = requireRole('fitter');
  const rider = requireRole('rider');

  router.post('/consultations/:id/start', fitter, plans.start);
  router.get('/consultations/:id/case', fitter, plans.caseView);
  router.get('/consultations/:id/plan-inputs', fitter, plans.planInputs);
  router.post('/consultations/:id/plans', fitter, validateBody(sendPlanSchema), plans.create);
  router.get('/consultations/:id/plans', requireRole('rider', 'fitter'), plans.listForConsultation);
  router.get('/consultations/:id/notes', fitter, plans.notes);
  router.post('/consultations/:id/notes', fitter, validateBody(noteSchema), plans.createNote);
  router.post('/uploads/:uploadId/measurements', fitter, validateBody(saveMeasurementSchema), plans.measure);
  router.get('/uploads/:uploadId/measurements', fitter, plans.measurements);
  router.get('/fitter/follow-ups', fitter, plans.followUps);

  router.get('/rider/plans/current', rider, plans.current);
  router.get('/plans/:planId', requireRole('rider', 'fitter'), plans.show);
  router.post('/plans/:planId/steps/:index/apply', rider, validateBody(applyStepSchema), plans.apply);
  router.post('/rider/bikes/:bikeId/revert', rider, validateBody(revertSchema), plans.revert);
  return router;
}
