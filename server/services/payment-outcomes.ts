import { Op, type Transaction } from 'sequelize';
import type { ConsultationState } from '@shared/consultation';
import { Consultation, FitterProfile, Payment } from '../models';
import type { AppContext } from '../context';
import { transitionConsultation } from './consultation-states';
import { recordAudit, type AuditActor } from './audit';
import { scheduleBookingReminder } from './booking-jobs';
import { busyIntervals } from './fitters';
import { inTransaction } from './db-retry';
import { recordRefundRequest, tryRefundNow } from './refund-jobs';
import { sendBookingConfirmation, sendReceipt } from '../mail/booking-mails';

/** What we need of a Stripe charge; the pay request, the webhook and the reconciler all pass one. */
export interface ChargeFacts {
  id: string;
  customer?: string | { id: string } | null;
  amount: number;
  currency: string;
}

export type ChargeOutcome = 'booked' | 'already' | 'refunding';

const SYSTEM: AuditActor = { actorId: null, actorRole: 'system', ip: null, userAgent: null };
const PAYABLE: readonly ConsultationState[] = ['requested', 'awaiting_payment'];

/**
 * The one success step for a charge, whoever learns of it first (the pay request, Stripe's
 * charge.succeeded webhook, or the reconciler). Locks fitter profile → consultation → payment (the
 * order every booking write uses) and runs once: a second caller finds the payment settled and
 * changes nothing, so one booking, one receipt and one confirmation. A charge that arrives after the
 * booking was given up, or for a slot someone else took meanwhile, is kept on record and refunded
 * in full.
 */
export async function settleSucceededCharge(ctx: AppContext, paymentId: number, charge: ChargeFacts, actor: AuditActor | null, outer?: Transaction): Promise<ChargeOutcome> {
  let refundId: number | null = null;
  const outcome = await inTransaction(ctx, outer, async (transaction) => {
    const peek = await Payment.findByPk(paymentId, { transaction });
    if (!peek) throw new Error(`payment ${paymentId} vanished`);
    const head = await Consultation.findByPk(peek.consultationId, { transaction });
    if (head) await FitterProfile.findByPk(head.fitterId, { transaction, lock: transaction.LOCK.UPDATE });
    const consultation = await Consultation.findByPk(peek.consultationId, { transaction, lock: transaction.LOCK.UPDATE });
    const payment = (await Payment.findByPk(paymentId, { transaction, lock: transaction.LOCK.UPDATE }))!;
    if (payment.stripeChargeId === charge.id && payment.status !== 'pending' && payment.status !== 'failed') return 'already' as const;
    const customerId = typeof charge.customer === 'string' ? charge.customer : (charge.customer?.id ?? payment.stripeCustomerId);
    const paidElsewhere = await Payment.count({ where: { consultationId: payment.consultationId, id: { [Op.ne]: payment.id }, status: { [Op.in]: ['succeeded', 'partially_refunded', 'refunded'] } }, transaction });

    if (consultation && PAYABLE.includes(consultation.status) && paidElsewhere === 0 && (await slotStillFree(consultation, transaction))) {
      await payment.update({ status: 'succeeded', stripeChargeId: charge.id, stripeCustomerId: customerId, failureMessage: null }, { transaction });
      await transitionConsultation(ctx, consultation, 'booked', { actorId: actor?.actorId ?? null, note: `paid ${charge.id}`, transaction, changes: { holdExpiresAt: null } });
      await scheduleBookingReminder(consultation, { transaction });
      await recordAudit(actor ?? SYSTEM, { action: 'payment.succeeded', subjectType: 'payment', subjectId: payment.id, subjectUserId: consultation.riderId }, { transaction });
      transaction.afterCommit(() => void sendBookedMails(ctx, consultation.id, payment.id));
      return 'booked' as const;
    }

    // The money arrived for a booking that no longer waits for it: keep the record, give it back.
    await payment.update({ status: 'succeeded', stripeChargeId: charge.id, stripeCustomerId: customerId, failureMessage: 'charge arrived after the booking was released; refunded in full' }, { transaction });
    const refund = await recordRefundRequest(
      { payment, amountMinor: payment.amountMinor, reason: 'This payment reached us after the booking was released, so it is refunded in full.', idempotencyKey: `late-charge-${payment.id}`, notice: 'refund', actorId: null },
      transaction,
    );
    refundId = refund?.id ?? null;
    await recordAudit(actor ?? SYSTEM, { action: 'payment.late_charge_refunded', subjectType: 'payment', subjectId: payment.id, subjectUserId: consultation?.riderId ?? null, detail: { amountMinor: payment.amountMinor } }, { transaction });
    return 'refunding' as const;
  });
  if (refundId !== null) {
    const id = refundId;
    if (outer) outer.afterCommit(() => void tryRefundNow(ctx, id));
    else await tryRefundNow(ctx, id);
  }
  return outcome;
}

