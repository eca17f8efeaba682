import type { Transaction } from 'sequelize';
import type { Consultation } from '../models';
import { cancelPendingJobs, scheduleJob } from '../scheduler/jobs';

export const BOOKING_REMINDER = 'booking-reminder';
/** Reminders go out this long before the start (the "24 h before"). */
export const REMINDER_LEAD_MS = 24 * 3_600_000;

/**
 * One reminder per booking version: the key carries the calendar sequence, so a reschedule
 * cancels the old reminder and schedules a new one. Bookings made less than 24 h ahead get none.
 */
export async function scheduleBookingReminder(consultation: Consultation, options: { transaction?: Transaction } = {}) {
  await cancelPendingJobs(BOOKING_REMINDER, `${BOOKING_REMINDER}:${consultation.id}:`, options);
  const runAt = new Date(consultation.startsAt.getTime() - REMINDER_LEAD_MS);
  if (runAt.getTime() <= Date.now()) return;
  await scheduleJob(
    { kind: BOOKING_REMINDER, uniqueKey: `${BOOKING_REMINDER}:${consultation.id}:${consultation.calendarSequence}`, runAt, payload: { consultationId: consultation.id, sequence: consultation.calendarSequence } },
    options,
  );
}

export async function cancelBookingReminders(consultation: Consultation, options: { transaction?: Transaction } = {}) {
  await cancelPendingJobs(BOOKING_REMINDER, `${BOOKING_REMINDER}:${consultation.id}:`, options);
}
