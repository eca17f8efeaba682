import { Op, type Transaction } from 'sequelize';
import { randomUUID } from 'node:crypto';
import { buildPlan, stepBeyondPhysioLimits, validatePlan, type PlanInput, type Plan as PlanBody } from '@shared/fit/planner';
import { REFERRAL_ADVICE } from '@shared/fit/triage';
import { addDays } from '@shared/fit/setup';
import type { ConsultationState } from '@shared/consultation';
import { planSendBlocker } from '@shared/plan';
import { AppError, conflict, notFound, badRequest } from '../errors';
import { Consultation, Plan, PlanStep, SetupSnapshot } from '../models';
import type { AppContext } from '../context';
import { transitionConsultation } from './consultation-states';
import { buildPlanInputs, currentCondition, physioLimitsFor } from './plan-inputs';
import { getClinicSettings } from './clinic-settings';
import { planDifferences } from './plan-compare';
import { latestTodayAnywhere } from '@shared/rider';
import { recordSnapshot } from './setup-history';
import { recordAudit, type AuditActor } from './audit';
import { postMessage } from './chat';
import { noticeRecipients } from './chat-notices';
import { consultationRoom } from '../socket/rooms';
import { scheduleCheckInJobs } from './follow-up-jobs';
import { nextStepBlocker } from './check-ins';

/** Create the step rows for a stored plan: step 1 is current, the rest wait their turn. */
async function createStepRows(plan: Plan, body: PlanBody, transaction: Transaction) {
  await PlanStep.bulkCreate(
    body.steps.map((step, i) => ({
      planId: plan.id,
      stepIndex: step.index,
      state: i === 0 ? 'current' : 'locked',
      earliestDate: step.earliestDate,
      minRides: step.minRides,
      appliedOn: null,
      checkInDue: null,
      checkedInAt: null,
      overdueAt: null,
      snapshotId: null,
    })) as never[],
    { transaction },
  );
}

/** Supersede the rider's active plan for this bike (a new plan or a revert replaces it). */
async function supersedeActive(riderId: number, bikeId: number, transaction: Transaction) {
  await Plan.update({ status: 'superseded' }, { where: { riderId, bikeId, status: { [Op.in]: ['active', 'on_hold'] } }, transaction });
}

/** Post the plan card into the consultation's chat, tell the room, and notify readers elsewhere. */
async function announcePlan(ctx: AppContext, consultation: Consultation, plan: Plan, senderId: number) {
  const steps = plan.plan.steps.length;
  const body = plan.kind === 'revert' ? 'A plan to go back to an earlier setup.' : `A new plan with ${steps} step${steps === 1 ? '' : 's'}.`;
  await ctx.runInOrder(consultationRoom(consultation.id), async () => {
    const { message } = await postMessage(ctx, { id: senderId }, consultation, { clientId: randomUUID(), body, kind: 'plan', planId: plan.id });
    ctx.io?.to(consultationRoom(consultation.id)).emit('message:created', message);
  });
  // Like any message: the unread badge moves, and a rider away from the room gets the batched e-mail.
  if (ctx.io) await noticeRecipients(ctx, ctx.io, consultation, senderId).catch((error: unknown) => ctx.logger.error({ err: error }, 'plan card notice failed'));
}

/**
 * Store a plan the fitter sends. The server rebuilds the planner inputs from stored facts and
 * checks the sent plan with the shared `validatePlan`; any violation (over a cap, a window, a
 * physio limit, broken coupling, a plan that should have been refused) refuses the whole plan.
 * Then it builds the plan itself from the same inputs and the fitter's target and start date:
 * the sent plan must match it (it is what the fitter previewed), and the server's build is what
 * is stored, so instructions, limits, reasons and dates never come from the client.
 */
