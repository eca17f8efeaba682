import { createEvent } from 'ics';
import type { Consultation } from '../models';

/**
 * An iCalendar invite for a consultation. The UID is stable for the consultation's life, so a
 * reschedule (REQUEST with a higher SEQUENCE) updates the entry in the rider's calendar and a
 * cancellation (CANCEL) removes it. No health details: only the time and a link.
 */
export function consultationInvite(input: {
  consultation: Pick<Consultation, 'calendarUid' | 'calendarSequence' | 'startsAt' | 'endsAt'>;
  cancelled: boolean;
  link: string;
  fitterName: string;
  organizerEmail: string;
  attendee: { name: string; email: string };
}): string {
  const { consultation, cancelled } = input;
  const result = createEvent({
    productId: 'saddlestep/consultations',
    method: cancelled ? 'CANCEL' : 'REQUEST',
    uid: consultation.calendarUid,
    sequence: consultation.calendarSequence,
    start: consultation.startsAt.getTime(),
    startInputType: 'utc',
    startOutputType: 'utc',
    end: consultation.endsAt.getTime(),
    endInputType: 'utc',
    endOutputType: 'utc',
    title: `Bike-fit session with ${input.fitterName}`,
    description: `Join from Saddlestep: ${input.link}`,
    url: input.link,
    status: cancelled ? 'CANCELLED' : 'CONFIRMED',
    busyStatus: 'BUSY',
    organizer: { name: 'Saddlestep', email: input.organizerEmail },
    attendees: [{ name: input.attendee.name, email: input.attendee.email, rsvp: false, partstat: 'ACCEPTED', role: 'REQ-PARTICIPANT' }],
  });
  if (result.error || !result.value) throw result.error ?? new Error('could not build the calendar invite');
  return result.value;
}
