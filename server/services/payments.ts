import Stripe from 'stripe';
import { Op } from 'sequelize';
import { AppError, conflict, notFound } from '../errors';
import { Consultation, Payment, PaymentCustomer, User } from '../models';
import type { AppContext } from '../context';
import { transitionConsultation } from './consultation-states';
import type { AuditActor } from './audit';
import { assertRiderMayBook } from './intake-gate';
import { releaseAttempt, settleSucceededCharge } from './payment-outcomes';
import { inTransaction } from './db-retry';

/** A pending attempt untouched this long is treated as abandoned (its page was closed or reloaded). */
const ABANDONED_AFTER_MS = 2 * 60_000;

/** Grace added to a hold when payment starts, so a slow card network cannot lose a paid slot. */
const PAYMENT_GRACE_MS = 5 * 60_000;

const paymentsOff = () => new AppError(503, 'payments_unavailable', 'Payments are not set up on this server. Please contact the studio.');

async function stripeCustomerFor(ctx: AppContext, stripe: Stripe, rider: User): Promise<string> {
  const known = await PaymentCustomer.findByPk(rider.id);
  if (known) return known.stripeCustomerId;
  // The idempotency key makes a retried first payment reuse the same customer.
  const customer = await stripe.customers.create({ email: rider.email, name: rider.displayName, metadata: { saddlestepUserId: String(rider.id) } }, { idempotencyKey: `customer-${rider.id}` });
  await PaymentCustomer.findOrCreate({ where: { userId: rider.id }, defaults: { userId: rider.id, stripeCustomerId: customer.id } });
  return customer.id;
}

/** Step 1: lock the consultation, check it can be paid, record the attempt as pending. */
async function beginAttempt(ctx: AppContext, rider: User, consultationId: number, attemptKey: string) {
  return inTransaction(ctx, undefined, async (transaction) => {
    const consultation = await Consultation.findOne({ where: { id: consultationId, riderId: rider.id }, transaction, lock: transaction.LOCK.UPDATE });
    if (!consultation) throw notFound('That booking');
    const same = await Payment.findOne({ where: { attemptKey }, transaction });
    if (same && same.consultationId !== consultation.id) throw conflict('That payment attempt belongs to another booking. Reload the page and try again.');
    if (same?.status === 'succeeded' || same?.status === 'failed') return { consultation, payment: same, settled: true };
    const other = await Payment.findOne({ where: { consultationId: consultation.id, status: { [Op.in]: ['pending', 'succeeded'] }, attemptKey: { [Op.ne]: attemptKey } }, transaction });
    if (other?.status === 'succeeded') throw conflict('This booking is already paid.');
    if (other && Date.now() - other.updatedAt.getTime() < ABANDONED_AFTER_MS) throw conflict('A payment for this booking is already in progress. Wait a moment and reload the page.');
    // An attempt left pending by a lost connection long ago no longer blocks a reloaded page. It
    // stays pending: only the reconciler, which asks Stripe, may decide it charged nothing (if it
    // did charge, that late charge is refunded, since this new attempt has the booking by then).
    const HOLD_RAN_OUT = 'The time we held for you ran out. Please choose a time again.';
    if (consultation.status === 'expired') throw conflict(HOLD_RAN_OUT);
    if (!['requested', 'awaiting_payment'].includes(consultation.status)) throw conflict('This booking can no longer be paid. Please choose a time again.');
    const now = Date.now();
    if (!consultation.holdExpiresAt || consultation.holdExpiresAt.getTime() <= now) throw conflict(HOLD_RAN_OUT);
    const holdExpiresAt = new Date(Math.max(consultation.holdExpiresAt.getTime(), now + PAYMENT_GRACE_MS));
    if (consultation.status === 'requested') {
      await transitionConsultation(ctx, consultation, 'awaiting_payment', { actorId: rider.id, transaction, changes: { holdExpiresAt } });
    }
    const payment = same ?? (await Payment.create(
      { consultationId: consultation.id, riderId: rider.id, attemptKey, stripeCustomerId: null, stripeChargeId: null, amountMinor: consultation.feeMinor, currency: consultation.currency, status: 'pending', failureMessage: null },
      { transaction },
    ));
    return { consultation, payment, settled: false };
  });
}

/** Stripe answered with something we cannot use (e.g. a card source without an id). */
class UnexpectedStripeAnswer extends Error {}

/**
 * Pay for a held consultation: booking gate → customer → card → charge → success step → booked.
 * `attemptKey` is the client's idempotency key for this attempt: a retried or double-clicked
 * request reuses the same Stripe idempotency keys, so the card is charged at most once, and the
 * success step runs once (see settleSucceededCharge), so one receipt and one confirmation.
 */
