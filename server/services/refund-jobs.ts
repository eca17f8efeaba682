import Stripe from 'stripe';
import { Op, type Transaction } from 'sequelize';
import { Consultation, Payment, Refund } from '../models';
import type { RefundNotice } from '../models/refund';
import type { AppContext } from '../context';
import { scheduleJob } from '../scheduler/jobs';
import { inTransaction } from './db-retry';
import { sendCancellation, sendRefundNotice } from '../mail/booking-mails';

export const REFUND_JOB = 'refund';
/**
 * Every refund is first tried at once by the request that promised it (`tryRefundNow`); its job is
 * the safety net, due at the scheduler's first back-off step (2 min). Due at once, another
 * process's tick could run it while that first try is still waiting on Stripe.
 */
export const SAFETY_NET_DELAY_MS = 2 * 60_000;
/** The one scheduled job of a refund row. */
export const refundJobKey = (refundId: number) => `refund:${refundId}`;

/** What is left to refund: the payment minus every refund already promised (pending) or made. */
export async function refundableLeft(payment: Payment, transaction: Transaction): Promise<number> {
  const promised = (await Refund.sum('amountMinor', { where: { paymentId: payment.id, status: { [Op.in]: ['pending', 'succeeded'] } }, transaction })) ?? 0;
  return Math.max(0, payment.amountMinor - promised);
}

/**
 * Promise a refund: a `pending` row and a scheduled job, written in the caller's transaction with
 * the payment row locked (FOR UPDATE) so two requests cannot both count the same money as left.
 * The key names the cause; a second call with it returns the first row. Asks above what is left
 * are cut to what is left; returns null when nothing is.
 */
export async function recordRefundRequest(
  input: { payment: Payment; amountMinor: number; reason: string; idempotencyKey: string; notice: RefundNotice; actorId: number | null },
  transaction: Transaction,
): Promise<Refund | null> {
  const existing = await Refund.findOne({ where: { idempotencyKey: input.idempotencyKey }, transaction });
  if (existing) return existing;
  const amountMinor = Math.min(input.amountMinor, await refundableLeft(input.payment, transaction));
  if (amountMinor <= 0) return null;
  const refund = await Refund.create(
    { paymentId: input.payment.id, idempotencyKey: input.idempotencyKey, stripeRefundId: null, amountMinor, reason: input.reason.slice(0, 300), actorId: input.actorId, status: 'pending', notice: input.notice },
    { transaction },
  );
  await scheduleJob({ kind: REFUND_JOB, uniqueKey: refundJobKey(refund.id), runAt: new Date(Date.now() + SAFETY_NET_DELAY_MS), payload: { refundId: refund.id } }, { transaction });
  return refund;
}

/**
 * The Stripe idempotency key of a refund, from the refund's own key (which names its cause): every
 * try of one refund row, the admin's Try again included, sends the same key.
 */
function stripeRefundKey(refund: Pick<Refund, 'idempotencyKey'>): string {
  return `refund-${refund.idempotencyKey}`;
}

/** A refund Stripe already made for our row (our refunds carry `metadata.refundId`), if any. */
async function findMadeRefund(stripe: Stripe, chargeId: string, refundId: number): Promise<Stripe.Refund | null> {
  for await (const made of stripe.refunds.list({ charge: chargeId, limit: 100 })) {
    if (made.metadata?.refundId === String(refundId) && made.status !== 'failed' && made.status !== 'canceled') return made;
  }
  return null;
}

/** Stripe said no for good (bad request, charge already refunded…): retrying would not help. */
function isFinal(error: unknown): boolean {
  return error instanceof Stripe.errors.StripeInvalidRequestError || error instanceof Stripe.errors.StripeCardError;
}

/**
 * Send the refund to Stripe and settle the row. Idempotent: the Stripe idempotency key derives
 * from the refund's own key, so the request path, the job and a crashed-and-retried job all make
 * one Stripe refund. Throws on a transient failure so the scheduler retries with back-off.
 */
