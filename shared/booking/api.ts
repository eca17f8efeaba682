import { z } from 'zod';
import { availabilitySchema, fitterProfileSchema, localDateSchema } from './availability';
import { adminRefundSchema } from '../admin';

const instant = z.iso.datetime({ offset: true, error: 'Send the time as an ISO date-time, like 2027-03-09T08:00:00Z.' }).transform((s) => new Date(s));

export const holdSlotSchema = z.strictObject({
  fitterId: z.number({ error: 'Choose a fitter.' }).int().positive(),
  startsAt: instant,
});

/** Stripe test tokens in development, real card tokens from Stripe Elements in production. */
export const paymentSchema = z.strictObject({
  token: z.string({ error: 'Choose a card.' }).regex(/^tok_[A-Za-z0-9_]{1,96}$/, 'That card token is not valid.'),
  /** The client's idempotency key for this attempt (a UUID made when the pay button is first pressed). */
  attemptKey: z.uuid({ error: 'Missing payment attempt id; reload the page.' }),
});

export const rescheduleSchema = z.strictObject({ startsAt: instant });

export const cancelSchema = z.strictObject({
  reason: z.string().trim().max(500, 'Keep the reason under 500 characters.').optional(),
});

export const slotRangeSchema = z.strictObject({ from: localDateSchema, to: localDateSchema }).refine((r) => r.to >= r.from, { message: 'The end date must not be before the start date.', path: ['to'] });

export const fitterSettingsSchema = z.strictObject({ profile: fitterProfileSchema, availability: availabilitySchema });

/** Test cards offered by the development-only chooser (Stripe's documented test tokens). */
export const TEST_CARDS = [
  { token: 'tok_visa', label: 'Visa that pays' },
  { token: 'tok_mastercard', label: 'Mastercard that pays' },
  { token: 'tok_chargeDeclined', label: 'Card that is declined' },
] as const;

/**
 * How this server takes cards, so the checkout page shows the right thing:
 * - `stripe_card`: Stripe's own card field (Stripe.js, served from js.stripe.com), which turns the
 *   card into a one-time token in the browser; the card number never reaches our server;
 * - `test_cards`: the development-only chooser of Stripe test tokens (local Stripe fake);
 * - `none`: payments are not set up on this server.
 */
export const cardEntrySchema = z.discriminatedUnion('method', [
  z.object({ method: z.literal('stripe_card'), publishableKey: z.string().regex(/^pk_(test|live)_\w+$/) }),
  z.object({ method: z.literal('test_cards'), cards: z.array(z.object({ token: z.string(), label: z.string() })) }),
  z.object({ method: z.literal('none') }),
]);
export type CardEntry = z.infer<typeof cardEntrySchema>;

/**
 * An admin's refund. `idempotencyKey` is the client's UUID for this attempt (made when Refund is
 * first pressed, kept for retries): the same key always means the same single refund. Optional so
 * older clients still work, but then only the payment lock guards against a double refund.
 */
export const adminRefundRequestSchema = adminRefundSchema.extend({
  idempotencyKey: z.uuid({ error: 'The refund attempt id is not valid; reload the page.' }).optional(),
});

/** POST /api/consultations/:id/no-show carries nothing: who and when come from the session and the clock. */
export const noShowSchema = z.strictObject({});
