import type { Transaction } from 'sequelize';
import { addDays } from '@shared/fit/setup';
import type { AppContext } from '../context';
import { Plan, PlanStep, User } from '../models';
import { scheduleJob } from '../scheduler/jobs';
import { renderMail } from '../mail/layout';
import { publicUrl } from '../mail/booking-mails';

export const CHECKIN_DUE = 'checkin-due';
export const CHECKIN_OVERDUE = 'checkin-overdue';
/** Days after the due date at which a missing check-in counts as overdue (common practice: a grace of a few days). */
export const OVERDUE_AFTER_DAYS = 3;

/** Reminder on the due day and an overdue mark a few days later, one job each per applied step. */
export async function scheduleCheckInJobs(plan: Plan, step: PlanStep, transaction: Transaction) {
  if (!step.checkInDue) return;
  const dueAt = new Date(`${step.checkInDue}T09:00:00Z`);
  const overdueAt = new Date(`${addDays(step.checkInDue, OVERDUE_AFTER_DAYS)}T09:00:00Z`);
  const payload = { planId: plan.id, stepId: step.id };
  await scheduleJob({ kind: CHECKIN_DUE, uniqueKey: `${CHECKIN_DUE}:${step.id}`, runAt: dueAt, payload }, { transaction });
  await scheduleJob({ kind: CHECKIN_OVERDUE, uniqueKey: `${CHECKIN_OVERDUE}:${step.id}`, runAt: overdueAt, payload }, { transaction });
}

async function load(payload: Record<string, unknown>) {
  const step = await PlanStep.findByPk(Number(payload.stepId));
  const plan = step ? await Plan.findByPk(step.planId) : null;
  // A check-in already logged, or a plan replaced since, needs no reminder.
  if (!step || !plan || step.checkedInAt || plan.status === 'superseded') return null;
  return { step, plan };
}

export async function remindCheckIn(ctx: AppContext, payload: Record<string, unknown>) {
  const found = await load(payload);
  const rider = found ? await User.findByPk(found.plan.riderId) : null;
  if (!found || !rider) return;
  const mail = renderMail({
    subject: 'Time for a check-in on your bike change',
    paragraphs: [`Hello ${rider.displayName},`, 'You made a change to your bike a while ago. Please tell us how your rides have felt since, so your fitter can decide the next step.'],
    action: { label: 'Log a check-in', url: `${publicUrl(ctx)}/plan` },
  });
  await ctx.mailer.send({ to: rider.email, ...mail });
}

/** One e-mail each to rider and fitter when a check-in is overdue: a job per e-mail, so a retry resends only the one that failed. */
export const CHECKIN_OVERDUE_MAIL = 'checkin-overdue-mail';
const OVERDUE_RECIPIENTS = ['rider', 'fitter'] as const;

/**
 * Mark the step overdue and queue one e-mail job per recipient. Sends nothing itself: if the
 * fitter's mail server fails, only the fitter's job is retried; the rider is not mailed twice.
 * Scheduling is keyed per step and recipient, so a re-run of this job queues nothing new.
 */
export async function markCheckInOverdue(ctx: AppContext, payload: Record<string, unknown>) {
  const found = await load(payload);
  if (!found) return;
  await ctx.sequelize.transaction(async (transaction) => {
    await found.step.update({ overdueAt: found.step.overdueAt ?? new Date() }, { transaction });
    for (const to of OVERDUE_RECIPIENTS) {
      await scheduleJob({ kind: CHECKIN_OVERDUE_MAIL, uniqueKey: `${CHECKIN_OVERDUE_MAIL}:${found.step.id}:${to}`, runAt: new Date(), payload: { ...payload, to } }, { transaction });
    }
  });
}

/** One overdue e-mail, to the rider or the fitter; skipped if the rider has checked in since. */
export async function sendOverdueMail(ctx: AppContext, payload: Record<string, unknown>) {
  const found = await load(payload);
  if (!found) return;
  const [rider, fitter] = await Promise.all([User.findByPk(found.plan.riderId), User.findByPk(found.plan.fitterId)]);
  if (!rider) return;
  if (payload.to === 'rider') {
    await ctx.mailer.send({
      to: rider.email,
      ...renderMail({
        subject: 'Your check-in is overdue',
        paragraphs: [`Hello ${rider.displayName},`, 'We have not heard how your last bike change feels. The next step waits until you check in.'],
        action: { label: 'Log a check-in', url: `${publicUrl(ctx)}/plan` },
      }),
    });
  } else if (payload.to === 'fitter' && fitter) {
    await ctx.mailer.send({
      to: fitter.email,
      ...renderMail({
        subject: `Check-in overdue: ${rider.displayName}`,
        paragraphs: [`Hello ${fitter.displayName},`, `${rider.displayName} has not checked in after step ${found.step.stepIndex} of their plan.`],
        action: { label: 'Open Today', url: `${publicUrl(ctx)}/fitter` },
      }),
    });
  }
}
