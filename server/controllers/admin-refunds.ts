import type { RequestHandler } from 'express';
import type { RefundRetryRequest } from '@shared/admin';
import { notFound } from '../errors';
import { parseId } from '../middleware/validate';
import type { AppContext } from '../context';
import { presentRetriedRefund } from '../presenters/refund';
import { actorFromRequest } from '../services/audit';
import { listRefundsNeedingAttention } from '../services/refund-attention';
import { retryRefund } from '../services/refund-retry';

/** The admin's "Refunds that need you": the list, and Try again. */
export function createAdminRefundsController(ctx: AppContext) {
  const attention: RequestHandler = async (_req, res) => {
    res.json(await listRefundsNeedingAttention());
  };

  const retry: RequestHandler = async (req, res) => {
    const id = parseId(req.params.id as string | undefined);
    if (!id) throw notFound('That refund');
    const { attemptKey } = req.body as RefundRetryRequest;
    const { refund, payment } = await retryRefund(ctx, id, attemptKey, actorFromRequest(req));
    res.json({ refund: presentRetriedRefund(refund, payment) });
  };

  return { attention, retry };
}
