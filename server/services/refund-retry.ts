import type { Transaction } from 'sequelize';
import { formatMoney } from '@shared/booking';
import { conflict, notFound } from '../errors';
import { Payment, Refund, ScheduledJob } from '../models';
import type { AppContext } from '../context';
import { scheduleJob } from '../scheduler/jobs';
import { recordAudit, type AuditActor } from './audit';
import { inTransaction } from './db-retry';
import { jobStillTrying } from './refund-attention';
import { REFUND_JOB, refundJobKey, refundableLeft, SAFETY_NET_DELAY_MS, tryRefundNow } from './refund-jobs';

async function requeueJob(refundId: number, job: ScheduledJob | null, transaction: Transaction): Promise<void> {
  const runAt = new Date(Date.now() + SAFETY_NET_DELAY_MS);
  if (!job) {
    await scheduleJob({ kind: REFUND_JOB, uniqueKey: refundJobKey(refundId), runAt, payload: { refundId } }, { transaction });
    return;
  }
  await job.update({ status: 'pending', runAt, attempts: 0, lockedBy: null, lockedAt: null, lastError: null, doneAt: null }, { transaction });
}

/**
 * An admin's Try again on a refund that needs the studio. The same refund row is sent again, so
 * Stripe sees the same idempotency key as every earlier try and can never make it twice (and
 * after an admin retry Stripe is asked what it already made first, see executeRefund):
 * - a stuck `pending` refund gets its job back with a fresh back-off;
 * - a `failed` one goes back to `pending` only if the payment still has that much left to refund
 *   (the studio may have refunded it another way meanwhile), counted under the payment's lock.
 * The refund row is locked first, then the payment (the order the refund job's settle step uses),
 * so two presses run one after the other: the same `attemptKey` again does nothing, and a second
 * press while the first is still being sent is refused. Audited as `payment.refund_retry`.
 */
export async function retryRefund(ctx: AppContext, refundId: number, attemptKey: string, actor: AuditActor): Promise<{ refund: Refund; payment: Payment }> {
  const requeued = await inTransaction(ctx, undefined, async (transaction) => {
    const refund = await Refund.findByPk(refundId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!refund) throw notFound('That refund');
    if (refund.retryKey === attemptKey) return false;
    if (refund.status === 'succeeded') throw conflict('This refund has already gone through. There is nothing to try again.');
    const payment = (await Payment.findByPk(refund.paymentId, { transaction, lock: transaction.LOCK.UPDATE }))!;
    const job = await ScheduledJob.findOne({ where: { uniqueKey: refundJobKey(refund.id) }, transaction, lock: transaction.LOCK.UPDATE });
    if (refund.status === 'pending' && jobStillTrying(job)) {
      throw conflict('This refund is already being tried again. It comes back to this list if the payment service still does not take it.');
    }
    if (refund.status === 'failed') {
      const left = await refundableLeft(payment, transaction);
      if (refund.amountMinor > left) {
        const money = (minor: number) => formatMoney(minor, payment.currency, 'en-GB');
        throw conflict(`Only ${money(left)} of this payment is left to refund, less than this refund of ${money(refund.amountMinor)}. It may have been refunded another way; use Refund on the payment for what is left.`);
      }
    }
    const previousStatus = refund.status;
    await refund.update(
      {
        status: 'pending',
        settledAt: null,
        retryKey: attemptKey,
        adminRetries: refund.adminRetries + 1,
        // The rider already had the cancellation e-mail saying the refund failed; what is owed now is the refund's own notice.
        ...(refund.notice === 'cancellation' && refund.noticeSentAt ? { notice: 'refund' as const } : {}),
      },
      { transaction },
    );
    await requeueJob(refund.id, job, transaction);
    await recordAudit(
      actor,
      { action: 'payment.refund_retry', subjectType: 'payment', subjectId: payment.id, subjectUserId: payment.riderId, detail: { refundId: refund.id, amountMinor: refund.amountMinor, status: previousStatus } },
      { transaction },
    );
    return true;
  });
  if (requeued) await tryRefundNow(ctx, refundId);
  const refund = (await Refund.findByPk(refundId))!;
  return { refund, payment: (await Payment.findByPk(refund.paymentId))! };
}
