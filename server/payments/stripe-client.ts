import Stripe from 'stripe';
import type { Config } from '../config';

/**
 * The official Stripe SDK. Locally it points at stripe-stateful-mock through STRIPE_API_BASE;
 * with real keys and no API base it talks to Stripe itself. Returns null when payments are not
 * configured, and the booking service then refuses to take payment with a clear message.
 */
export function createStripe(config: Pick<Config, 'STRIPE_SECRET_KEY' | 'STRIPE_API_BASE'>): Stripe | null {
  if (!config.STRIPE_SECRET_KEY) return null;
  // A bounded wait (20 s, 2 retries): the payment reconciler assumes no request is still waiting
  // for Stripe after a few minutes (RECONCILE_AFTER_MS).
  if (!config.STRIPE_API_BASE) return new Stripe(config.STRIPE_SECRET_KEY, { maxNetworkRetries: 2, timeout: 20_000 });
  const base = new URL(config.STRIPE_API_BASE);
  return new Stripe(config.STRIPE_SECRET_KEY, {
    host: base.hostname,
    port: Number(base.port || (base.protocol === 'https:' ? 443 : 80)),
    protocol: base.protocol === 'https:' ? 'https' : 'http',
    maxNetworkRetries: 0,
    timeout: 20_000,
  });
}
