/**
 * How long before its booked time a fitter may start a session: our decision (people join a
 * video call a little early). Starting any earlier would take the booking out of the rider's
 * hands days ahead: an in-session booking can no longer be moved or cancelled.
 */
export const START_EARLY_MINUTES = 15;

/** The first moment a session booked for `startsAt` may be started. */
export function earliestStart(startsAt: Date): Date {
  return new Date(startsAt.getTime() - START_EARLY_MINUTES * 60_000);
}

/** Whether a session booked for `startsAt` may be started at `now` (there is no latest time). */
export function mayStartSession(startsAt: Date, now: Date): boolean {
  return now.getTime() >= earliestStart(startsAt).getTime();
}
