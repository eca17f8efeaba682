import { randomUUID } from 'node:crypto';
import { Op } from 'sequelize';
import { noShowRefund, type RefundDecision } from '@shared/booking';
import { conflict, notFound } from '../errors';
import { Consultation, Payment, Refund } from '../models';
import type { AppContext } from '../context';
import { transitionConsultation } from './consultation-states';
import { cancellationTerms, findOwnConsultation } from './booking';
import { cancelBookingReminders } from './booking-jobs';
import { recordAudit, type AuditActor } from './audit';
import { inTransaction } from './db-retry';
import { recordRefundRequest, refundableLeft, tryRefundNow } from './refund-jobs';
import { sendCancellation } from '../mail/booking-mails';

const PAID = ['succeeded', 'partially_refunded'] as const;

/**
 * Cancel a consultation. A booked one is refunded by the clinic's policy (a fitter's or admin's
 * cancellation refunds in full); a hold is simply released. The cancellation, the reminder's
 * removal and the refund promise (a pending refund row and its job) commit together, so a Stripe
 * outage can no longer lose the refund. Stripe is tried once at once; the job retries after that.
 * The fitter's notice goes now; the rider's goes once the refund has gone through (refund-jobs.ts),
 * or now when no refund is due.
 */
export async function cancelConsultation(ctx: AppContext, user: Express.User, consultationId: number, reason: string | undefined, actor: AuditActor) {
  const own = user.role === 'admin' ? await Consultation.findByPk(consultationId) : await findOwnConsultation(user, consultationId);
  if (!own) throw conflict('That booking was not found.');
  const cancelledBy = user.role === 'rider' ? 'rider' : user.role === 'fitter' ? 'fitter' : 'admin';

  const result = await inTransaction(ctx, undefined, async (transaction) => {
    const locked = await Consultation.findByPk(own.id, { transaction, lock: transaction.LOCK.UPDATE });
    if (!locked || !['requested', 'awaiting_payment', 'booked'].includes(locked.status)) throw conflict('Only a booked or held session can be cancelled.');
    const wasBooked = locked.status === 'booked';
    const payment = await Payment.findOne({ where: { consultationId: locked.id, status: { [Op.in]: PAID } }, transaction, lock: transaction.LOCK.UPDATE });
    const terms: RefundDecision | null = payment ? await cancellationTerms(locked, payment, cancelledBy, { leftMinor: await refundableLeft(payment, transaction) }) : null;
    await transitionConsultation(ctx, locked, 'cancelled', {
      actorId: user.id,
      note: reason,
      transaction,
      changes: { cancelledById: user.id, cancelReason: reason?.slice(0, 500) ?? null, holdExpiresAt: null, calendarSequence: locked.calendarSequence + (wasBooked ? 1 : 0) },
    });
    await cancelBookingReminders(locked, { transaction });
    await recordAudit(actor, { action: 'consultation.cancel', subjectType: 'consultation', subjectId: locked.id, subjectUserId: locked.riderId, detail: { cancelledBy } }, { transaction });
    const refund = payment && terms && terms.amountMinor > 0
      ? await recordRefundRequest({ payment, amountMinor: terms.amountMinor, reason: terms.reason, idempotencyKey: `cancel-${locked.id}`, notice: 'cancellation', actorId: user.id }, transaction)
      : null;
    return { consultation: locked, wasBooked, payment, terms, refund };
  });

  const refund = result.refund ? await tryRefundNow(ctx, result.refund.id) : null;
  if (result.wasBooked) {
    const money = result.terms && result.payment ? { amountMinor: 0, currency: result.payment.currency, reason: result.terms.reason } : null;
    // With a refund due, the rider's notice waits for Stripe (sent by the refund job, once).
    await sendCancellation(ctx, result.consultation, money, { to: refund ? 'fitter' : 'both' }).catch((error: unknown) => ctx.logger.error({ err: error }, 'cancellation e-mail failed'));
  }
  return { consultation: result.consultation, refund, terms: result.terms };
}

