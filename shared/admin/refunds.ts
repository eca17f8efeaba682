import { z } from 'zod';

/**
 * Why a refund is on the admin's "Refunds that need you" list:
 * - `refused`: Stripe refused it for good (the refund is `failed`);
 * - `gave-up`: Stripe could not be reached on any of the scheduler's retries (the job is `failed`);
 * - `stalled`: it is still pending but nothing is retrying it (no job, or a job due or claimed
 *   longer ago than the scheduler's stale-claim window, so no scheduler is running it).
 */
export const REFUND_PROBLEMS = ['refused', 'gave-up', 'stalled'] as const;
export type RefundProblem = (typeof REFUND_PROBLEMS)[number];

/** What the refund was for, read from the prefix of its key (`cancel-12`, `admin-<uuid>`…). */
export const REFUND_CAUSES = ['cancellation', 'admin', 'no-show', 'late-charge', 'other'] as const;
export type RefundCause = (typeof REFUND_CAUSES)[number];

/**
 * One refund on the list. `lastError` is the payment service's own message (never the refund's
 * reason, which is an admin's free text and may mention the rider's body).
 */
export const attentionRefundSchema = z.object({
  id: z.number().int(),
  paymentId: z.number().int(),
  consultationId: z.number().int().nullable(),
  riderName: z.string(),
  amountMinor: z.number().int(),
  currency: z.string(),
  status: z.enum(['pending', 'failed']),
  problem: z.enum(REFUND_PROBLEMS),
  cause: z.enum(REFUND_CAUSES),
  lastError: z.string().nullable(),
  attempts: z.number().int().min(0),
  createdAt: z.string(),
});
export type AttentionRefund = z.infer<typeof attentionRefundSchema>;

/** GET /api/admin/refunds/attention: newest first; `more` when the list was cut at its limit. */
export const attentionRefundListSchema = z.object({ refunds: z.array(attentionRefundSchema), more: z.boolean() });
export type AttentionRefundList = z.infer<typeof attentionRefundListSchema>;

/**
 * POST /api/admin/refunds/:id/retry. `attemptKey` is the client's UUID for one press of Try again,
 * reused after a lost answer: the same key re-queues the refund once.
 */
export const refundRetrySchema = z.strictObject({
  attemptKey: z.uuid({ error: 'The retry attempt id is not valid; reload the page.' }),
});
export type RefundRetryRequest = z.infer<typeof refundRetrySchema>;

/** The refund after Try again: `succeeded`, `pending` (queued, Stripe not answering) or `failed` (refused again). */
export const refundRetryResultSchema = z.object({
  refund: z.object({
    id: z.number().int(),
    status: z.enum(['pending', 'succeeded', 'failed']),
    amountMinor: z.number().int(),
    currency: z.string(),
    lastError: z.string().nullable(),
    attempts: z.number().int().min(0),
  }),
});
export type RefundRetryResult = z.infer<typeof refundRetryResultSchema>;
