import { z } from 'zod';
import { formatMoney } from './money';

/**
 * The clinic's cancellation rules. The defaults are invented for the demo studio (common practice
 * in appointment businesses, no published source): full refund up to 24 h before the start, half
 * after that, none for a missed session (no-show), and a full refund whenever the fitter or clinic
 * cancels.
 */
export const cancellationPolicySchema = z.strictObject({
  /** Hours before the start up to which a rider gets the early share back and may reschedule. */
  windowHours: z.number().int().min(0).max(24 * 14).default(24),
  /** Share refunded when the rider cancels before the window (0–1). */
  earlyRefundShare: z.number().min(0).max(1).default(1),
  /** Share refunded when the rider cancels inside the window, before the start (0–1). */
  lateRefundShare: z.number().min(0).max(1).default(0.5),
});
export type CancellationPolicy = z.infer<typeof cancellationPolicySchema>;
export const DEFAULT_CANCELLATION_POLICY: CancellationPolicy = cancellationPolicySchema.parse({});

/**
 * Share refunded when the fitter records that the rider did not come. Our invented rule, not a
 * clinic setting yet: nothing, as for a cancellation after the start (the fitter kept the time free).
 */
export const NO_SHOW_REFUND_SHARE = 0;

export type CancelledBy = 'rider' | 'fitter' | 'admin';

export interface RefundDecision {
  /** Minor units to refund (never more than paid). */
  amountMinor: number;
  share: number;
  /** A sentence for the rider and the e-mail. */
  reason: string;
  /** Whether the rider may still move the booking instead. */
  mayReschedule: boolean;
}

/**
 * How much of a paid fee goes back when a booking is cancelled at `now`.
 * Shares are rounded down to whole minor units so a refund never exceeds the policy.
 */
export function decideRefund(input: { paidMinor: number; startsAt: Date; now: Date; cancelledBy: CancelledBy; policy: CancellationPolicy }): RefundDecision {
  const { paidMinor, startsAt, now, cancelledBy, policy } = input;
  const hoursBefore = (startsAt.getTime() - now.getTime()) / 3_600_000;
  const mayReschedule = hoursBefore >= policy.windowHours;
  if (cancelledBy !== 'rider') {
    return { amountMinor: paidMinor, share: 1, reason: 'The studio cancelled, so the full fee is refunded.', mayReschedule };
  }
  if (hoursBefore <= 0) {
    return { amountMinor: 0, share: 0, reason: 'The session time has passed, so no refund is due.', mayReschedule: false };
  }
  const early = hoursBefore >= policy.windowHours;
  const share = early ? policy.earlyRefundShare : policy.lateRefundShare;
  const amountMinor = Math.floor(paidMinor * share);
  const percent = Math.round(share * 100);
  const reason = early
    ? `Cancelled more than ${policy.windowHours} h before the start: ${percent} % is refunded.`
    : `Cancelled less than ${policy.windowHours} h before the start: ${percent} % is refunded.`;
  return { amountMinor, share, reason, mayReschedule };
}

/**
 * A refund decision capped at what is left of the payment: the policy's share is of the fee paid,
 * but money refunded earlier (the studio's goodwill, say) cannot be refunded again. The reason
 * says so, so the amount the rider is shown is the amount that is sent.
 */
export function capToRefundable(decision: RefundDecision, leftMinor: number, currency: string): RefundDecision {
  if (decision.amountMinor <= leftMinor) return decision;
  const amountMinor = Math.max(0, leftMinor);
  return { ...decision, amountMinor, reason: `${decision.reason} Part of the fee was refunded earlier, so ${formatMoney(amountMinor, currency, 'en-GB')} is what is left to refund.` };
}

const percentOf = (share: number) => `${Math.round(share * 100)} %`;

/**
 * The policy in plain sentences, for the checkout page before paying and the policy form. The
 * same numbers `decideRefund` applies, so what the rider reads is what happens.
 */
export function describeRefundPolicy(policy: CancellationPolicy): string[] {
  const early = policy.earlyRefundShare === 1 ? 'the full fee' : percentOf(policy.earlyRefundShare);
  const late = policy.lateRefundShare === 0 ? 'nothing' : percentOf(policy.lateRefundShare);
  return [
    `Cancel ${policy.windowHours} h or more before the start: ${early} back. You can also move the session until then.`,
    `Cancel less than ${policy.windowHours} h before the start: ${late} back.`,
    'Cancel after the start time: nothing back.',
    `Miss the session without cancelling (your fitter records a no-show): ${NO_SHOW_REFUND_SHARE === 0 ? 'no refund' : `${percentOf(NO_SHOW_REFUND_SHARE)} back`}.`,
    'If your fitter or the studio cancels, you get the full fee back.',
  ];
}

/** What goes back when the fitter records a no-show (rounded down, like every share). */
export function noShowRefund(paidMinor: number): RefundDecision {
  const amountMinor = Math.floor(paidMinor * NO_SHOW_REFUND_SHARE);
  const reason = amountMinor > 0 ? `Missed session: ${percentOf(NO_SHOW_REFUND_SHARE)} is refunded under the studio's rules.` : "Missed session: no refund is due under the studio's rules.";
  return { amountMinor, share: NO_SHOW_REFUND_SHARE, reason, mayReschedule: false };
}
