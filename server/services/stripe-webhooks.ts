import type Stripe from 'stripe';
import { UniqueConstraintError } from 'sequelize';
import { AppError } from '../errors';
import { Payment, StripeEvent } from '../models';
import type { AppContext } from '../context';

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
    await ctx.sequelize.transaction(async (transaction) => {
      await StripeEvent.create({ id: event.id, type: event.type }, { transaction });
      await applyEvent(event, transaction);
    });
    return { duplicate: false, type: event.type };
  } catch (error) {
    if (error instanceof UniqueConstraintError) return { duplicate: true, type: event.type };
    throw error;
  }
}

/** Reconcile our payment rows with what Stripe reports; unknown charges are ignored. */
async function applyEvent(event: Stripe.Event, transaction: import('sequelize').Transaction) {
  if (event.type !== 'charge.refunded' && event.type !== 'charge.succeeded' && event.type !== 'charge.failed') return;
  const charge = event.data.object as Stripe.Charge;
  const payment = await Payment.findOne({ where: { stripeChargeId: charge.id }, transaction, lock: transaction.LOCK.UPDATE });
  if (!payment) return;
  if (event.type === 'charge.refunded') {
    const refunded = Math.max(payment.refundedMinor, charge.amount_refunded);
    await payment.update({ refundedMinor: refunded, status: refunded >= payment.amountMinor ? 'refunded' : 'partially_refunded' }, { transaction });
  } else if (event.type === 'charge.failed' && payment.status === 'pending') {
    await payment.update({ status: 'failed', failureMessage: charge.failure_message?.slice(0, 300) ?? 'failed' }, { transaction });
  }
}
