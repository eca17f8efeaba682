import type Stripe from 'stripe';
import { Op } from 'sequelize';
import { Consultation, Payment } from '../models';
import type { AppContext } from '../context';
import { releaseAttempt, settleSucceededCharge } from './payment-outcomes';

/**
 * A pending attempt untouched this long has lost its request: the Stripe client gives up well
 * before (20 s timeout, at most 2 retries, see payments/stripe-client.ts), so nothing is still
 * waiting for Stripe's answer and asking Stripe is the only way to learn what happened.
 */
export const RECONCILE_AFTER_MS = 5 * 60_000;

/**
 * The charge made for one payment attempt: our charges carry `metadata.paymentId`. Charges are
 * listed from a minute before the attempt began (Stripe filters by `created`; a studio makes few
 * charges in that window) and matched on metadata, amount and currency. Not by customer: the local
 * fake does not record a charge's customer, and the time window is as narrow.
 */
async function findCharge(stripe: Stripe, payment: Payment): Promise<Stripe.Charge | null> {
  const since = Math.floor(payment.createdAt.getTime() / 1000) - 60;
  for await (const charge of stripe.charges.list({ created: { gte: since }, limit: 100 })) {
    if (charge.metadata?.paymentId === String(payment.id) && charge.amount === payment.amountMinor && charge.currency === payment.currency.toLowerCase()) return charge;
  }
  return null;
}

/**
 * Settle one stale pending attempt from Stripe's own record: a charge that succeeded books (or is
 * refunded if the booking was given up), a failed one releases the hold, and no charge at all
 * releases the attempt (the consultation goes back to held, or expires if its hold ran out).
 * A Stripe outage throws and the attempt is tried again on a later tick.
 */
export async function reconcilePayment(ctx: AppContext, payment: Payment): Promise<'booked' | 'already' | 'refunding' | 'released' | 'waiting'> {
  if (!ctx.stripe) return 'waiting';
  const charge = await findCharge(ctx.stripe, payment);
  if (charge?.status === 'succeeded') return settleSucceededCharge(ctx, payment.id, charge, null);
  if (charge?.status === 'pending') return 'waiting';
  if (charge?.status === 'failed') {
    await releaseAttempt(ctx, payment.id, { message: charge.failure_message ?? 'Your card was declined.', to: 'cancelled', note: 'card declined', actorId: null });
    return 'released';
  }
  const consultation = await Consultation.findByPk(payment.consultationId);
  const holdRanOut = !consultation?.holdExpiresAt || consultation.holdExpiresAt.getTime() <= Date.now();
  await releaseAttempt(ctx, payment.id, { message: 'no charge reached the payment service', to: holdRanOut ? 'expired' : 'requested', note: 'payment never reached the payment service', actorId: null });
  return 'released';
}

/** Periodic job: every attempt pending longer than RECONCILE_AFTER_MS, oldest first. */
export async function reconcilePendingPayments(ctx: AppContext, now = new Date()): Promise<number> {
  if (!ctx.stripe) return 0;
  const stale = await Payment.findAll({ where: { status: 'pending', updatedAt: { [Op.lte]: new Date(now.getTime() - RECONCILE_AFTER_MS) } }, order: [['updatedAt', 'ASC']], limit: 50 });
  let settled = 0;
  for (const payment of stale) {
    try {
      if ((await reconcilePayment(ctx, payment)) !== 'waiting') settled += 1;
    } catch (error) {
      ctx.logger.warn({ err: error, paymentId: payment.id }, 'could not reconcile a pending payment yet');
    }
  }
  return settled;
}
