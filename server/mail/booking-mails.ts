import { formatMoney } from '@shared/booking';
import type { AppContext } from '../context';
import { Consultation, User } from '../models';
import { consultationInvite } from './calendar';
import { renderMail } from './layout';

/** Where e-mail links point: the configured public address, or the local server. */
export function publicUrl(ctx: Pick<AppContext, 'config'>): string {
  return (ctx.config.PUBLIC_URL ?? `http://127.0.0.1:${ctx.config.PORT}`).replace(/\/$/, '');
}

/** "Tuesday 9 March 2027, 09:00 (Europe/Berlin)" in the reader's own zone. */
export function formatWhen(date: Date, timeZone: string): string {
  const text = new Intl.DateTimeFormat('en-GB', { timeZone, weekday: 'long', day: 'numeric', month: 'long', year: 'numeric', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).format(date);
  return `${text} (${timeZone})`;
}

async function parties(consultation: Consultation) {
  const [rider, fitter] = await Promise.all([User.findByPk(consultation.riderId), User.findByPk(consultation.fitterId)]);
  if (!rider || !fitter) throw new Error(`consultation ${consultation.id} has lost a party`);
  return { rider, fitter };
}

function inviteFor(ctx: AppContext, consultation: Consultation, fitter: User, person: User, cancelled: boolean) {
  const content = consultationInvite({
    consultation,
    cancelled,
    link: `${publicUrl(ctx)}/consultations/${consultation.id}`,
    fitterName: fitter.displayName,
    organizerEmail: ctx.config.MAIL_FROM.match(/<([^>]+)>/)?.[1] ?? 'no-reply@saddlestep.test',
    attendee: { name: person.displayName, email: person.email },
  });
  return { filename: cancelled ? 'cancel.ics' : 'invite.ics', content, contentType: `text/calendar; charset=utf-8; method=${cancelled ? 'CANCEL' : 'REQUEST'}`, method: cancelled ? 'CANCEL' : 'REQUEST' };
}

/** Confirmation (or update after a reschedule) with a calendar invite, to rider and fitter. */
export async function sendBookingConfirmation(ctx: AppContext, consultation: Consultation, kind: 'booked' | 'moved') {
  const { rider, fitter } = await parties(consultation);
  const link = `${publicUrl(ctx)}/consultations/${consultation.id}`;
  for (const person of [rider, fitter]) {
    const other = person.id === rider.id ? fitter.displayName : rider.displayName;
    const mail = renderMail({
      subject: kind === 'booked' ? `Booked: bike-fit session on ${formatWhen(consultation.startsAt, person.timeZone)}` : `Moved: your bike-fit session is now ${formatWhen(consultation.startsAt, person.timeZone)}`,
      paragraphs: [
        `Hello ${person.displayName},`,
        kind === 'booked' ? `Your session with ${other} is booked.` : `Your session with ${other} has a new time.`,
        `When: ${formatWhen(consultation.startsAt, person.timeZone)}.`,
        'The attached invite adds it to your calendar. Join from Saddlestep at that time.',
      ],
      action: { label: 'Open the session', url: link },
    });
    await ctx.mailer.send({ to: person.email, ...mail, attachments: [inviteFor(ctx, consultation, fitter, person, false)] });
  }
}

export async function sendReceipt(ctx: AppContext, consultation: Consultation, payment: { amountMinor: number; currency: string; stripeChargeId: string | null; createdAt: Date }) {
  const { rider, fitter } = await parties(consultation);
  const mail = renderMail({
    subject: `Receipt: ${formatMoney(payment.amountMinor, payment.currency, 'en-GB')} for your bike-fit session`,
    paragraphs: [
      `Hello ${rider.displayName},`,
      `We received ${formatMoney(payment.amountMinor, payment.currency, 'en-GB')} on ${formatWhen(payment.createdAt, rider.timeZone)} for a remote bike-fit session with ${fitter.displayName}.`,
      `Reference: ${payment.stripeChargeId ?? 'pending'} · session ${consultation.id}.`,
    ],
    action: { label: 'See your booking', url: `${publicUrl(ctx)}/consultations/${consultation.id}` },
  });
  await ctx.mailer.send({ to: rider.email, ...mail });
}

/** `lead` says which reminder: the usual day-before one, or the short one for late bookings. */
export async function sendReminder(ctx: AppContext, consultation: Consultation, lead: 'day' | 'hour' = 'day') {
  const { rider, fitter } = await parties(consultation);
  const when = formatWhen(consultation.startsAt, rider.timeZone);
  const mail = renderMail({
    subject: lead === 'day' ? `Tomorrow: bike-fit session at ${when}` : `Starting soon: bike-fit session at ${when}`,
    paragraphs: [
      `Hello ${rider.displayName},`,
      `A reminder: your session with ${fitter.displayName} starts ${when}.`,
      'Have your bike on a trainer, a tape measure and a spirit level at hand.',
    ],
    action: { label: 'Open the session', url: `${publicUrl(ctx)}/consultations/${consultation.id}` },
  });
  await ctx.mailer.send({ to: rider.email, ...mail });
}

export interface RefundLine {
  amountMinor: number;
  currency: string;
  reason: string;
  /** Stripe refused the refund for good; the studio sorts it out by hand. */
  failed?: boolean;
}

function refundSentence(refund: RefundLine): string {
  if (refund.failed) return 'We could not send your refund to your card automatically. The studio has been told and will contact you about it.';
  return refund.amountMinor > 0 ? `${formatMoney(refund.amountMinor, refund.currency, 'en-GB')} is on its way back to your card. ${refund.reason}` : `No refund is due. ${refund.reason}`;
}

/**
 * Cancellation notice with the calendar cancellation and the refund, to both parties, or to one:
 * when a refund is due the rider's notice waits until Stripe has taken it (see refund-jobs.ts).
 */
export async function sendCancellation(ctx: AppContext, consultation: Consultation, refund: RefundLine | null, options: { to?: 'rider' | 'fitter' | 'both' } = {}) {
  const { rider, fitter } = await parties(consultation);
  const to = options.to ?? 'both';
  const people = to === 'both' ? [rider, fitter] : to === 'rider' ? [rider] : [fitter];
  for (const person of people) {
    const refundLine = refund && person.id === rider.id ? refundSentence(refund) : '';
    const mail = renderMail({
      subject: `Cancelled: bike-fit session on ${formatWhen(consultation.startsAt, person.timeZone)}`,
      paragraphs: [`Hello ${person.displayName},`, `The session on ${formatWhen(consultation.startsAt, person.timeZone)} is cancelled.`, refundLine].filter(Boolean),
      action: { label: 'See the booking', url: `${publicUrl(ctx)}/consultations/${consultation.id}` },
    });
    await ctx.mailer.send({ to: person.email, ...mail, attachments: [inviteFor(ctx, consultation, fitter, person, true)] });
  }
}

/** A refund that is not part of a cancellation (an admin's refund, a late charge given back). */
export async function sendRefundNotice(ctx: AppContext, consultation: Consultation, refund: RefundLine) {
  const { rider } = await parties(consultation);
  const subject = refund.failed ? 'Refund: the studio will contact you' : `Refund: ${formatMoney(refund.amountMinor, refund.currency, 'en-GB')} for your bike-fit session`;
  const mail = renderMail({
    subject,
    paragraphs: [`Hello ${rider.displayName},`, refundSentence(refund), `Session reference: ${consultation.id}.`],
    action: { label: 'See your booking', url: `${publicUrl(ctx)}/consultations/${consultation.id}` },
  });
  await ctx.mailer.send({ to: rider.email, ...mail });
}
