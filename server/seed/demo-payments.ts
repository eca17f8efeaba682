import { Op } from 'sequelize';
import type { AppContext } from '../context';
import { Consultation, Payment, User } from '../models';
import { DEMO_PEOPLE } from './demo-people';

/** Consultation states that mean the rider has paid. */
const PAID_STATES: Consultation['status'][] = ['booked', 'in_session', 'plan_active', 'on_hold', 'completed'];

/**
 * A real charge, through the Stripe SDK, for every demo session that is paid but has no payment
 * yet, so the clinic's Payments tab and its refunds work in the demo like any rider's payment
 * (Stripe's `tok_visa` test card; the Stripe idempotency key is per session, so a re-run charges
 * nothing twice). Without Stripe configured, or if Stripe refuses, the demo starts without them.
 * The local Stripe fake keeps its records in memory only: after a restart, refunding a charge it
 * made before is refused ("No such charge"), and the refund shows under Refunds that need you.
 */
export async function seedDemoPayments(ctx: AppContext): Promise<void> {
  if (!ctx.stripe) return;
  const riderEmails = DEMO_PEOPLE.filter((p) => p.role === 'rider').map((p) => p.email);
  const riders = await User.findAll({ where: { email: riderEmails }, attributes: ['id'] });
  const sessions = await Consultation.findAll({ where: { riderId: riders.map((r) => r.id), status: { [Op.in]: PAID_STATES } } });
  for (const session of sessions) {
    if (await Payment.count({ where: { consultationId: session.id } })) continue;
    const attemptKey = `demo-${session.calendarUid}`;
    try {
      const charge = await ctx.stripe.charges.create(
        { amount: session.feeMinor, currency: session.currency.toLowerCase(), source: 'tok_visa', description: `Saddlestep consultation ${session.id} (demo)`, metadata: { consultationId: String(session.id) } },
        { idempotencyKey: `charge-${attemptKey}` },
      );
      await Payment.create({ consultationId: session.id, riderId: session.riderId, attemptKey, stripeCustomerId: null, stripeChargeId: charge.id, amountMinor: session.feeMinor, currency: session.currency, status: 'succeeded', failureMessage: null });
    } catch (error) {
      ctx.logger.warn({ err: error, consultationId: session.id }, 'demo payment not recorded; the demo goes on without it');
    }
  }
}