export async function executeRefund(ctx: AppContext, refundId: number): Promise<Refund | null> {
  const refund = await Refund.findByPk(refundId);
  if (!refund) return null;
  if (refund.status === 'pending') {
    const payment = await Payment.findByPk(refund.paymentId);
    if (!payment?.stripeChargeId) return settle(ctx, refund.id, { failed: 'no card charge to refund' });
    if (!ctx.stripe) throw new Error('Stripe is not configured; refund stays pending');
    let stripeRefundId: string;
    try {
      // Stripe forgets an idempotency key after 24 h, and an admin's Try again may come later than
      // that: an earlier try whose answer was lost would then be made twice, so look first.
      const earlier = refund.adminRetries > 0 ? await findMadeRefund(ctx.stripe, payment.stripeChargeId, refund.id) : null;
      if (!earlier) await Refund.increment('attempts', { where: { id: refund.id } });
      const made =
        earlier ??
        (await ctx.stripe.refunds.create(
          { charge: payment.stripeChargeId, amount: refund.amountMinor, metadata: { paymentId: String(payment.id), refundId: String(refund.id) } },
          { idempotencyKey: stripeRefundKey(refund) },
        ));
      stripeRefundId = made.id;
    } catch (error) {
      const message = error instanceof Error ? error.message : String(error);
      if (isFinal(error)) return settle(ctx, refund.id, { failed: message });
      await Refund.update({ lastError: message.slice(0, 300) }, { where: { id: refund.id } });
      throw error;
    }
    await settle(ctx, refund.id, { stripeRefundId });
  }
  await sendNoticeOnce(ctx, refund.id);
  return Refund.findByPk(refund.id);
}

/** The request path's first try: a failure is logged and left to the job. */
export async function tryRefundNow(ctx: AppContext, refundId: number): Promise<Refund | null> {
  try {
    return await executeRefund(ctx, refundId);
  } catch (error) {
    ctx.logger.warn({ err: error, refundId }, 'refund not sent yet; the refund job will retry');
    return Refund.findByPk(refundId);
  }
}

async function settle(ctx: AppContext, refundId: number, outcome: { stripeRefundId: string } | { failed: string }): Promise<Refund | null> {
  await inTransaction(ctx, undefined, async (transaction) => {
    const refund = await Refund.findByPk(refundId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!refund || refund.status !== 'pending') return;
    const payment = await Payment.findByPk(refund.paymentId, { transaction, lock: transaction.LOCK.UPDATE });
    if ('failed' in outcome) {
      ctx.logger.error({ refundId, reason: outcome.failed }, 'refund refused by the payment service; needs the studio');
      await refund.update({ status: 'failed', lastError: outcome.failed.slice(0, 300), settledAt: new Date() }, { transaction });
      return;
    }
    // A pending row with a notice already sent is a refused refund an admin retried: the rider was
    // told it failed, so the news that it went through is owed (sendNoticeOnce claims it again).
    await refund.update({ status: 'succeeded', stripeRefundId: outcome.stripeRefundId, lastError: null, settledAt: new Date(), noticeSentAt: null }, { transaction });
    if (!payment) return;
    // Counted from our rows, never added twice: a charge.refunded webhook may already have raised it.
    const made = (await Refund.sum('amountMinor', { where: { paymentId: payment.id, status: 'succeeded' }, transaction })) ?? 0;
    const refunded = Math.min(payment.amountMinor, Math.max(payment.refundedMinor, made));
    await payment.update({ refundedMinor: refunded, status: refunded >= payment.amountMinor ? 'refunded' : 'partially_refunded' }, { transaction });
  });
  return Refund.findByPk(refundId);
}

/**
 * The rider's e-mail for a settled refund, exactly once: the row is claimed (notice_sent_at set
 * where it was null) before sending, and released again if sending fails so the job retries.
 */
async function sendNoticeOnce(ctx: AppContext, refundId: number): Promise<void> {
  const refund = await Refund.findByPk(refundId);
  if (!refund || refund.notice === 'none' || refund.status === 'pending' || refund.noticeSentAt) return;
  const [claimed] = await Refund.update({ noticeSentAt: new Date() }, { where: { id: refund.id, noticeSentAt: null } });
  if (claimed !== 1) return;
  try {
    const payment = (await Payment.findByPk(refund.paymentId))!;
    const consultation = (await Consultation.findByPk(payment.consultationId))!;
    // An admin's reason is free text and may mention the rider's body; e-mails never carry it.
    const reason = refund.idempotencyKey.startsWith('admin-') ? 'The studio sent you this refund.' : refund.reason;
    const money = { amountMinor: refund.status === 'succeeded' ? refund.amountMinor : 0, currency: payment.currency, reason, failed: refund.status === 'failed' };
    if (refund.notice === 'cancellation') await sendCancellation(ctx, consultation, money, { to: 'rider' });
    else await sendRefundNotice(ctx, consultation, money);
  } catch (error) {
    await Refund.update({ noticeSentAt: null }, { where: { id: refund.id } });
    throw error;
  }
}
