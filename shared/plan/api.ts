import { z } from 'zod';
import { isoDateSchema, setupSchema } from '../fit/setup/schemas';
import { photoMeasurementInputSchema } from '../fit/photo/schemas';

const id = (what: string) => z.number({ error: `Say which ${what}.` }).int().positive().max(4_294_967_295);

/**
 * POST /api/consultations/:id/plans. The server builds the plan itself from its own inputs, the
 * `target` and `startDate`; `plan` is the preview the fitter saw, re-checked by `validatePlan` and
 * compared with the server's build (a difference is refused), never stored.
 */
export const sendPlanSchema = z.strictObject({
  bikeId: id('bike'),
  target: setupSchema,
  startDate: isoDateSchema.optional(),
  plan: z.unknown().refine((value) => typeof value === 'object' && value !== null, 'Send the previewed plan.'),
});

export const planInputsQuerySchema = z.strictObject({
  bikeId: z.coerce.number({ error: 'Say which bike.' }).int().positive().max(4_294_967_295),
});

export const applyStepSchema = z.strictObject({ appliedOn: isoDateSchema });
export const revertSchema = z.strictObject({ snapshotId: id('earlier setup') });

export const NOTE_MAX_CHARS = 5000;
export const noteSchema = z.strictObject({
  body: z.string({ error: 'Write the note.' }).trim().min(1, 'Write the note.').max(NOTE_MAX_CHARS, `A note can be at most ${NOTE_MAX_CHARS} characters.`),
});

export const saveMeasurementSchema = z.strictObject({
  consultationId: id('consultation'),
  input: photoMeasurementInputSchema,
});
