import type { Sequelize } from 'sequelize';
import type { AppContext } from '../context';
import { Consultation } from '../models';
import { sendReminder } from '../mail/booking-mails';
import { BOOKING_REMINDER } from '../services/booking-jobs';
import { expireHolds } from '../services/booking';
import { reconcilePendingPayments } from '../services/payment-reconcile';
import { REFUND_JOB, executeRefund } from '../services/refund-jobs';
import { createScheduler } from './scheduler';
import { CHAT_NOTICE, sendChatNotice } from '../services/chat-notices';
import { REFERRAL_ESCALATE, escalateReferral } from '../services/referral-notices';
import { REFERRAL_ESCALATION_MAIL, sendEscalationMail } from '../services/referral-escalation-mail';
import { CHECKIN_DUE, CHECKIN_OVERDUE, CHECKIN_OVERDUE_MAIL, markCheckInOverdue, remindCheckIn, sendOverdueMail } from '../services/follow-up-jobs';

/**
 * The scheduler with Saddlestep's job handlers. `sequelize` defaults to the app's pool; tests pass
 * a second pool to act as a second server process competing for the same jobs.
 */
export function createAppScheduler(ctx: AppContext, options: { sequelize?: Sequelize; intervalMs?: number; instanceId?: string; onlyKeys?: string[] } = {}) {
  return createScheduler({
    sequelize: options.sequelize ?? ctx.sequelize,
    logger: ctx.logger,
    intervalMs: options.intervalMs,
    instanceId: options.instanceId,
    onlyKeys: options.onlyKeys,
    // Reconcile first: an attempt settled from Stripe's record must not have its hold expired under it.
    periodic: [() => reconcilePendingPayments(ctx), () => expireHolds(ctx)],
    handlers: {
      /** Never for a cancelled or moved booking: the job re-reads the booking when it runs. */
      [CHAT_NOTICE]: (payload) => sendChatNotice(ctx, payload),
      [REFERRAL_ESCALATE]: (payload) => escalateReferral(ctx, payload),
      [REFERRAL_ESCALATION_MAIL]: (payload) => sendEscalationMail(ctx, payload),
      [CHECKIN_DUE]: (payload) => remindCheckIn(ctx, payload),
      [CHECKIN_OVERDUE]: (payload) => markCheckInOverdue(ctx, payload),
      [CHECKIN_OVERDUE_MAIL]: (payload) => sendOverdueMail(ctx, payload),
      [BOOKING_REMINDER]: async (payload) => {
        const consultation = await Consultation.findByPk(Number(payload.consultationId));
        if (!consultation || consultation.status !== 'booked' || consultation.calendarSequence !== Number(payload.sequence)) return;
        await sendReminder(ctx, consultation, payload.lead === 'hour' ? 'hour' : 'day');
      },
      /** Throws while Stripe is unreachable, so the scheduler retries with back-off. */
      [REFUND_JOB]: async (payload) => {
        await executeRefund(ctx, Number(payload.refundId));
      },
    },
  });
}
