import { z } from 'zod';
import { http } from './http';

/** The kinds the server's `riderNextAction` works out, in its order of priority. */
export const NEXT_ACTION_KINDS = ['seek_care', 'plan_on_hold', 'check_in', 'apply_step', 'join_room', 'session_booked', 'finish_paying', 'plan_under_way', 'continue_intake', 'tell_us_what_hurts', 'book'] as const;
export type NextActionKind = (typeof NEXT_ACTION_KINDS)[number];

const riderHomeSchema = z.object({
  greetingName: z.string(),
  nextAction: z.object({
    kind: z.enum(NEXT_ACTION_KINDS),
    consultationId: z.number().optional(),
    planId: z.number().optional(),
    stepIndex: z.number().optional(),
  }),
});
export type RiderHome = z.infer<typeof riderHomeSchema>;
export type NextAction = RiderHome['nextAction'];

/* Fitter and physio home pages read their own lists (follow-ups, sessions, the referral inbox). */
export const homesApi = {
  rider: () => http.get('/api/rider/home', riderHomeSchema),
};
