import { Op } from 'sequelize';
import type { AttentionRefund, RefundCause, RefundProblem } from '@shared/admin';
import { Payment, Refund, ScheduledJob, User } from '../models';
import { STALE_AFTER_MS } from '../scheduler/scheduler';
import { refundJobKey } from './refund-jobs';

/** Enough for a screen; a studio with more stuck refunds than this has a bigger problem to fix first. */
const LIST_LIMIT = 100;

/**
 * Is the scheduler still working on this refund's job? A job due (or claimed) longer ago than the
 * stale-claim window has not been run by any scheduler: every process would have claimed or taken
 * it over by then. Used both to list stuck refunds and to refuse a Try again that is not needed.
 */
export function jobStillTrying(job: ScheduledJob | null, now = new Date()): boolean {
  if (!job) return false;
  const patience = now.getTime() - STALE_AFTER_MS;
  if (job.status === 'pending') return job.runAt.getTime() > patience;
  if (job.status === 'running') return (job.lockedAt?.getTime() ?? 0) > patience;
  return false;
}

/** Why a failed or pending refund needs the studio, or null while the scheduler is still retrying it. */
export function refundProblem(refund: Refund, job: ScheduledJob | null, now = new Date()): RefundProblem | null {
  if (refund.status === 'failed') return 'refused';
  if (refund.status !== 'pending' || jobStillTrying(job, now)) return null;
  return job?.status === 'failed' ? 'gave-up' : 'stalled';
}

const CAUSE_PREFIXES: [string, RefundCause][] = [['cancel-', 'cancellation'], ['admin-', 'admin'], ['no-show-', 'no-show'], ['late-charge-', 'late-charge']];

export function refundCause(idempotencyKey: string): RefundCause {
  return CAUSE_PREFIXES.find(([prefix]) => idempotencyKey.startsWith(prefix))?.[1] ?? 'other';
}

/**
 * Refunds the studio must act on, newest first: refused by Stripe, given up after every retry, or
 * pending with nothing retrying them. Each carries its payment, the rider's name, the payment
 * service's last message and how many times Stripe was asked; never the refund's free-text reason.
 */
export async function listRefundsNeedingAttention(now = new Date()): Promise<{ refunds: AttentionRefund[]; more: boolean }> {
  // Refused refunds stay refused, so only the newest are read; pending ones are few (seconds old, or stuck).
  const [failed, pending] = await Promise.all([
    Refund.findAll({ where: { status: 'failed' }, order: [['id', 'DESC']], limit: LIST_LIMIT + 1 }),
    Refund.findAll({ where: { status: 'pending' } }),
  ]);
  const jobs = pending.length ? await ScheduledJob.findAll({ where: { uniqueKey: { [Op.in]: pending.map((r) => refundJobKey(r.id)) } } }) : [];
  const jobByKey = new Map(jobs.map((j) => [j.uniqueKey, j]));
  const stuck = [...failed, ...pending]
    .flatMap((refund) => {
      const problem = refundProblem(refund, jobByKey.get(refundJobKey(refund.id)) ?? null, now);
      return problem ? [{ refund, problem }] : [];
    })
    .sort((a, b) => b.refund.id - a.refund.id);
  const shown = stuck.slice(0, LIST_LIMIT);

  const payments = shown.length ? await Payment.findAll({ where: { id: { [Op.in]: [...new Set(shown.map((s) => s.refund.paymentId))] } } }) : [];
  const paymentById = new Map(payments.map((p) => [p.id, p]));
  const riderIds = [...new Set(payments.flatMap((p) => (p.riderId ? [p.riderId] : [])))];
  const riders = riderIds.length ? await User.findAll({ where: { id: { [Op.in]: riderIds } }, attributes: ['id', 'displayName'] }) : [];
  const names = new Map(riders.map((u) => [u.id, u.displayName]));

  return {
    refunds: shown.flatMap(({ refund, problem }): AttentionRefund[] => {
      const payment = paymentById.get(refund.paymentId);
      if (!payment) return [];
      return [
        {
          id: refund.id,
          paymentId: payment.id,
          consultationId: payment.consultationId,
          // A deleted rider's payment stays for the accounts, without the person.
          riderName: payment.riderId ? (names.get(payment.riderId) ?? 'Deleted rider') : 'Deleted rider',
          amountMinor: refund.amountMinor,
          currency: payment.currency,
          status: refund.status === 'failed' ? 'failed' : 'pending',
          problem,
          cause: refundCause(refund.idempotencyKey),
          lastError: refund.lastError,
          attempts: refund.attempts,
          createdAt: refund.createdAt.toISOString(),
        },
      ];
    }),
    more: stuck.length > LIST_LIMIT,
  };
}
