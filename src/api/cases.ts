import { z } from 'zod';
import { CONSULTATION_STATES } from '@shared/consultation';
import { setupSchema } from '@shared/fit/setup';
import { REFERRAL_LEVELS } from '@shared/fit/triage';
import { rankedCauseViewSchema, snapshotViewSchema, symptomDraftSchema } from '@shared/rider';
import { LENGTH_UNITS } from '@shared/units';
import { http } from './http';

/*
 * The case as the fitter sees it in the session room. Read leniently where the shape is the
 * intake feature's (profile, triggers), strictly where the workspace computes with it (setups).
 */
const triggerSchema = z.object({
  id: z.string(),
  level: z.enum(REFERRAL_LEVELS),
  text: z.string().optional(),
  reason: z.string().optional(),
  source: z.string().optional(),
});

const profileSchema = z.object({
  unit: z.enum(LENGTH_UNITS).optional(),
  heightMm: z.number().nullable().optional(),
  inseamMm: z.number().nullable().optional(),
  birthYear: z.number().nullable().optional(),
  flexibility: z.string().nullable().optional(),
  ridingStyle: z.string().nullable().optional(),
  hoursPerWeek: z.number().nullable().optional(),
  ridesPerWeek: z.number().nullable().optional(),
  injuryHistory: z.string().optional(),
});

const caseSchema = z.object({
  consultation: z.object({ id: z.number(), status: z.enum(CONSULTATION_STATES) }),
  rider: z.object({ id: z.number(), displayName: z.string(), timeZone: z.string(), profile: profileSchema.nullable() }).nullable(),
  intake: z
    .object({
      symptoms: z.array(symptomDraftSchema),
      redFlagAnswers: z.record(z.string(), z.boolean()).optional(),
      triage: z
        .object({ level: z.enum(REFERRAL_LEVELS), triggers: z.array(triggerSchema), advice: z.string(), causes: z.array(rankedCauseViewSchema).optional() })
        .nullable(),
      goals: z.array(z.string()),
      goalNotes: z.string().optional(),
      submittedAt: z.string().nullable(),
    })
    .nullable(),
  bikes: z.array(z.object({ id: z.number(), name: z.string(), currentSetup: setupSchema.nullable(), snapshots: z.array(snapshotViewSchema) })),
  uploads: z.array(
    z.object({ id: z.number(), kind: z.enum(['photo', 'clip']), view: z.string().nullable(), width: z.number().nullable(), height: z.number().nullable(), createdAt: z.string(), measured: z.boolean().optional() }),
  ),
});
export type CaseFile = z.infer<typeof caseSchema>;
export type CaseUpload = CaseFile['uploads'][number];
export type CaseBike = CaseFile['bikes'][number];

export const casesApi = {
  show: (consultationId: number) => http.get(`/api/consultations/${consultationId}/case`, caseSchema),
  /** Booked → in session; the room then shows the session as started for both. */
  start: (consultationId: number) => http.post(`/api/consultations/${consultationId}/start`, {}, z.object({ consultation: z.object({ id: z.number(), status: z.enum(CONSULTATION_STATES) }) })),
};
