import Stripe from 'stripe';
import { Op } from 'sequelize';
import { AppError, conflict, notFound } from '../errors';
import { Consultation, Payment, PaymentCustomer, User } from '../models';
import type { AppContext } from '../context';
import { transitionConsultation } from './consultation-states';
import { recordAudit, type AuditActor } from './audit';
import { scheduleBookingReminder } from './booking-jobs';
import { sendBookingConfirmation, sendReceipt } from '../mail/booking-mails';

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
  return ctx.sequelize.transaction(async (transaction) => {
    const consultation = await Consultation.findOne({ where: { id: consultationId, riderId: rider.id }, transaction, lock: transaction.LOCK.UPDATE });
    if (!consultation) throw notFound('That booking');
    const same = await Payment.findOne({ where: { attemptKey }, transaction });
    if (same && same.consultationId !== consultation.id) throw conflict('That payment attempt belongs to another booking. Reload the page and try again.');
    if (same?.status === 'succeeded' || same?.status === 'failed') return { consultation, payment: same, settled: true };
    const other = await Payment.findOne({ where: { consultationId: consultation.id, status: { [Op.in]: ['pending', 'succeeded'] }, attemptKey: { [Op.ne]: attemptKey } }, transaction });
    if (other?.status === 'succeeded') throw conflict('This booking is already paid.');
    if (other && Date.now() - other.updatedAt.getTime() < ABANDONED_AFTER_MS) throw conflict('A payment for this booking is already in progress. Wait a moment and reload the page.');
    // An attempt left pending by a lost connection long ago is given up, so a reloaded page can pay.
    if (other) await other.update({ status: 'failed', failureMessage: 'abandoned attempt' }, { transaction });
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

/**
 * Pay for a held consultation: customer → card → charge → payment record → booked.
 * `attemptKey` is the client's idempotency key for this attempt: a retried or double-clicked
 * request reuses the same Stripe idempotency keys, so the card is charged at most once.
 */
export async function payForConsultation(ctx: AppContext, rider: User, consultationId: number, input: { token: string; attemptKey: string }, actor: AuditActor) {
  const stripe = ctx.stripe;
  if (!stripe) throw paymentsOff();
  const started = await beginAttempt(ctx, rider, consultationId, input.attemptKey);
  if (started.settled) return settledResult(started.consultation, started.payment);
  const { consultation, payment } = started;

  let charge: Stripe.Charge;
  try {
    const customerId = await stripeCustomerFor(ctx, stripe, rider);
    const card = await stripe.customers.createSource(customerId, { source: input.token }, { idempotencyKey: `source-${input.attemptKey}` });
    charge = await stripe.charges.create(
      { amount: payment.amountMinor, currency: payment.currency.toLowerCase(), customer: customerId, source: card.id, description: `Saddlestep consultation ${consultation.id}`, metadata: { consultationId: String(consultation.id), paymentId: String(payment.id) } },
      { idempotencyKey: `charge-${input.attemptKey}` },
    );
    payment.stripeCustomerId = customerId;
  } catch (error) {
    return failAttempt(ctx, rider, consultation.id, payment.id, error);
  }

  await ctx.sequelize.transaction(async (transaction) => {
    const fresh = await Consultation.findByPk(consultation.id, { transaction, lock: transaction.LOCK.UPDATE });
    await payment.update({ status: 'succeeded', stripeChargeId: charge.id, stripeCustomerId: payment.stripeCustomerId }, { transaction });
    await transitionConsultation(ctx, fresh!, 'booked', { actorId: rider.id, note: `paid ${charge.id}`, transaction, changes: { holdExpiresAt: null } });
    await scheduleBookingReminder(fresh!, { transaction });
    await recordAudit(actor, { action: 'payment.succeeded', subjectType: 'payment', subjectId: payment.id, subjectUserId: rider.id }, { transaction });
  });
  const booked = (await Consultation.findByPk(consultation.id))!;
  await Promise.all([sendBookingConfirmation(ctx, booked, 'booked'), sendReceipt(ctx, booked, payment)]).catch((error: unknown) => ctx.logger.error({ err: error }, 'booking e-mail failed'));
  return settledResult(booked, payment);
}

function settledResult(consultation: Consultation, payment: Payment) {
  if (payment.status === 'failed') throw cardRefused(payment.failureMessage);
  return { consultation, payment };
}

function cardRefused(message: string | null) {
  return new AppError(402, 'card_declined', `${message ?? 'Your card was declined.'} We released the time we held; please choose a time and try again with another card.`);
}

/**
 * A refused card releases the hold. A Stripe outage keeps both the hold and the attempt pending,
 * so a retry with the same attempt key re-sends the same idempotent Stripe calls (never a second charge).
 */
async function failAttempt(ctx: AppContext, rider: User, consultationId: number, paymentId: number, error: unknown): Promise<never> {
  const declined = error instanceof Stripe.errors.StripeCardError;
  const message = declined ? (error as Stripe.errors.StripeCardError).message : null;
  if (!declined) {
    ctx.logger.error({ err: error }, 'Stripe call failed');
    await Payment.update({ failureMessage: 'payment service unavailable; retry pending' }, { where: { id: paymentId } });
    throw new AppError(502, 'payment_unavailable', 'We could not reach the payment service. Nothing was charged twice; please try again in a moment.');
  }
  await ctx.sequelize.transaction(async (transaction) => {
    const consultation = await Consultation.findByPk(consultationId, { transaction, lock: transaction.LOCK.UPDATE });
    await Payment.update({ status: 'failed', failureMessage: (message ?? 'payment service unavailable').slice(0, 300) }, { where: { id: paymentId }, transaction });
    if (consultation?.status === 'awaiting_payment') {
      await transitionConsultation(ctx, consultation, 'cancelled', { actorId: rider.id, note: 'card declined', transaction, changes: { cancelReason: 'card declined', holdExpiresAt: null } });
    }
  });
  throw cardRefused(message);
}
