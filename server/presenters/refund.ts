import type { RefundRetryResult } from '@shared/admin';
import type { Payment, Refund } from '../models';

/** A refund after an admin's Try again: its state and Stripe's last message, never the free-text reason. */
export function presentRetriedRefund(refund: Refund, payment: Payment): RefundRetryResult['refund'] {
  return {
    id: refund.id,
    status: refund.status,
    amountMinor: refund.amountMinor,
    currency: payment.currency,
    lastError: refund.lastError,
    attempts: refund.attempts,
  };
}