/**
 * An admin's refund of part of a payment. The payment row is locked (SELECT … FOR UPDATE) while
 * what is left is counted from the refunds already promised or made, so a double click cannot
 * refund twice; the client's key per attempt makes a retried request return the first refund.
 * The rider is e-mailed once the refund has gone through.
 */
export async function refundByAdmin(ctx: AppContext, paymentId: number, input: { amountMinor: number; reason: string; idempotencyKey?: string }, actor: AuditActor): Promise<{ payment: Payment; refund: Refund }> {
  const key = `admin-${input.idempotencyKey ?? randomUUID()}`;
  const recorded = await inTransaction(ctx, undefined, async (transaction) => {
    const payment = await Payment.findByPk(paymentId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!payment) throw notFound('That payment');
    const again = await Refund.findOne({ where: { idempotencyKey: key }, transaction });
    if (again) {
      if (again.paymentId !== payment.id) throw conflict('That refund attempt belongs to another payment. Reload the page and try again.');
      return again;
    }
    if (!(PAID as readonly string[]).includes(payment.status)) throw conflict('Only a completed payment can be refunded.');
    const left = await refundableLeft(payment, transaction);
    if (input.amountMinor > left) throw conflict(`At most ${left} (minor units) is left to refund.`);
    const refund = await recordRefundRequest({ payment, amountMinor: input.amountMinor, reason: input.reason, idempotencyKey: key, notice: 'refund', actorId: actor.actorId }, transaction);
    if (!refund) throw conflict('Nothing is left to refund on this payment.');
    await recordAudit(actor, { action: 'payment.refund', subjectType: 'payment', subjectId: payment.id, subjectUserId: payment.riderId, detail: { amountMinor: refund.amountMinor } }, { transaction });
    return refund;
  });
  const refund = (await tryRefundNow(ctx, recorded.id)) ?? recorded;
  return { payment: (await Payment.findByPk(paymentId))!, refund };
}

/**
 * The fitter records that the rider did not come: only for their own booked session, only once
 * its start time has passed, through the one state-transition module, audited. The clinic's
 * no-show rule (NO_SHOW_REFUND_SHARE, invented default: no refund) decides any refund.
 */
export async function markNoShow(ctx: AppContext, fitter: Express.User, consultationId: number, actor: AuditActor) {
  const own = await findOwnConsultation(fitter, consultationId);
  if (fitter.role !== 'fitter') throw notFound('That consultation');
  const result = await inTransaction(ctx, undefined, async (transaction) => {
    const locked = (await Consultation.findByPk(own.id, { transaction, lock: transaction.LOCK.UPDATE }))!;
    if (locked.status !== 'booked') throw conflict('Only a booked session that has not started in the room can be marked as missed.');
    if (locked.startsAt.getTime() > Date.now()) throw conflict('You can record a missed session once its start time has passed.');
    const payment = await Payment.findOne({ where: { consultationId: locked.id, status: { [Op.in]: PAID } }, transaction, lock: transaction.LOCK.UPDATE });
    await transitionConsultation(ctx, locked, 'no_show', { actorId: fitter.id, note: 'rider did not attend', transaction });
    await cancelBookingReminders(locked, { transaction });
    await recordAudit(actor, { action: 'consultation.no_show', subjectType: 'consultation', subjectId: locked.id, subjectUserId: locked.riderId }, { transaction });
    const decision = payment ? noShowRefund(payment.amountMinor) : null;
    const refund = payment && decision && decision.amountMinor > 0
      ? await recordRefundRequest({ payment, amountMinor: decision.amountMinor, reason: decision.reason, idempotencyKey: `no-show-${locked.id}`, notice: 'refund', actorId: fitter.id }, transaction)
      : null;
    return { consultation: locked, refund, decision };
  });
  if (result.refund) await tryRefundNow(ctx, result.refund.id);
  return { consultation: result.consultation, decision: result.decision };
}
