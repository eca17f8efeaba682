import type { RequestHandler } from 'express';
import type { AppContext } from '../context';
import { handleStripeWebhook } from '../services/stripe-webhooks';

/** Stripe calls this with a raw JSON body; it carries no session and no CSRF token, only a signature. */
export function createStripeWebhookHandler(ctx: AppContext): RequestHandler {
  return async (req, res) => {
    const body = Buffer.isBuffer(req.body) ? req.body : Buffer.from('');
    const result = await handleStripeWebhook(ctx, body, req.get('stripe-signature'));
    res.json({ received: true, ...result });
  };
}
