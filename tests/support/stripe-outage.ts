import http from 'node:http';
import net from 'node:net';
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

export async function chargeAnswerLosingProxy(target = process.env.STRIPE_API_BASE!): Promise<{ url: string; close: () => Promise<void> }> {
  const upstream = new URL(target);
  const server = http.createServer((req, res) => {
    const forward = http.request({ host: upstream.hostname, port: upstream.port, method: req.method, path: req.url, headers: req.headers }, (answer) => {
      if (req.method === 'POST' && req.url?.split('?')[0] === '/v1/charges') {
        // Let Stripe finish the charge, then drop the connection instead of answering.
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
    close: () => new Promise<void>((resolve) => {
      server.closeAllConnections();
      server.close(() => resolve());
    }),
  };
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
