import http from 'node:http';
import net from 'node:net';
import { randomUUID } from 'node:crypto';
import type { AppContext } from '@server/context';
import { createStripe } from '@server/payments/stripe-client';

/**
 * Real stand-ins for a broken network between us and Stripe (no mocks of our code): a port with
 * nothing listening (an outage), and a proxy in front of the Stripe fake that passes a charge on
 * but hangs up before its answer comes back (the charge is made, our server never hears of it).
 */
export async function closedPortUrl(): Promise<string> {
  const server = net.createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as net.AddressInfo;
  await new Promise<void>((resolve) => server.close(() => resolve()));
  return `http://127.0.0.1:${port}`;
}

/**
 * What a proxy does to one request:
 * - `refuse`: answers as Stripe does when it rejects a request before running it (400
 *   invalid_request_error): nothing is made and nothing is kept under the idempotency key;
 * - `lose-answer`: lets Stripe finish the request, then hangs up before the answer comes back;
 * - `forget-key`: passes the request on under a fresh idempotency key, as Stripe treats a key it
 *   no longer remembers (keys expire after 24 hours);
 * - `null`: passes it on unchanged.
 */
export type StripeFault = 'refuse' | 'lose-answer' | 'forget-key' | null;

/** `POST <path>` requests, e.g. isPost(req, '/v1/charges'). */
export const isPost = (req: http.IncomingMessage, path: string) => req.method === 'POST' && req.url?.split('?')[0] === path;

/**
 * A real HTTP proxy in front of the Stripe fake; `faultFor` decides, per request, what goes wrong.
 * Point the app's Stripe client at `url` with `withStripeAt`.
 */
export async function faultyStripeProxy(faultFor: (req: http.IncomingMessage) => StripeFault, options: { refusal?: string; target?: string } = {}) {
  const upstream = new URL(options.target ?? process.env.STRIPE_API_BASE!);
  const server = http.createServer((req, res) => {
    const fault = faultFor(req);
    if (fault === 'refuse') {
      req.resume();
      res.writeHead(400, { 'Content-Type': 'application/json' });
      res.end(JSON.stringify({ error: { type: 'invalid_request_error', message: options.refusal ?? 'Refused by the test proxy.' } }));
      return;
    }
    const headers = { ...req.headers };
    if (fault === 'forget-key') headers['idempotency-key'] = `${String(headers['idempotency-key'])}-forgotten-${randomUUID()}`;
    const forward = http.request({ host: upstream.hostname, port: upstream.port, method: req.method, path: req.url, headers }, (answer) => {
      if (fault === 'lose-answer') {
        answer.resume();
        answer.on('end', () => req.socket.destroy());
        return;
      }
      res.writeHead(answer.statusCode ?? 502, answer.headers);
      answer.pipe(res);
    });
    forward.on('error', () => req.socket.destroy());
    req.pipe(forward);
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as net.AddressInfo;
  return {
    url: `http://127.0.0.1:${port}`,
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}

/** Passes a charge on but hangs up before its answer comes back (the charge is made, our server never hears of it). */
export function chargeAnswerLosingProxy(target?: string) {
  return faultyStripeProxy((req) => (isPost(req, '/v1/charges') ? 'lose-answer' : null), { target });
}

/**
 * Run `work` with the app's Stripe client pointed at `apiBase` (a closed port, a lossy proxy): the
 * real SDK, only the network differs. One app per test file, so the swap is seen by that file alone.
 */
export async function withStripeAt<T>(ctx: AppContext, apiBase: string, work: () => Promise<T>): Promise<T> {
  const real = ctx.stripe;
  ctx.stripe = createStripe({ STRIPE_SECRET_KEY: process.env.STRIPE_SECRET_KEY, STRIPE_API_BASE: apiBase });
  try {
    return await work();
  } finally {
    ctx.stripe = real;
  }
}
