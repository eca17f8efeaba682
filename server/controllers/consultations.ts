import type { RequestHandler } from 'express';
import type { z } from 'zod';
import { Op } from 'sequelize';
import type { cancelSchema, holdSlotSchema, paymentSchema, rescheduleSchema } from '@shared/booking';
import { describeRefundPolicy, NO_SHOW_REFUND_SHARE } from '@shared/booking';
import { cardEntryFor } from '../payments/card-entry';
import { notFound } from '../errors';
import { parseId } from '../middleware/validate';
import { Consultation, Payment, User } from '../models';
import { presentConsultation } from '../presenters/consultation';
import type { AppContext } from '../context';
import { cancellationTerms, findOwnConsultation, holdSlot, reschedule } from '../services/booking';
import { payForConsultation } from '../services/payments';
import { cancelConsultation, markNoShow } from '../services/refunds';
import { getClinicSettings } from '../services/clinic-settings';
import { actorFromRequest } from '../services/audit';
import { sendBookingConfirmation } from '../mail/booking-mails';
import { physioHasConsentedReferral } from '../services/access';
import { scheduleBookingReminder } from '../services/booking-jobs';

function idFrom(raw: unknown): number {
  const id = parseId(raw as string);
  if (!id) throw notFound('That consultation');
  return id;
}

async function present(c: Consultation) {
  const [rider, fitter, payment] = await Promise.all([
    User.findByPk(c.riderId),
    User.findByPk(c.fitterId),
    Payment.findOne({ where: { consultationId: c.id, status: { [Op.in]: ['succeeded', 'refunded', 'partially_refunded'] } } }),
  ]);
  return presentConsultation(c, { rider, fitter }, payment);
}

export function createConsultationController(ctx: AppContext) {
  const hold: RequestHandler = async (req, res) => {
    const input = req.body as z.output<typeof holdSlotSchema>;
    const consultation = await holdSlot(ctx, req.user!, input, actorFromRequest(req));
    res.status(201).json({ consultation: await present(consultation) });
  };

  const list: RequestHandler = async (req, res) => {
    const user = req.user!;
    const rows = await Consultation.findAll({
      where: user.role === 'rider' ? { riderId: user.id } : { fitterId: user.id },
      order: [['startsAt', 'DESC']],
      limit: 100,
    });
    res.json({ consultations: await Promise.all(rows.map(present)) });
  };

  const show: RequestHandler = async (req, res) => {
    const user = req.user!;
    const id = idFrom(req.params.id);
    // A referred physio sits in as a third party; everyone else must be the rider or the fitter.
    const referred = user.role === 'physio' ? await Consultation.findByPk(id) : null;
    if (user.role === 'physio' && !(referred && (await physioHasConsentedReferral(user.id, referred.riderId, referred.id)))) throw notFound('That consultation');
    const consultation = referred ?? (await findOwnConsultation(user, id));
    res.json({ consultation: await present(consultation) });
  };

  /** What a cancellation would refund now, and the policy itself (shown before paying). */
  const terms: RequestHandler = async (req, res) => {
    const consultation = await findOwnConsultation(req.user!, idFrom(req.params.id));
    const payment = await Payment.findOne({ where: { consultationId: consultation.id, status: { [Op.in]: ['succeeded', 'partially_refunded'] } } });
    const cancelledBy = req.user!.role === 'rider' ? 'rider' : 'fitter';
    const { cancellation } = await getClinicSettings();
    res.json({
      terms: payment ? await cancellationTerms(consultation, payment, cancelledBy) : null,
      policy: { ...cancellation, noShowRefundShare: NO_SHOW_REFUND_SHARE, summary: describeRefundPolicy(cancellation) },
    });
  };

  const pay: RequestHandler = async (req, res) => {
    const input = req.body as z.output<typeof paymentSchema>;
    const { consultation } = await payForConsultation(ctx, req.user!, idFrom(req.params.id), input, actorFromRequest(req));
    res.json({ consultation: await present(consultation) });
  };

  const move: RequestHandler = async (req, res) => {
    const { startsAt } = req.body as z.output<typeof rescheduleSchema>;
    const consultation = await reschedule(ctx, req.user!, idFrom(req.params.id), startsAt, actorFromRequest(req));
    await scheduleBookingReminder(consultation);
    await sendBookingConfirmation(ctx, consultation, 'moved').catch((error: unknown) => ctx.logger.error({ err: error }, 'reschedule e-mail failed'));
    res.json({ consultation: await present(consultation) });
  };

  const cancel: RequestHandler = async (req, res) => {
    const { reason } = req.body as z.output<typeof cancelSchema>;
    const result = await cancelConsultation(ctx, req.user!, idFrom(req.params.id), reason, actorFromRequest(req));
    const refundedMinor = result.refund?.status === 'succeeded' ? result.refund.amountMinor : 0;
    // A refund Stripe has not taken yet is promised and retried by the refund job.
    const refundPendingMinor = result.refund?.status === 'pending' ? result.refund.amountMinor : 0;
    res.json({ consultation: await present(result.consultation), refundedMinor, refundPendingMinor, terms: result.terms });
  };

  /** The fitter records that the rider did not come (after the start time). */
  const noShow: RequestHandler = async (req, res) => {
    const result = await markNoShow(ctx, req.user!, idFrom(req.params.id), actorFromRequest(req));
    res.json({ consultation: await present(result.consultation), refund: result.decision });
  };

  /** How the checkout takes cards: Stripe's card field, the development test cards, or none. */
  const cardEntry: RequestHandler = (_req, res) => {
    res.json(cardEntryFor(ctx.config, ctx.stripe !== null));
  };

  return { hold, list, show, terms, pay, move, cancel, noShow, cardEntry };
}
