import { z } from 'zod';
import { bookingReadinessSchema, consentViewSchema, intakeViewSchema, type IntakeDraftInput, type IntakeSubmitInput } from '@shared/rider';
import { http } from './http';

const current = z.object({ draft: intakeViewSchema.nullable(), submitted: intakeViewSchema.nullable() });

/** "Tell us what hurts": the draft, submission (the server computes the triage) and readiness to book. */
export const intakeApi = {
  current: () => http.get('/api/rider/intake', current),
  saveDraft: async (input: IntakeDraftInput) => (await http.put('/api/rider/intake/draft', input, z.object({ intake: intakeViewSchema }))).intake,
  discardDraft: () => http.deleteEmpty('/api/rider/intake/draft'),
  submit: (input: IntakeSubmitInput) => http.post('/api/rider/intake/submit', input, z.object({ intake: intakeViewSchema, readiness: bookingReadinessSchema })),
  readiness: () => http.get('/api/rider/booking-readiness', bookingReadinessSchema),
  consents: async () => (await http.get('/api/rider/consents', z.object({ consents: z.array(consentViewSchema) }))).consents,
};
