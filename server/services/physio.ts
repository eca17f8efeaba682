import { Op } from 'sequelize';
import type { PhysioDecision } from '@shared/care';
import type { PhysioLimits } from '@shared/fit/planner';
import { conflict, notFound } from '../errors';
import { Referral } from '../models';
import type { AppContext } from '../context';
import { recordAudit, type AuditActor } from './audit';
import { assertReferralMove, INBOX_STATUSES, PHYSIO_ACCESS_STATUSES } from './referral-states';
import { consentStands } from './referrals';
import { notifyReferral } from './referral-notices';
import { clearRiderHold, holdRiderPlans } from './plan-holds';

const URGENCY_RANK = { urgent: 0, soon: 1, routine: 2 } as const;

/** The physio's inbox: consented referrals, most urgent first, then oldest first. */
export async function physioInbox(physio: Express.User) {
  const rows = await Referral.findAll({ where: { physioId: physio.id, status: { [Op.in]: [...INBOX_STATUSES, 'closed', 'declined'] } }, order: [['sentAt', 'ASC']] });
  const visible = [];
  for (const r of rows) if (await consentStands(r)) visible.push(r);
  return visible.sort((a, b) => {
    const openA = INBOX_STATUSES.includes(a.status) ? 0 : 1;
    const openB = INBOX_STATUSES.includes(b.status) ? 0 : 1;
    return openA - openB || URGENCY_RANK[a.urgency] - URGENCY_RANK[b.urgency] || (a.sentAt?.getTime() ?? 0) - (b.sentAt?.getTime() ?? 0);
  });
}

/** A referral assigned to this physio whose consent still stands, or 404 (withdrawal hides it at once). */
export async function physioReferral(physio: Express.User, referralId: number, options: { needsAccess?: boolean } = {}) {
  const referral = await Referral.findOne({ where: { id: referralId, physioId: physio.id } });
  if (!referral || !(await consentStands(referral))) throw notFound('That referral');
  if (options.needsAccess && !PHYSIO_ACCESS_STATUSES.includes(referral.status)) throw conflict('Accept the referral to open the case.');
  return referral;
}

async function move(ctx: AppContext, physio: Express.User, referralId: number, to: Referral['status'], actor: AuditActor, changes: Partial<Referral> = {}) {
  const referral = await physioReferral(physio, referralId);
  if (to === 'accepted' && referral.status === 'sent') await referral.update({ status: 'received', receivedAt: new Date() });
  assertReferralMove(referral.status, to);
  await referral.update({ ...changes, status: to });
  await recordAudit(actor, { action: `referral.${to}`, subjectType: 'referral', subjectId: referral.id, subjectUserId: referral.riderId });
  return referral;
}

export async function receiveReferral(ctx: AppContext, physio: Express.User, id: number, actor: AuditActor) {
  const referral = await physioReferral(physio, id);
  if (referral.status !== 'sent') return referral;
  return move(ctx, physio, id, 'received', actor, { receivedAt: new Date() });
}

export async function acceptReferral(ctx: AppContext, physio: Express.User, id: number, actor: AuditActor) {
  const referral = await move(ctx, physio, id, 'accepted', actor, { acceptedAt: new Date() });
  await notifyReferral(ctx, referral, 'accepted');
  return referral;
}

export async function declineReferral(ctx: AppContext, physio: Express.User, id: number, note: string, actor: AuditActor) {
  const current = await physioReferral(physio, id);
  if (current.status === 'sent') await current.update({ status: 'received', receivedAt: new Date() });
  const referral = await move(ctx, physio, id, 'declined', actor, { declineNote: note, closedAt: new Date() });
  await notifyReferral(ctx, referral, 'declined');
  return referral;
}

export async function startReferral(ctx: AppContext, physio: Express.User, id: number, actor: AuditActor) {
  return move(ctx, physio, id, 'in_progress', actor);
}

/**
 * The physio's answer: a clinical note and a decision. `hold` pauses every live plan of the rider;
 * `continue_with_limits` stores limits the planner and the server then always apply; `continue`
 * (with or without limits) also lifts a hold a red flag had put on the plan.
 */
export async function respondToReferral(ctx: AppContext, physio: Express.User, id: number, input: { note: string; decision: PhysioDecision; limits?: Partial<PhysioLimits>; holdReason?: string }, actor: AuditActor) {
  const referral = await physioReferral(physio, id, { needsAccess: true });
  assertReferralMove(referral.status, 'closed');
  await ctx.sequelize.transaction(async (transaction) => {
    await referral.update(
      { status: 'closed', closedAt: new Date(), decision: input.decision, responseNote: input.note, limits: input.decision === 'continue_with_limits' ? (input.limits ?? null) : null, holdReason: input.decision === 'hold' ? (input.holdReason ?? null) : null },
      { transaction },
    );
    if (input.decision === 'hold') await holdRiderPlans(ctx, referral.riderId, `Paused by the physiotherapist: ${input.holdReason}`, physio.id, transaction); // reason ≤ 400 chars, so the prefix fits in 500
    else await clearRiderHold(ctx, referral.riderId, 'physiotherapist says the plan may go on', physio.id, transaction);
    await recordAudit(actor, { action: 'referral.respond', subjectType: 'referral', subjectId: referral.id, subjectUserId: referral.riderId, detail: { decision: input.decision } }, { transaction });
  });
  await notifyReferral(ctx, referral, input.decision === 'hold' ? 'hold' : 'responded');
  return referral;
}

/** Only a physio lifts a hold. */
export async function clearHold(ctx: AppContext, physio: Express.User, id: number, note: string, actor: AuditActor) {
  const referral = await physioReferral(physio, id, { needsAccess: true });
  const cleared = await ctx.sequelize.transaction(async (transaction) => {
    const count = await clearRiderHold(ctx, referral.riderId, note, physio.id, transaction);
    if (referral.decision === 'hold') await referral.update({ decision: 'continue', holdReason: null }, { transaction });
    await recordAudit(actor, { action: 'plan.hold_cleared', subjectType: 'referral', subjectId: referral.id, subjectUserId: referral.riderId }, { transaction });
    return count;
  });
  if (cleared === 0) throw conflict('There is no paused plan to release.');
  await notifyReferral(ctx, referral, 'hold-cleared');
  return referral;
}
