import { Op, type Transaction } from 'sequelize';
import type { AppContext } from '../context';
import { Referral, User } from '../models';
import { scheduleJob } from '../scheduler/jobs';
import { renderMail } from '../mail/layout';
import { publicUrl } from '../mail/booking-mails';
import { userRoom } from '../socket/rooms';
import { REFERRAL_ESCALATION_MAIL, type EscalationKind } from './referral-escalation-mail';

/** Job kind for every timed referral follow-up (escalations and the consent notice); `stage` says which. */
export const REFERRAL_ESCALATE = 'referral-escalate';

/**
 * How long a sent referral may wait for the physio to accept or decline before the clinic is
 * told. Invented clinic defaults (common practice in referral triage: same day for urgent).
 */
export const ESCALATE_AFTER_HOURS = { urgent: 4, soon: 48, routine: 24 * 7 } as const;

/**
 * How long an accepted referral may wait for the physio's response before the clinic is told.
 * Our own decision (invented clinic defaults): answering needs an assessment, accepting does not,
 * so each is several times the acceptance window. Urgent: one day, because every plan of the rider
 * is paused and the rider was told to seek urgent care; soon: a working week; routine: two weeks.
 */
export const ANSWER_AFTER_HOURS = { urgent: 24, soon: 5 * 24, routine: 14 * 24 } as const;

type Stage = 'unaccepted' | 'unanswered' | 'consent-notice' | 'consent-overdue';
const HOUR = 3_600_000;

function schedule(referral: Referral, stage: Stage, key: string, runAt: Date, transaction?: Transaction, extra: Record<string, unknown> = {}) {
  return scheduleJob({ kind: REFERRAL_ESCALATE, uniqueKey: `${REFERRAL_ESCALATE}:${key}:${referral.id}`, runAt, payload: { referralId: referral.id, stage, ...extra } }, { transaction });
}

/** At consent: check acceptance after the urgency's window (this key predates stages, so it has none). */
export async function scheduleReferralEscalation(referral: Referral, transaction: Transaction) {
  const runAt = new Date(Date.now() + ESCALATE_AFTER_HOURS[referral.urgency] * HOUR);
  await scheduleJob({ kind: REFERRAL_ESCALATE, uniqueKey: `${REFERRAL_ESCALATE}:${referral.id}`, runAt, payload: { referralId: referral.id } }, { transaction });
}

/**
 * A referral the system opened (urgent red flag) waits for the rider's agreement: tell the rider
 * once, and if it still waits after the urgent acceptance window, tell the fitter and the clinic,
 * who can reach the rider by other means (nothing goes to a physio before the rider agrees). The
 * jobs' unique keys make a second urgent flag on the same referral add nothing; each job re-reads
 * the referral and stays silent if it is no longer waiting for consent.
 */
export async function scheduleConsentNotice(referral: Referral, transaction: Transaction) {
  await schedule(referral, 'consent-notice', 'consent-notice', new Date(), transaction);
  await schedule(referral, 'consent-overdue', 'consent-overdue', new Date(Date.now() + ESCALATE_AFTER_HOURS[referral.urgency] * HOUR), transaction);
}

type ReferralEvent = 'consent-needed' | 'sent' | 'accepted' | 'declined' | 'responded' | 'hold' | 'hold-cleared';

const MESSAGES: Record<ReferralEvent, { to: ('rider' | 'fitter' | 'physio')[]; subject: string; line: string; path: (r: Referral) => string }> = {
  'consent-needed': { to: ['rider'], subject: 'Your fitter suggests a physiotherapist', line: 'Your fitter suggests a physiotherapist looks at your case. Nothing is shared until you agree: open Saddlestep to agree to share.', path: (r) => `/referrals/${r.id}/consent` },
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

/**
 * The referral follow-up job. `unaccepted` (the first check, at the acceptance window): still sent
 * or received → escalate, then check for an answer a full answer window later; already accepted →
 * check for an answer at acceptance + the answer window. `unanswered`: accepted or started but not
 * answered → escalate, unless it was accepted late and its window is still open, in which case one
 * final check is set for the window's end. Each escalation is sent at most once per referral:
 * every job has its own unique key and exactly one path sends.
 */
export async function escalateReferral(ctx: AppContext, payload: Record<string, unknown>) {
  const referral = await Referral.findByPk(Number(payload.referralId));
  if (!referral) return;
  const stage = (payload.stage ?? 'unaccepted') as Stage;
  const answerWindow = ANSWER_AFTER_HOURS[referral.urgency] * HOUR;
  const awaitingAnswer = ['accepted', 'in_progress'].includes(referral.status);
  if (stage === 'consent-notice') {
    if (referral.status === 'awaiting_consent') await notifyReferral(ctx, referral, 'consent-needed');
  } else if (stage === 'consent-overdue') {
    if (referral.status === 'awaiting_consent') await sendEscalation(ctx, referral, 'unconsented');
  } else if (stage === 'unaccepted') {
    if (['sent', 'received'].includes(referral.status)) {
      await sendEscalation(ctx, referral, 'unaccepted');
      await schedule(referral, 'unanswered', 'answer', new Date(Date.now() + answerWindow));
    } else if (awaitingAnswer) {
      await schedule(referral, 'unanswered', 'answer', new Date((referral.acceptedAt ?? new Date()).getTime() + answerWindow));
    }
  } else if (awaitingAnswer) {
    const due = (referral.acceptedAt ?? new Date()).getTime() + answerWindow;
    if (due > Date.now() && payload.final !== true) await schedule(referral, 'unanswered', 'answer-late', new Date(due), undefined, { final: true });
    else await sendEscalation(ctx, referral, 'unanswered');
  }
}

/**
 * Flag an overdue referral: mark it, and queue one e-mail job per person (the physio, the
 * referring fitter, every active admin) in the same transaction. A failing mail server then
 * retries only that person's e-mail, and a re-run of this job queues nothing new (the keys are
 * per referral, stage and person).
 */
async function sendEscalation(ctx: AppContext, referral: Referral, kind: EscalationKind) {
  // Before the rider agrees, the physio must not even learn there is a case.
  const physioId = kind === 'unconsented' ? 0 : (referral.physioId ?? 0);
  const people = await User.findAll({ attributes: ['id'], where: { [Op.or]: [{ id: [physioId, referral.fitterId] }, { role: 'admin', status: 'active' }] } });
  await ctx.sequelize.transaction(async (transaction) => {
    // `escalatedAt` is the physio's "Overdue: reminder sent" badge: not for a referral they have
    // not received yet (it would greet them on arrival after the rider finally agrees).
    if (kind !== 'unconsented') await referral.update({ escalatedAt: new Date() }, { transaction });
    for (const user of people) {
      await scheduleJob(
        { kind: REFERRAL_ESCALATION_MAIL, uniqueKey: `${REFERRAL_ESCALATION_MAIL}:${kind}:${referral.id}:${user.id}`, runAt: new Date(), payload: { referralId: referral.id, kind, userId: user.id } },
        { transaction },
      );
    }
  });
}
