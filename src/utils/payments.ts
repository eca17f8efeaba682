import type { StatusKind } from '@/components/StatusBadge.vue';

/** Payment statuses in plain words, each with its badge (icon plus word). Unknown ones show as sent. */
const LOOK: Record<string, { kind: StatusKind; word: string }> = {
  succeeded: { kind: 'steady', word: 'Paid' },
  partially_refunded: { kind: 'watch', word: 'Partly refunded' },
  refunded: { kind: 'hold', word: 'Refunded' },
  pending: { kind: 'waiting', word: 'Not completed' },
  failed: { kind: 'urgent', word: 'Failed' },
};

export function paymentLook(status: string): { kind: StatusKind; word: string } {
  return LOOK[status] ?? { kind: 'hold', word: status };
}

/** Only money that arrived can go back, and never more than what is left. */
export function refundableMinor(p: { status: string; amountMinor: number; refundedMinor: number }): number {
  if (p.status !== 'succeeded' && p.status !== 'partially_refunded') return 0;
  return Math.max(0, p.amountMinor - p.refundedMinor);
}
