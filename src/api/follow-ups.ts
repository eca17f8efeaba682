import { z } from 'zod';
import { http } from './http';

const followUpSchema = z.object({
  riderId: z.number(),
  riderName: z.string(),
  consultationId: z.number(),
  planId: z.number(),
  stepIndex: z.number(),
  checkInDue: z.string().nullable(),
  state: z.string(),
});
export type FollowUp = z.infer<typeof followUpSchema>;

const followUpsSchema = z.object({
  due: z.array(followUpSchema),
  overdue: z.array(followUpSchema),
  gettingWorse: z.array(followUpSchema),
});
export type FollowUps = z.infer<typeof followUpsSchema>;

/** The fitter's riders whose check-in is due, late, or whose check-ins show them getting worse. */
export const followUpsApi = {
  list: () => http.get('/api/fitter/follow-ups', followUpsSchema),
};
