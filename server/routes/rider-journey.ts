import { Router } from 'express';
import {
  bikeCreateSchema, bikeUpdateSchema, intakeDraftSchema, intakeSubmitSchema, profileInputSchema, snapshotInputSchema, unitPreferenceSchema,
} from '@shared/rider';
import { requireRole } from '../middleware/require-role';
import { validateBody } from '../middleware/validate';
import { receiveSingleUpload } from '../middleware/upload';
import * as profile from '../controllers/rider-profile';
import { createBikesController } from '../controllers/bikes';
import { createIntakesController } from '../controllers/intakes';
import { createUploadsController } from '../controllers/uploads';
import type { AppContext } from '../context';

/**
 * The rider's journey before booking: profile, bikes and setups, the intake with its red-flag
 * screen and consent, photos and clips. Readers of another rider's health data (the assigned
 * fitter, a referred physio) reach intakes and files only through the /intakes and /uploads
 * routes, which check the relation and answer 404 otherwise.
 */
export function createRiderJourneyRouter(ctx: AppContext): Router {
  const router = Router();
  const rider = requireRole('rider');
  const bikes = createBikesController(ctx);
  const intakes = createIntakesController(ctx);
  const uploads = createUploadsController(ctx);

  router.get('/rider/profile', rider, profile.show);
  router.put('/rider/profile', rider, validateBody(profileInputSchema), profile.save);
  router.put('/rider/unit-preference', rider, validateBody(unitPreferenceSchema), profile.saveUnit);

  router.get('/rider/bikes', rider, bikes.list);
  router.post('/rider/bikes', rider, validateBody(bikeCreateSchema), bikes.create);
  router.get('/rider/bikes/:id', rider, bikes.show);
  router.patch('/rider/bikes/:id', rider, validateBody(bikeUpdateSchema), bikes.update);
  router.delete('/rider/bikes/:id', rider, bikes.retire);
  router.post('/rider/bikes/:id/snapshots', rider, validateBody(snapshotInputSchema), bikes.addSnapshot);

  router.get('/rider/intake', rider, intakes.current);
  router.put('/rider/intake/draft', rider, validateBody(intakeDraftSchema), intakes.saveDraft);
  router.delete('/rider/intake/draft', rider, intakes.discard);
  router.post('/rider/intake/submit', rider, validateBody(intakeSubmitSchema), intakes.submit);
  router.get('/rider/booking-readiness', rider, intakes.readiness);
  router.get('/rider/consents', rider, intakes.consents);
  router.post('/rider/consents/:id/withdraw', rider, intakes.withdraw);

  router.post('/rider/uploads', rider, receiveSingleUpload, uploads.create);
  router.get('/rider/uploads', rider, uploads.list);
  router.delete('/rider/uploads/:id', rider, uploads.remove);

  const healthReaders = requireRole('rider', 'fitter', 'physio');
  router.get('/intakes/:id', healthReaders, intakes.show);
  router.get('/uploads/:id/file', healthReaders, uploads.serveFile);
  router.get('/uploads/:id/thumbnail', healthReaders, uploads.serveThumbnail);
  return router;
}
