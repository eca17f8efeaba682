import { faultyStripeProxy, isPost, type StripeFault } from './stripe-outage';

/** What the proxy does to refund requests (POST /v1/refunds); everything else passes unchanged. */
export type RefundFault = Exclude<StripeFault, null>;

export const REFUSAL_MESSAGE = 'This charge cannot be refunded at the moment.';

/**
 * A real HTTP proxy in front of the Stripe fake (no mocks of our code) that troubles refunds only:
 * point the app's Stripe client at `url` with `withStripeAt`. `set` changes the fault while it runs.
 */
export async function refundProxy(fault: RefundFault) {
  const state = { fault };
  const proxy = await faultyStripeProxy((req) => (isPost(req, '/v1/refunds') ? state.fault : null), { refusal: REFUSAL_MESSAGE });
  return {
    ...proxy,
    set(next: RefundFault) {
      state.fault = next;
    },
  };
}
