import type { AppContext } from '../context';
import { Referral, User } from '../models';
import { renderMail } from '../mail/layout';
import { publicUrl } from '../mail/booking-mails';

/** Job kind for one overdue-referral e-mail to one person (queued by `escalateReferral`). */
export const REFERRAL_ESCALATION_MAIL = 'referral-escalation-mail';
export type EscalationKind = 'unaccepted' | 'unanswered' | 'unconsented';

const STILL_OVERDUE: Record<EscalationKind, Referral['status'][]> = { unaccepted: ['sent', 'received'], unanswered: ['accepted', 'in_progress'], unconsented: ['awaiting_consent'] };
const when = (date: Date | null) => `${date?.toISOString().slice(0, 16).replace('T', ' ') ?? 'earlier'} UTC`;

const WORDING: Record<EscalationKind, (r: Referral) => { subject: string; fact: string }> = {
  unaccepted: (r) => ({ subject: `Overdue ${r.urgency} referral`, fact: `A ${r.urgency} referral sent ${when(r.sentAt)} has not been accepted or declined yet.` }),
  unanswered: (r) => ({ subject: `Unanswered ${r.urgency} referral`, fact: `A ${r.urgency} referral accepted ${when(r.acceptedAt)} has no response from the physiotherapist yet.` }),
  unconsented: (r) => ({
    subject: `${r.urgency === 'urgent' ? 'Urgent referral' : 'Referral'} waiting for the rider`,
    fact: `A referral opened ${when(r.createdAt)} still waits for the rider to agree to share their case, so no physiotherapist has it yet. Please contact the rider.`,
  }),
};

/**
 * One overdue-referral e-mail (no health details): the physio gets their referral, the referring
 * fitter the case's room (to chase or choose what next), and admins the people list with both
 * names, since the clinic screen has no referral view yet. Skipped if the referral moved on
 * meanwhile (accepted, answered or closed), or the person is gone. A send failure throws, so the
 * scheduler retries this one e-mail.
 */
export async function sendEscalationMail(ctx: AppContext, payload: Record<string, unknown>) {
  const kind: EscalationKind = payload.kind === 'unanswered' || payload.kind === 'unconsented' ? payload.kind : 'unaccepted';
  const [referral, user] = await Promise.all([Referral.findByPk(Number(payload.referralId)), User.findByPk(Number(payload.userId))]);
  if (!referral || !user || user.status !== 'active' || !STILL_OVERDUE[kind].includes(referral.status)) return;
  const base = publicUrl(ctx);
  const link = user.id === referral.physioId
    ? { label: 'Open the referral', url: `${base}/physio/referrals/${referral.id}` }
    : user.id === referral.fitterId
      ? { label: 'Open the case', url: `${base}/consultations/${referral.consultationId}/room` }
      : { label: 'Open the people list', url: `${base}/admin?tab=people` };
  const { subject, fact } = WORDING[kind](referral);
  const names = user.role === 'admin' ? [await namesLine(referral)] : [];
  await ctx.mailer.send({ to: user.email, ...renderMail({ subject, paragraphs: [`Hello ${user.displayName},`, fact, ...names], action: link }) });
}

async function namesLine(referral: Referral): Promise<string> {
  const [physio, fitter] = await Promise.all([referral.physioId ? User.findByPk(referral.physioId) : null, User.findByPk(referral.fitterId)]);
  return `Physiotherapist: ${physio?.displayName ?? 'not assigned'}. Referring fitter: ${fitter?.displayName ?? 'unknown'}.`;
}
