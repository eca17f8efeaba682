import type Stripe from 'stripe';
import { UniqueConstraintError, type Transaction } from 'sequelize';
import { AppError } from '../errors';
import { Payment, StripeEvent } from '../models';
import type { AppContext } from '../context';
import { releaseAttempt, settleSucceededCharge } from './payment-outcomes';
import { inTransaction } from './db-retry';

/**
 * Verify a webhook's signature and apply it once. Event ids are stored in the same transaction as
 * their effect, so a replayed event (same id) changes nothing and still answers 200.
 */
export async function handleStripeWebhook(ctx: AppContext, rawBody: Buffer, signature: string | undefined): Promise<{ duplicate: boolean; type: string }> {
  if (!ctx.stripe || !ctx.config.STRIPE_WEBHOOK_SECRET) throw new AppError(503, 'payments_unavailable', 'Webhooks are not configured.');
  if (!signature) throw new AppError(400, 'bad_signature', 'Missing Stripe-Signature header.');
  let event: Stripe.Event;
  try {
    event = ctx.stripe.webhooks.constructEvent(rawBody, signature, ctx.config.STRIPE_WEBHOOK_SECRET);
  } catch {
    throw new AppError(400, 'bad_signature', 'The webhook signature does not match.');
  }
  try {
    await inTransaction(ctx, undefined, async (transaction) => {
      await StripeEvent.create({ id: event.id, type: event.type }, { transaction });
      await applyEvent(ctx, event, transaction);
    });
    return { duplicate: false, type: event.type };
  } catch (error) {
    if (error instanceof UniqueConstraintError) return { duplicate: true, type: event.type };
    throw error;
  }
}

/**
 * The payment an event is about: by charge id, or (when our pay request never heard Stripe's
 * answer and so never stored the id) by the `paymentId` our charges carry in their metadata,
 * checked against amount and currency.
 */
async function paymentFor(charge: Stripe.Charge, transaction: Transaction): Promise<Payment | null> {
  const byCharge = await Payment.findOne({ where: { stripeChargeId: charge.id }, transaction });
  if (byCharge) return byCharge;
  const id = Number(charge.metadata?.paymentId);
  if (!Number.isSafeInteger(id) || id <= 0) return null;
  const byMetadata = await Payment.findByPk(id, { transaction });
  if (!byMetadata || byMetadata.stripeChargeId || byMetadata.amountMinor !== charge.amount || byMetadata.currency.toLowerCase() !== charge.currency?.toLowerCase()) return null;
  return byMetadata;
}

/**
 * Apply an event. charge.succeeded and charge.failed complete or release the attempt through the
 * same steps the pay request uses (idempotent, so whichever comes second changes nothing);
 * charge.refunded records what Stripe refunded. Unknown charges are ignored.
 */
async function applyEvent(ctx: AppContext, event: Stripe.Event, transaction: Transaction) {
  if (event.type !== 'charge.refunded' && event.type !== 'charge.succeeded' && event.type !== 'charge.failed') return;
  const charge = event.data.object as Stripe.Charge | undefined;
  if (!charge?.id) return;
  const found = await paymentFor(charge, transaction);
  if (!found) return;
  if (event.type === 'charge.succeeded') {
    await settleSucceededCharge(ctx, found.id, charge, null, transaction);
  } else if (event.type === 'charge.failed') {
    await releaseAttempt(ctx, found.id, { message: charge.failure_message ?? 'Your card was declined.', to: 'cancelled', note: 'card declined', actorId: null }, transaction);
  } else {
    const payment = (await Payment.findByPk(found.id, { transaction, lock: transaction.LOCK.UPDATE }))!;
    const refunded = Math.min(payment.amountMinor, Math.max(payment.refundedMinor, charge.amount_refunded));
    await payment.update({ refundedMinor: refunded, status: refunded >= payment.amountMinor ? 'refunded' : 'partially_refunded' }, { transaction });
  }
}