export async function sendPlan(ctx: AppContext, fitter: Express.User, consultationId: number, input: { bikeId: number; target: PlanInput['target']; startDate?: string; plan: unknown }, actor: AuditActor) {
  const consultation = await Consultation.findOne({ where: { id: consultationId, fitterId: fitter.id } });
  if (!consultation) throw notFound('That consultation');
  assertMaySendPlan(consultation.status);
  const { inputs } = await buildPlanInputs(consultation, input.bikeId, { target: input.target, startDate: input.startDate });
  const violations = validatePlan(input.plan, inputs);
  if (violations.length > 0) {
    throw new AppError(422, 'plan_over_limits', `The plan breaks ${violations.length} safety rule${violations.length === 1 ? '' : 's'}; nothing was sent.`, undefined, { violations });
  }
  const body = buildPlan(inputs);
  if (body.status === 'refused' || body.steps.length === 0) throw conflict(body.reasons[0]?.message ?? 'This plan has no steps to send.');
  const differences = planDifferences(input.plan, body);
  if (differences.length > 0) {
    throw new AppError(422, 'plan_changed', `The plan differs from the one built from the case now (${differences.slice(0, 3).join('; ')}). Nothing was sent: check the preview and send again.`, undefined, { differences });
  }

  const plan = await ctx.sequelize.transaction(async (transaction) => {
    const locked = await Consultation.findByPk(consultation.id, { transaction, lock: transaction.LOCK.UPDATE });
    // Checked again under the lock: a hold or a finish may have landed since the first read.
    assertMaySendPlan(locked!.status);
    if (locked!.status === 'in_session') await transitionConsultation(ctx, locked!, 'plan_active', { actorId: fitter.id, note: 'plan sent', transaction });
    await supersedeActive(consultation.riderId, input.bikeId, transaction);
    const stored = await Plan.create(
      { consultationId: consultation.id, riderId: consultation.riderId, fitterId: fitter.id, bikeId: input.bikeId, kind: 'forward', status: 'active', plan: body, inputs, holdReason: null },
      { transaction },
    );
    await createStepRows(stored, body, transaction);
    await recordAudit(actor, { action: 'plan.create', subjectType: 'plan', subjectId: stored.id, subjectUserId: consultation.riderId }, { transaction });
    return stored;
  });
  await announcePlan(ctx, consultation, plan, fitter.id);
  return plan;
}

/** The plan-sending rule (shared/plan/send-rule.ts); `session_not_started` lets a client tell that case apart. */
function assertMaySendPlan(status: ConsultationState): void {
  const blocker = planSendBlocker(status);
  if (blocker) throw new AppError(409, status === 'booked' ? 'session_not_started' : 'conflict', blocker);
}

/** The plan a rider or the assigned fitter may see, or 404. */
export async function findVisiblePlan(user: Express.User, planId: number): Promise<Plan> {
  const plan = await Plan.findByPk(planId);
  if (!plan || (plan.riderId !== user.id && plan.fitterId !== user.id)) throw notFound('That plan');
  return plan;
}

/**
 * The plan was built under the limits of its day; before each step is made, the rider's state
 * now is checked again: urgent warning signs since (an intake answered after the plan) stop it,
 * and limits a physio set since must hold for this step too. The fitter then sends a new plan.
 */
async function assertStepStillSafe(riderId: number, step: PlanBody['steps'][number]): Promise<void> {
  const { level } = await currentCondition(riderId);
  if (level === 'urgent') throw conflict(`Please do not change your bike now. ${REFERRAL_ADVICE.urgent} Once a clinician has seen you, update your answers under “Tell us what hurts”.`);
  const beyond = stepBeyondPhysioLimits(step, await physioLimitsFor(riderId), (await getClinicSettings()).planner);
  if (beyond.length > 0) throw conflict(`${beyond.join(' ')} Your fitter will send a new plan within these limits.`);
}

/**
 * The rider marks a step as made on a date. That starts the adaptation clock: the check-in is due
 * after the adaptation period, and the next step's earliest date moves if this one was late.
 * A new setup snapshot records what is on the bike now, so the history stays complete.
 */
export async function applyStep(ctx: AppContext, rider: Express.User, planId: number, stepIndex: number, appliedOn: string, actor: AuditActor) {
  return ctx.sequelize.transaction(async (transaction) => {
    const plan = await Plan.findOne({ where: { id: planId, riderId: rider.id }, transaction, lock: transaction.LOCK.UPDATE });
    if (!plan) throw notFound('That plan');
    if (plan.status === 'on_hold') throw conflict(`This plan is paused: ${plan.holdReason ?? 'a clinician asked to wait'}. No step can be made until the hold is cleared.`);
    if (plan.status !== 'active') throw conflict('This plan has been replaced or finished.');
    const row = await PlanStep.findOne({ where: { planId, stepIndex }, transaction });
    const step = plan.plan.steps.find((s) => s.index === stepIndex);
    if (!row || !step) throw notFound('That step');
    if (row.state === 'applied') throw conflict('You already marked this step as made.');
    if (row.state !== 'current') throw conflict('Make the steps in order: finish the current step first.');
    if (stepIndex > 1) {
      const blocker = await nextStepBlocker(plan, stepIndex - 1);
      if (blocker) throw conflict(blocker);
    }
    await assertStepStillSafe(rider.id, step);
    if (appliedOn < row.earliestDate) throw badRequest(`This step can be made from ${row.earliestDate}, after the adaptation period.`, { appliedOn: `Choose ${row.earliestDate} or later.` });
    if (appliedOn > latestTodayAnywhere()) throw badRequest('The date cannot be in the future.', { appliedOn: 'Choose today or an earlier day.' });

    // The stored plan is the server's own build (sendPlan, revertToSnapshot), so its limits are the server's.
    const adaptationDays = plan.plan.limits.adaptationDays;
    const snapshot = await recordSnapshot(plan.bikeId, step.setupAfter, plan.kind === 'revert' ? 'revert' : 'step', rider.id, {
      stepId: row.id,
      takenOn: appliedOn,
      transaction,
      ...(plan.kind === 'revert' ? { basedOnSnapshotId: revertSourceId(plan) } : {}),
    });
    await row.update({ state: 'applied', appliedOn, checkInDue: addDays(appliedOn, adaptationDays), snapshotId: snapshot.id }, { transaction });
    const next = await PlanStep.findOne({ where: { planId, stepIndex: stepIndex + 1 }, transaction });
    if (next) {
      const earliest = addDays(appliedOn, adaptationDays);
      await next.update({ state: 'current', earliestDate: earliest > next.earliestDate ? earliest : next.earliestDate }, { transaction });
    } else {
      await plan.update({ status: 'completed' }, { transaction });
    }
    await scheduleCheckInJobs(plan, row, transaction);
    await recordAudit(actor, { action: 'plan.step_applied', subjectType: 'plan', subjectId: plan.id, subjectUserId: rider.id, detail: { stepIndex, appliedOn } }, { transaction });
    return plan;
  });
}

