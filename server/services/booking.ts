import { randomUUID } from 'node:crypto';
import { Op, Transaction } from 'sequelize';
import { capToRefundable, decideRefund, slotRefusal, type SlotRefusal } from '@shared/booking';
import { conflict, notFound, badRequest } from '../errors';
import { Consultation, FitterProfile, Payment, User } from '../models';
import type { AppContext } from '../context';
import { transitionConsultation } from './consultation-states';
import { busyIntervals, getPublishedFitter } from './fitters';
import { getClinicSettings } from './clinic-settings';
import { assertRiderMayBook } from './intake-gate';
import { recordAudit, type AuditActor } from './audit';

/** Reads after the fitter lock must see rows committed by the request that held it before us. */
const READ_COMMITTED = Transaction.ISOLATION_LEVELS.READ_COMMITTED;

/** Why a time cannot be booked, in the rider's words: "taken" only when it really was offered. */
function slotMessage(refusal: SlotRefusal, availability: { horizonDays: number; minNoticeHours: number }): string {
  switch (refusal) {
    case 'past':
      return 'That time has already passed. Please pick one of the times shown.';
    case 'beyond-horizon':
      return `Sessions can be booked at most ${availability.horizonDays} days ahead. Please pick one of the times shown.`;
    case 'notice':
      return `This fitter needs at least ${availability.minNoticeHours} h notice. Please pick a later time.`;
    case 'not-offered':
      return 'That time is not one this fitter offers. Please pick one of the times shown.';
    case 'taken':
      return 'Sorry, that time was just taken. Please pick another slot.';
  }
}

/**
 * Hold a slot for a rider while they pay. Atomic: the fitter's profile row is locked FOR UPDATE,
 * so concurrent requests for one fitter run one at a time; each re-checks availability, buffer and
 * notice against the live calendar, and only the first finds the slot free. The rest get 409.
 */
export async function holdSlot(ctx: AppContext, rider: User, input: { fitterId: number; startsAt: Date }, actor: AuditActor): Promise<Consultation> {
  const gate = await assertRiderMayBook(rider.id);
  const { fitter } = await getPublishedFitter(input.fitterId);
  const settings = await getClinicSettings();
  const now = new Date();

  return ctx.sequelize.transaction({ isolationLevel: READ_COMMITTED }, async (transaction) => {
    const profile = await FitterProfile.findByPk(fitter.id, { transaction, lock: transaction.LOCK.UPDATE });
    if (!profile || !profile.published) throw notFound('That fitter');
    const existingHold = await Consultation.findOne({
      where: { riderId: rider.id, status: { [Op.in]: ['requested', 'awaiting_payment'] }, holdExpiresAt: { [Op.gt]: now } },
      transaction,
    });
    if (existingHold) await transitionConsultation(ctx, existingHold, 'cancelled', { actorId: rider.id, note: 'replaced by a new hold', transaction });

    const endsAt = new Date(input.startsAt.getTime() + profile.availability.slotMinutes * 60_000);
    const busy = await busyIntervals(fitter.id, new Date(input.startsAt.getTime() - 86_400_000), new Date(endsAt.getTime() + 86_400_000), now, { transaction });
    const refusal = slotRefusal({ availability: profile.availability, timeZone: fitter.timeZone, busy, now }, input.startsAt);
    if (refusal) throw conflict(slotMessage(refusal, profile.availability));

    const consultation = await Consultation.create(
      {
        riderId: rider.id,
        fitterId: fitter.id,
        intakeId: gate.intakeId,
        status: 'requested',
        startsAt: input.startsAt,
        endsAt,
        holdExpiresAt: new Date(now.getTime() + settings.holdMinutes * 60_000),
        feeMinor: profile.feeMinor,
        currency: profile.currency,
        calendarUid: `${randomUUID()}@saddlestep`,
        flaggedForPhysio: gate.flaggedForPhysio,
        cancelledById: null,
        cancelReason: null,
      },
      { transaction },
    );
    await recordAudit(actor, { action: 'consultation.hold', subjectType: 'consultation', subjectId: consultation.id, subjectUserId: rider.id }, { transaction });
    return consultation;
  });
}

