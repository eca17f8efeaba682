import { z } from 'zod';
import { http } from './http';

/*
 * The lists are empty until later features fill them; items are kept as `unknown` so the home
 * pages can count them today without pretending to know their final shape.
 */
const items = z.array(z.unknown());

const riderHomeSchema = z.object({
  greetingName: z.string(),
  nextAction: z.object({ kind: z.string() }),
  bikes: items,
  consultations: items,
  activePlan: z.unknown().nullable(),
});
export type RiderHome = z.infer<typeof riderHomeSchema>;

const fitterHomeSchema = z.object({
  greetingName: z.string(),
  sessionsToday: items,
  checkInsDue: items,
  gettingWorse: items,
  referralsWaiting: items,
});
export type FitterHome = z.infer<typeof fitterHomeSchema>;

const physioHomeSchema = z.object({
  greetingName: z.string(),
  referrals: items,
});
export type PhysioHome = z.infer<typeof physioHomeSchema>;

export const homesApi = {
  rider: () => http.get('/api/rider/home', riderHomeSchema),
  fitter: () => http.get('/api/fitter/home', fitterHomeSchema),
  physio: () => http.get('/api/physio/home', physioHomeSchema),
};
