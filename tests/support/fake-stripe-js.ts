import type { BrowserContext } from 'playwright-core';

/*
 * A stand-in for Stripe.js (https://js.stripe.com), which this machine cannot reach. Like the
 * Stripe API fake, it stands for a hosted service, not for our code: it offers the small part of
 * Stripe.js's published interface the checkout uses (`Stripe(key)`, `elements().create('card')`,
 * `mount`, `on('change')`, `update`, `destroy`, `createToken`) and turns the card numbers Stripe
 * documents for testing into the test tokens the local Stripe fake charges or declines.
 */
const FAKE_STRIPE_JS = `
(() => {
  const TOKENS = { '4242424242424242': 'tok_visa', '5555555555554444': 'tok_mastercard', '4000000000000002': 'tok_chargeDeclined' };
  const digits = (input) => (input ? input.value.replace(/\\s/g, '') : '');
  function Stripe(publishableKey) {
    if (!/^pk_test_/.test(publishableKey)) throw new Error('fake Stripe.js takes test keys only');
    window.__fakeStripeKeys = [...(window.__fakeStripeKeys || []), publishableKey];
    let input = null;
    const listeners = [];
    const card = {
      mount(target) {
        const host = typeof target === 'string' ? document.querySelector(target) : target;
        input = document.createElement('input');
        input.setAttribute('data-test', 'fake-card-number');
        input.setAttribute('aria-label', 'Card number');
        input.addEventListener('input', () => {
          const n = digits(input);
          const error = n.length > 16 ? { type: 'validation_error', message: 'Your card number is invalid.' } : undefined;
          for (const cb of listeners) cb({ elementType: 'card', empty: n.length === 0, complete: n.length === 16, error });
        });
        host.appendChild(input);
      },
      on(name, cb) { if (name === 'change') listeners.push(cb); return card; },
      update(options) { if (input && 'disabled' in options) input.disabled = Boolean(options.disabled); },
      destroy() { if (input) input.remove(); input = null; },
    };
    return {
      elements: () => ({ create(type) { if (type !== 'card') throw new Error('fake Stripe.js has only the card field'); return card; } }),
      async createToken() {
        const n = digits(input);
        if (n === '4000000000000069') return { error: { type: 'card_error', code: 'expired_card', message: 'Your card has expired.' } };
        const id = TOKENS[n];
        return id ? { token: { id, object: 'token' } } : { error: { type: 'validation_error', message: 'Your card number is invalid.' } };
      },
    };
  }
  Stripe.version = 'endive';
  window.Stripe = Stripe;
})();
`;

/** Serve the fake for every Stripe.js address in this browser context; `unreachable` fails it. */
export async function routeFakeStripeJs(context: BrowserContext, options: { unreachable?: boolean } = {}): Promise<void> {
  await context.unroute('https://js.stripe.com/**');
  await context.route('https://js.stripe.com/**', (route) =>
    options.unreachable ? route.abort('internetdisconnected') : route.fulfill({ status: 200, contentType: 'application/javascript', body: FAKE_STRIPE_JS }),
  );
}
