import type { Transaction } from 'sequelize';
import type { Consultation } from '../models';
import { cancelPendingJobs, scheduleJob } from '../scheduler/jobs';

export const BOOKING_REMINDER = 'booking-reminder';
/** The usual reminder goes out this long before the start (the "24 h before"). */
export const REMINDER_LEAD_MS = 24 * 3_600_000;
/**
 * Bookings made less than 24 h ahead get a short reminder this long before the start instead
 * (our choice: a same-day booking is easily forgotten by the evening, and riders expect one).
 */
export const SHORT_REMINDER_LEAD_MS = 3_600_000;
/** A booking starting sooner than this after the short reminder's time gets none: its confirmation is minutes old. */
const TOO_LATE_FOR_REMINDER_MS = 10 * 60_000;

/**
 * One reminder per booking version: the key carries the calendar sequence, so a reschedule
 * cancels the old reminder and schedules a new one. 24 h before when there is time for it,
 * otherwise 1 h before; none when even that is (nearly) past.
 */
export async function scheduleBookingReminder(consultation: Consultation, options: { transaction?: Transaction } = {}, now = Date.now()) {
  await cancelPendingJobs(BOOKING_REMINDER, `${BOOKING_REMINDER}:${consultation.id}:`, options);
  const start = consultation.startsAt.getTime();
  const dayBefore = start - REMINDER_LEAD_MS;
  const hourBefore = start - SHORT_REMINDER_LEAD_MS;
  const [runAt, lead] = dayBefore > now ? [dayBefore, 'day'] : hourBefore > now + TOO_LATE_FOR_REMINDER_MS ? [hourBefore, 'hour'] : [null, null];
  if (runAt === null) return;
  await scheduleJob(
    {
      kind: BOOKING_REMINDER,
      uniqueKey: `${BOOKING_REMINDER}:${consultation.id}:${consultation.calendarSequence}`,
      runAt: new Date(runAt),
      payload: { consultationId: consultation.id, sequence: consultation.calendarSequence, lead },
    },
    options,
  );
}

export async function cancelBookingReminders(consultation: Consultation, options: { transaction?: Transaction } = {}) {
  await cancelPendingJobs(BOOKING_REMINDER, `${BOOKING_REMINDER}:${consultation.id}:`, options);
}