export async function payForConsultation(ctx: AppContext, rider: User, consultationId: number, input: { token: string; attemptKey: string }, actor: AuditActor) {
  const stripe = ctx.stripe;
  if (!stripe) throw paymentsOff();
  const started = await beginAttempt(ctx, rider, consultationId, input.attemptKey);
  if (started.settled) return settledResult(started.consultation, started.payment);
  const { consultation, payment } = started;
  await assertStillMayBook(ctx, rider, payment.id);

  let charge: Stripe.Charge;
  try {
    const customerId = await stripeCustomerFor(ctx, stripe, rider);
    // Recorded before the charge, so the reconciler can find the charge if Stripe's answer is lost.
    if (payment.stripeCustomerId !== customerId) await payment.update({ stripeCustomerId: customerId });
    const card = await stripe.customers.createSource(customerId, { source: input.token }, { idempotencyKey: `source-${input.attemptKey}` });
    if (typeof card?.id !== 'string' || card.id === '') throw new UnexpectedStripeAnswer('Stripe returned a card source without an id');
    charge = await stripe.charges.create(
      { amount: payment.amountMinor, currency: payment.currency.toLowerCase(), customer: customerId, source: card.id, description: `Saddlestep consultation ${consultation.id}`, metadata: { consultationId: String(consultation.id), paymentId: String(payment.id) } },
      { idempotencyKey: `charge-${input.attemptKey}` },
    );
  } catch (error) {
    return failAttempt(ctx, rider, payment.id, error);
  }
  if (charge.status === 'failed') return failAttempt(ctx, rider, payment.id, null, charge.failure_message ?? 'Your card was declined.');
  if (charge.status !== 'succeeded') throw new AppError(502, 'payment_pending', 'Your bank has not confirmed the payment yet. We keep the time for you; reload this page in a minute.');

  const outcome = await settleSucceededCharge(ctx, payment.id, charge, actor);
  if (outcome === 'refunding') {
    throw conflict('The time we held ran out before your payment came through, so the charge is being refunded in full. Please choose a time again.');
  }
  const [booked, paid] = await Promise.all([Consultation.findByPk(consultation.id), Payment.findByPk(payment.id)]);
  return settledResult(booked!, paid!);
}

/**
 * A red flag or withdrawn consent may have arrived after the slot was held: the gate runs again
 * right before any card is charged, and a closed gate releases the hold (nothing is charged).
 */
async function assertStillMayBook(ctx: AppContext, rider: User, paymentId: number): Promise<void> {
  try {
    await assertRiderMayBook(rider.id);
  } catch (refusal) {
    if (!(refusal instanceof AppError)) throw refusal;
    await releaseAttempt(ctx, paymentId, { message: `booking gate: ${refusal.code}`, to: 'cancelled', note: `not charged: ${refusal.code}`, actorId: rider.id });
    throw new AppError(refusal.status, refusal.code, `${refusal.message} Nothing was charged, and we released the time we held.`);
  }
}

function settledResult(consultation: Consultation, payment: Payment) {
  if (payment.status === 'failed') throw cardRefused(payment.failureMessage);
  return { consultation, payment };
}

function cardRefused(message: string | null) {
  return new AppError(402, 'card_declined', `${message ?? 'Your card was declined.'} We released the time we held; please choose a time and try again with another card.`);
}

/**
 * Sort a failed Stripe call into final and unknown outcomes.
 * - A refused card, or a request Stripe calls invalid (an amount below the currency's minimum, a
 *   card token it does not know), is final: nothing was charged, the hold is released.
 * - Anything else (no connection, a 5xx, rate limiting, an answer we cannot read, an idempotency
 *   clash) leaves the outcome unknown: the hold and the pending attempt stay, a retry with the same
 *   attempt key re-sends the same idempotent calls, and the reconciler settles it if nobody retries.
 */
async function failAttempt(ctx: AppContext, rider: User, paymentId: number, error: unknown, declineMessage?: string): Promise<never> {
  if (declineMessage !== undefined || error instanceof Stripe.errors.StripeCardError) {
    const message = declineMessage ?? (error as Stripe.errors.StripeCardError).message;
    await releaseAttempt(ctx, paymentId, { message, to: 'cancelled', note: 'card declined', actorId: rider.id });
    throw cardRefused(message);
  }
  if (error instanceof Stripe.errors.StripeInvalidRequestError) {
    ctx.logger.warn({ err: error, paymentId }, 'Stripe refused the payment request');
    await releaseAttempt(ctx, paymentId, { message: `refused: ${error.message}`, to: 'cancelled', note: 'payment refused by the payment service', actorId: rider.id });
    throw new AppError(
      422,
      'payment_refused',
      `The payment service refused this payment (${error.message}). Nothing was charged, and we released the time we held. Please tell the studio; paying again will not help.`,
    );
  }
  ctx.logger.error({ err: error, paymentId }, 'Stripe call failed; outcome unknown');
  await Payment.update({ failureMessage: 'payment service unavailable; retry pending' }, { where: { id: paymentId, status: 'pending' } });
  throw new AppError(502, 'payment_unavailable', 'We could not reach the payment service. Nothing was charged twice; please try again in a moment.');
}
