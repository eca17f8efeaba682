import { Op, type Transaction } from 'sequelize';
import type { AppContext } from '../context';
import { Referral, User } from '../models';
import { scheduleJob } from '../scheduler/jobs';
import { renderMail } from '../mail/layout';
import { publicUrl } from '../mail/booking-mails';
import { userRoom } from '../socket/rooms';

export const REFERRAL_ESCALATE = 'referral-escalate';

/**
 * How long a sent referral may wait for the physio to accept or decline before the clinic is
 * told. Invented clinic defaults (common practice in referral triage: same day for urgent).
 */
export const ESCALATE_AFTER_HOURS = { urgent: 4, soon: 48, routine: 24 * 7 } as const;

export async function scheduleReferralEscalation(referral: Referral, transaction: Transaction) {
  const runAt = new Date(Date.now() + ESCALATE_AFTER_HOURS[referral.urgency] * 3_600_000);
  await scheduleJob({ kind: REFERRAL_ESCALATE, uniqueKey: `${REFERRAL_ESCALATE}:${referral.id}`, runAt, payload: { referralId: referral.id } }, { transaction });
}

type ReferralEvent = 'consent-needed' | 'sent' | 'accepted' | 'declined' | 'responded' | 'hold' | 'hold-cleared';

const MESSAGES: Record<ReferralEvent, { to: ('rider' | 'fitter' | 'physio')[]; subject: string; line: string; path: (r: Referral) => string }> = {
  'consent-needed': { to: ['rider'], subject: 'Your fitter suggests a physiotherapist', line: 'Your fitter suggests a physiotherapist looks at your case. Nothing is shared until you agree.', path: (r) => `/referrals/${r.id}/consent` },
  sent: { to: ['physio', 'fitter'], subject: 'A new referral is waiting', line: 'A referral has been sent with the rider’s agreement.', path: (r) => `/physio/referrals/${r.id}` },
  accepted: { to: ['rider', 'fitter'], subject: 'The physiotherapist accepted the referral', line: 'The physiotherapist has accepted the referral and will be in touch through Saddlestep.', path: (r) => `/consultations/${r.consultationId}/room` },
  declined: { to: ['fitter'], subject: 'A referral was declined', line: 'The physiotherapist declined the referral. Please open the case to choose what to do next.', path: (r) => `/consultations/${r.consultationId}/room` },
  responded: { to: ['rider', 'fitter'], subject: 'The physiotherapist has responded', line: 'The physiotherapist has sent a response. Open Saddlestep to read it.', path: (r) => `/consultations/${r.consultationId}/room` },
  hold: { to: ['rider', 'fitter'], subject: 'Your plan is paused', line: 'The plan is paused until a clinician says it can go on. Open Saddlestep to see why.', path: () => '/plan' },
  'hold-cleared': { to: ['rider', 'fitter'], subject: 'Your plan can go on', line: 'The physiotherapist has lifted the pause on the plan.', path: () => '/plan' },
};

/** E-mail (no health details) and a socket alert to the people an event concerns. */
export async function notifyReferral(ctx: AppContext, referral: Referral, event: ReferralEvent) {
  const spec = MESSAGES[event];
  const ids = { rider: referral.riderId, fitter: referral.fitterId, physio: referral.physioId };
  for (const who of spec.to) {
    const userId = ids[who];
    const user = userId ? await User.findByPk(userId) : null;
    if (!user) continue;
    ctx.io?.to(userRoom(user.id)).emit('care:alert', { kind: `referral-${event}`, consultationId: referral.consultationId, message: spec.subject });
    const mail = renderMail({ subject: spec.subject, paragraphs: [`Hello ${user.displayName},`, spec.line], action: { label: 'Open Saddlestep', url: `${publicUrl(ctx)}${who === 'rider' && event === 'hold' ? '/plan' : spec.path(referral)}` } });
    await ctx.mailer.send({ to: user.email, ...mail }).catch((error: unknown) => ctx.logger.error({ err: error }, 'referral e-mail failed'));
  }
}

/** The escalation job: a referral still not accepted or declined is flagged to the physio and admins. */
export async function escalateReferral(ctx: AppContext, payload: Record<string, unknown>) {
  const referral = await Referral.findByPk(Number(payload.referralId));
  if (!referral || !['sent', 'received'].includes(referral.status)) return;
  await referral.update({ escalatedAt: new Date() });
  const recipients = await User.findAll({ where: { [Op.or]: [{ id: referral.physioId ?? 0 }, { role: 'admin', status: 'active' }] } });
  for (const user of recipients) {
    const mail = renderMail({
      subject: `Overdue ${referral.urgency} referral`,
      paragraphs: [`Hello ${user.displayName},`, `A ${referral.urgency} referral sent ${referral.sentAt?.toISOString().slice(0, 16).replace('T', ' ')} UTC has not been accepted or declined yet.`],
      action: { label: 'Open the referral', url: `${publicUrl(ctx)}${user.role === 'physio' ? `/physio/referrals/${referral.id}` : '/admin'}` },
    });
    await ctx.mailer.send({ to: user.email, ...mail });
  }
}