/** Mark holds whose time ran out as expired (the calendar already ignores them). */
export async function expireHolds(ctx: AppContext, now = new Date()): Promise<number> {
  const stale = await Consultation.findAll({ where: { status: { [Op.in]: ['requested', 'awaiting_payment'] }, holdExpiresAt: { [Op.lte]: now } }, limit: 200 });
  let expired = 0;
  for (const consultation of stale) {
    await ctx.sequelize.transaction(async (transaction) => {
      const fresh = await Consultation.findByPk(consultation.id, { transaction, lock: transaction.LOCK.UPDATE });
      if (!fresh || !['requested', 'awaiting_payment'].includes(fresh.status) || !fresh.holdExpiresAt || fresh.holdExpiresAt > now) return;
      // A payment in flight keeps its consultation: the reconciler asks Stripe and settles it either way.
      if (fresh.status === 'awaiting_payment' && (await Payment.count({ where: { consultationId: fresh.id, status: 'pending' }, transaction })) > 0) return;
      await transitionConsultation(ctx, fresh, 'expired', { actorId: null, note: 'hold ran out', transaction });
      expired += 1;
    });
  }
  return expired;
}

/** A consultation the user takes part in (rider or assigned fitter), or 404. */
export async function findOwnConsultation(user: Express.User, id: number): Promise<Consultation> {
  const where = user.role === 'rider' ? { id, riderId: user.id } : user.role === 'fitter' ? { id, fitterId: user.id } : null;
  const consultation = where ? await Consultation.findOne({ where }) : null;
  if (!consultation) throw notFound('That consultation');
  return consultation;
}

/** Refund preview for the cancel dialog, from the same rule the cancellation applies. */
export async function cancellationTerms(
  consultation: Consultation,
  payment: Pick<Payment, 'amountMinor' | 'refundedMinor' | 'currency'>,
  cancelledBy: 'rider' | 'fitter' | 'admin',
  options: { now?: Date; leftMinor?: number } = {},
) {
  const settings = await getClinicSettings();
  const decision = decideRefund({ paidMinor: payment.amountMinor, startsAt: consultation.startsAt, now: options.now ?? new Date(), cancelledBy, policy: settings.cancellation });
  return capToRefundable(decision, options.leftMinor ?? payment.amountMinor - payment.refundedMinor, payment.currency);
}

/**
 * Move a booked consultation to another offered slot with the same fitter. The payment stays;
 * the calendar invite keeps its UID and its sequence goes up. Only before the cancellation window.
 */
export async function reschedule(ctx: AppContext, user: User, consultationId: number, startsAt: Date, actor: AuditActor): Promise<Consultation> {
  const now = new Date();
  const settings = await getClinicSettings();
  return ctx.sequelize.transaction({ isolationLevel: READ_COMMITTED }, async (transaction) => {
    const own = await findOwnConsultation(user, consultationId);
    const profile = await FitterProfile.findByPk(own.fitterId, { transaction, lock: transaction.LOCK.UPDATE });
    const consultation = await Consultation.findByPk(own.id, { transaction, lock: transaction.LOCK.UPDATE });
    const fitter = await User.findByPk(own.fitterId, { transaction });
    if (!profile || !consultation || !fitter) throw notFound('That consultation');
    if (consultation.status !== 'booked') throw conflict('Only a booked session can be moved.');
    const hoursBefore = (consultation.startsAt.getTime() - now.getTime()) / 3_600_000;
    if (user.role === 'rider' && hoursBefore < settings.cancellation.windowHours) {
      throw conflict(`Sessions can be moved up to ${settings.cancellation.windowHours} h before they start. Please cancel instead, or message your fitter.`);
    }
    if (startsAt.getTime() === consultation.startsAt.getTime()) throw badRequest('Choose a different time to move the session to.');
    const endsAt = new Date(startsAt.getTime() + profile.availability.slotMinutes * 60_000);
    const busy = await busyIntervals(fitter.id, new Date(startsAt.getTime() - 86_400_000), new Date(endsAt.getTime() + 86_400_000), now, { transaction, excludeId: consultation.id });
    const refusal = slotRefusal({ availability: profile.availability, timeZone: fitter.timeZone, busy, now }, startsAt);
    if (refusal) throw conflict(slotMessage(refusal, profile.availability));
    await transitionConsultation(ctx, consultation, 'booked', {
      actorId: user.id,
      note: `moved from ${consultation.startsAt.toISOString()}`,
      transaction,
      changes: { startsAt, endsAt, calendarSequence: consultation.calendarSequence + 1 },
    });
    await recordAudit(actor, { action: 'consultation.reschedule', subjectType: 'consultation', subjectId: consultation.id, subjectUserId: consultation.riderId }, { transaction });
    return consultation;
  });
}
