import { z } from 'zod';
import { symptomDraftSchema } from '@shared/rider';
import { http } from './http';
import { checkInTrendSchema } from './check-ins';
import { storedPlanSchema } from './plans';
import { referralSchema, type ClearHoldInput, type DeclineInput, type PhysioResponseInput } from './referrals';

const one = z.object({ referral: referralSchema });

/**
 * The case as the rider agreed to share it. Read leniently where the shape belongs to other
 * features (profile, intake); the physio's screen only shows these, it computes nothing.
 */
const caseSchema = z.object({
  referral: referralSchema,
  rider: z.object({ displayName: z.string(), profile: z.record(z.string(), z.unknown()).nullable() }).nullable(),
  intake: z
    .object({
      symptoms: z.array(symptomDraftSchema),
      triage: z.object({ level: z.string(), advice: z.string(), triggers: z.array(z.object({ id: z.string(), reason: z.string().optional() })) }).nullable().optional(),
      goals: z.array(z.string()).optional(),
      submittedAt: z.string().nullable().optional(),
    })
    .nullable(),
  checkIns: checkInTrendSchema,
  plan: storedPlanSchema.nullable(),
  attachments: z.array(z.object({ id: z.number(), kind: z.enum(['photo', 'clip']), view: z.string().nullable() })),
});
export type PhysioCase = z.infer<typeof caseSchema>;

const post = async (id: number, action: string, body: unknown = {}) => (await http.post(`/api/physio/referrals/${id}/${action}`, body, one)).referral;

/** The physio's inbox and the steps of a referral: opened → accepted or declined → started → answered. */
export const physioApi = {
  /** Sorted by the server: urgent first, then the oldest. */
  inbox: async () => (await http.get('/api/physio/referrals', z.object({ referrals: z.array(referralSchema) }))).referrals,
  /** Opening the case marks it received and returns the referral as it now stands. */
  receive: (id: number) => post(id, 'receive'),
  accept: (id: number) => post(id, 'accept'),
  decline: (id: number, input: DeclineInput) => post(id, 'decline', input),
  start: (id: number) => post(id, 'start'),
  respond: (id: number, input: PhysioResponseInput) => post(id, 'respond', input),
  clearHold: (id: number, input: ClearHoldInput) => post(id, 'clear-hold', input),
  caseFile: (id: number) => http.get(`/api/physio/referrals/${id}/case`, caseSchema),
};
