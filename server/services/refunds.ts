import { Op } from 'sequelize';
import { conflict } from '../errors';
import { Consultation, Payment, Refund } from '../models';
import type { AppContext } from '../context';
import { AppError } from '../errors';
import { transitionConsultation } from './consultation-states';
import { cancellationTerms, findOwnConsultation } from './booking';
import { cancelBookingReminders } from './booking-jobs';
import { recordAudit, type AuditActor } from './audit';
import { sendCancellation } from '../mail/booking-mails';

/**
 * Refund part or all of a payment through Stripe. The idempotency key names the reason
 * (`cancel-<consultation>` for a cancellation), so a retried request never refunds twice.
 */
export async function refundPayment(ctx: AppContext, payment: Payment, amountMinor: number, reason: string, idempotencyKey: string, actorId: number | null): Promise<Refund | null> {
  const existing = await Refund.findOne({ where: { idempotencyKey } });
  if (existing) return existing;
  const refundable = payment.amountMinor - payment.refundedMinor;
  const amount = Math.min(amountMinor, refundable);
  if (amount <= 0) return null;
  if (!ctx.stripe || !payment.stripeChargeId) throw new AppError(503, 'payments_unavailable', 'Refunds are not possible right now. Please contact the studio.');
  const stripeRefund = await ctx.stripe.refunds.create({ charge: payment.stripeChargeId, amount, metadata: { paymentId: String(payment.id) } }, { idempotencyKey: `refund-${idempotencyKey}` });
  return ctx.sequelize.transaction(async (transaction) => {
    const locked = await Payment.findByPk(payment.id, { transaction, lock: transaction.LOCK.UPDATE });
    const [refund, created] = await Refund.findOrCreate({
      where: { idempotencyKey },
      defaults: { paymentId: payment.id, idempotencyKey, stripeRefundId: stripeRefund.id, amountMinor: amount, reason: reason.slice(0, 300), actorId },
      transaction,
    });
    if (created && locked) {
      const refunded = locked.refundedMinor + amount;
      await locked.update({ refundedMinor: refunded, status: refunded >= locked.amountMinor ? 'refunded' : 'partially_refunded' }, { transaction });
    }
    return refund;
  });
}

/**
 * Cancel a consultation. A booked one is refunded by the clinic's policy (a fitter's or admin's
 * cancellation refunds in full); a hold is simply released. The calendar entry is cancelled and
 * both parties are told.
 */
export async function cancelConsultation(ctx: AppContext, user: Express.User, consultationId: number, reason: string | undefined, actor: AuditActor) {
  const own = user.role === 'admin' ? await Consultation.findByPk(consultationId) : await findOwnConsultation(user, consultationId);
  if (!own) throw conflict('That booking was not found.');
  const cancelledBy = user.role === 'rider' ? 'rider' : user.role === 'fitter' ? 'fitter' : 'admin';
  const payment = await Payment.findOne({ where: { consultationId: own.id, status: { [Op.in]: ['succeeded', 'partially_refunded'] } } });
  const terms = payment ? await cancellationTerms(own, payment.amountMinor, cancelledBy) : null;

  const consultation = await ctx.sequelize.transaction(async (transaction) => {
    const locked = await Consultation.findByPk(own.id, { transaction, lock: transaction.LOCK.UPDATE });
    if (!locked || !['requested', 'awaiting_payment', 'booked'].includes(locked.status)) throw conflict('Only a booked or held session can be cancelled.');
    const wasBooked = locked.status === 'booked';
    await transitionConsultation(ctx, locked, 'cancelled', {
      actorId: user.id,
      note: reason,
      transaction,
      changes: { cancelledById: user.id, cancelReason: reason?.slice(0, 500) ?? null, holdExpiresAt: null, calendarSequence: locked.calendarSequence + (wasBooked ? 1 : 0) },
    });
    await cancelBookingReminders(locked, { transaction });
    await recordAudit(actor, { action: 'consultation.cancel', subjectType: 'consultation', subjectId: locked.id, subjectUserId: locked.riderId, detail: { cancelledBy } }, { transaction });
    return { locked, wasBooked };
  });

  let refund: Refund | null = null;
  if (payment && terms && terms.amountMinor > 0) {
    refund = await refundPayment(ctx, payment, terms.amountMinor, terms.reason, `cancel-${own.id}`, user.id);
  }
  if (consultation.wasBooked) {
    await sendCancellation(ctx, consultation.locked, terms ? { amountMinor: refund?.amountMinor ?? 0, currency: payment!.currency, reason: terms.reason } : null).catch((error: unknown) =>
      ctx.logger.error({ err: error }, 'cancellation e-mail failed'),
    );
  }
  return { consultation: consultation.locked, refund, terms };
}
