import { TEST_CARDS, type CardEntry } from '@shared/booking';
import type { Config } from '../config';

/**
 * How the checkout takes cards on this server. Stripe's card field whenever a publishable key is
 * set (it needs the server's secret key too, which the config insists on); otherwise the
 * development-only test-card chooser, never in production; otherwise no card payments at all.
 */
export function cardEntryFor(config: Pick<Config, 'NODE_ENV' | 'STRIPE_PUBLISHABLE_KEY'>, stripeConfigured: boolean): CardEntry {
  if (!stripeConfigured) return { method: 'none' };
  if (config.STRIPE_PUBLISHABLE_KEY) return { method: 'stripe_card', publishableKey: config.STRIPE_PUBLISHABLE_KEY };
  if (config.NODE_ENV === 'production') return { method: 'none' };
  return { method: 'test_cards', cards: [...TEST_CARDS] };
}