function revertSourceId(plan: Plan): number {
  return Number((plan.inputs as { revertToSnapshotId?: number }).revertToSnapshotId);
}

/**
 * Go back to an earlier setup of the bike. The shared planner decides how: in one step when the
 * rider rode that setup long enough and recently (the body knows it), otherwise capped like any
 * change. The revert plan replaces the active plan and is announced in the consultation.
 */
export async function revertToSnapshot(ctx: AppContext, rider: Express.User, bikeId: number, snapshotId: number, actor: AuditActor) {
  const snapshot = await SetupSnapshot.findOne({ where: { id: snapshotId, bikeId } });
  const consultation = await Consultation.findOne({ where: { riderId: rider.id, status: { [Op.in]: ['booked', 'in_session', 'plan_active', 'on_hold', 'completed'] } }, order: [['startsAt', 'DESC']] });
  if (!snapshot || !consultation) throw notFound('That setup');
  const active = await Plan.findOne({ where: { riderId: rider.id, bikeId, status: 'on_hold' } });
  if (active) throw conflict(`Your plan is paused: ${active.holdReason ?? 'a clinician asked to wait'}. Please talk to your fitter before changing the bike.`);
  const { inputs, current } = await buildPlanInputs(consultation, bikeId, { target: snapshot.setup });
  if (current.id === snapshot.id) throw badRequest('That is the setup on the bike now.');
  const body = buildPlan(inputs);
  if (body.status === 'refused' || body.steps.length === 0) throw conflict(body.reasons[0]?.message ?? 'That setup cannot be reached safely right now.');
  const plan = await ctx.sequelize.transaction(async (transaction) => {
    await supersedeActive(rider.id, bikeId, transaction);
    const stored = await Plan.create(
      { consultationId: consultation.id, riderId: rider.id, fitterId: consultation.fitterId, bikeId, kind: 'revert', status: 'active', plan: body, inputs: { ...inputs, revertToSnapshotId: snapshot.id } as PlanInput, holdReason: null },
      { transaction },
    );
    await createStepRows(stored, body, transaction);
    await recordAudit(actor, { action: 'plan.revert', subjectType: 'plan', subjectId: stored.id, subjectUserId: rider.id, detail: { snapshotId } }, { transaction });
    return stored;
  });
  await announcePlan(ctx, consultation, plan, rider.id);
  return plan;
}

/**
 * "Go back one step" after a worse check-in: return to the setup the bike had before that step
 * (the snapshot just before the step's own snapshot), through the same revert rules.
 */
export async function revertStep(ctx: AppContext, rider: Express.User, planId: number, stepIndex: number, actor: AuditActor) {
  const plan = await Plan.findOne({ where: { id: planId, riderId: rider.id } });
  const row = plan ? await PlanStep.findOne({ where: { planId, stepIndex } }) : null;
  if (!plan || !row) throw notFound('That step');
  if (row.state !== 'applied' || !row.snapshotId) throw conflict('Only a step you have made can be undone.');
  const before = await SetupSnapshot.findOne({ where: { bikeId: plan.bikeId, id: { [Op.lt]: row.snapshotId } }, order: [['id', 'DESC']] });
  if (!before) throw conflict('There is no earlier setup to go back to.');
  return revertToSnapshot(ctx, rider, plan.bikeId, before.id, actor);
}
