import { z } from 'zod';
import { CHECK_IN_DECISIONS } from '@shared/fit/checkin';
import { http } from './http';
import { referralSchema } from './referrals';

const followUpSchema = z.object({
  riderId: z.number(),
  riderName: z.string(),
  consultationId: z.number(),
  planId: z.number(),
  stepIndex: z.number(),
  checkInDue: z.string().nullable(),
  state: z.string(),
  /** For riders getting worse: what their latest check-in concluded. */
  decision: z.enum(CHECK_IN_DECISIONS).optional(),
  /** The latest check-in reported urgent warning signs: shown as urgent, above everything else. */
  urgent: z.boolean().optional(),
  checkInId: z.number().optional(),
});
export type FollowUp = z.infer<typeof followUpSchema>;

const followUpsSchema = z.object({
  due: z.array(followUpSchema),
  overdue: z.array(followUpSchema),
  gettingWorse: z.array(followUpSchema),
  /** System proposals to confirm and referrals a physio declined. */
  referralsWaiting: z.array(referralSchema).default([]),
});
export type FollowUps = z.infer<typeof followUpsSchema>;

/** The fitter's riders whose check-in is due, late, or whose check-ins show them getting worse. */
export const followUpsApi = {
  list: () => http.get('/api/fitter/follow-ups', followUpsSchema),
};