/**
 * A hold that ran out stops protecting its slot (the calendar ignores it), so before booking on a
 * late charge the slot must still be free of every other booking and live hold.
 */
async function slotStillFree(consultation: Consultation, transaction: Transaction): Promise<boolean> {
  if (consultation.holdExpiresAt && consultation.holdExpiresAt.getTime() > Date.now()) return true;
  const busy = await busyIntervals(consultation.fitterId, consultation.startsAt, consultation.endsAt, new Date(), { transaction, excludeId: consultation.id });
  return !busy.some((b) => consultation.startsAt < b.end && b.start < consultation.endsAt);
}

async function sendBookedMails(ctx: AppContext, consultationId: number, paymentId: number): Promise<void> {
  try {
    const [consultation, payment] = await Promise.all([Consultation.findByPk(consultationId), Payment.findByPk(paymentId)]);
    if (!consultation || !payment) return;
    await Promise.all([sendBookingConfirmation(ctx, consultation, 'booked'), sendReceipt(ctx, consultation, payment)]);
  } catch (error) {
    ctx.logger.error({ err: error, consultationId }, 'booking e-mail failed');
  }
}

/**
 * Give an attempt up: the payment becomes `failed` with `message`, and a consultation still
 * waiting on it moves to `to` (cancelled for a refused card, back to requested or expired when
 * no charge was made). Runs once; an attempt already settled is left alone.
 */
export async function releaseAttempt(
  ctx: AppContext,
  paymentId: number,
  input: { message: string; to: 'cancelled' | 'requested' | 'expired'; note: string; actorId: number | null },
  outer?: Transaction,
): Promise<boolean> {
  return inTransaction(ctx, outer, async (transaction) => {
    const peek = await Payment.findByPk(paymentId, { transaction });
    if (!peek) return false;
    const consultation = await Consultation.findByPk(peek.consultationId, { transaction, lock: transaction.LOCK.UPDATE });
    const payment = (await Payment.findByPk(paymentId, { transaction, lock: transaction.LOCK.UPDATE }))!;
    if (payment.status !== 'pending') return false;
    await payment.update({ status: 'failed', failureMessage: input.message.slice(0, 300) }, { transaction });
    const othersPending = await Payment.count({ where: { consultationId: payment.consultationId, status: 'pending', id: { [Op.ne]: payment.id } }, transaction });
    // A refusal releases the hold outright; "no charge found" waits for any newer attempt still running.
    if (consultation?.status === 'awaiting_payment' && (input.to === 'cancelled' || othersPending === 0)) {
      const cancelled = input.to === 'cancelled';
      await transitionConsultation(ctx, consultation, input.to, {
        actorId: input.actorId,
        note: input.note,
        transaction,
        changes: cancelled ? { cancelReason: input.note.slice(0, 500), holdExpiresAt: null } : {},
      });
    }
    return true;
  });
}
