import http from 'node:http';
import net from 'node:net';
import { randomUUID } from 'node:crypto';

/**
 * What the proxy does to refund requests (POST /v1/refunds); everything else passes unchanged:
 * - `refuse`: answers as Stripe does when it rejects a request before running it (400
 *   invalid_request_error): nothing is refunded and nothing is kept under the idempotency key;
 * - `lose-answer`: lets Stripe make the refund, then hangs up before the answer comes back;
 * - `forget-key`: passes the request on under a fresh idempotency key, as Stripe treats a key it
 *   no longer remembers (keys expire after 24 hours).
 */
export type RefundFault = 'refuse' | 'lose-answer' | 'forget-key';

export const REFUSAL_MESSAGE = 'This charge cannot be refunded at the moment.';

/**
 * A real HTTP proxy in front of the Stripe fake (no mocks of our code): point the app's Stripe
 * client at `url` with `withStripeAt`. `fault` may be changed while it runs.
 */
export async function refundProxy(fault: RefundFault, target = process.env.STRIPE_API_BASE!) {
  const upstream = new URL(target);
  const state = { fault };
  const server = http.createServer((req, res) => {
    const isRefund = req.method === 'POST' && req.url?.split('?')[0] === '/v1/refunds';
    if (isRefund && state.fault === 'refuse') {
      req.resume();
      res.writeHead(400, { 'Content-Type': 'application/json' });
      res.end(JSON.stringify({ error: { type: 'invalid_request_error', message: REFUSAL_MESSAGE } }));
      return;
    }
    const headers = { ...req.headers };
    if (isRefund && state.fault === 'forget-key') headers['idempotency-key'] = `${String(headers['idempotency-key'])}-forgotten-${randomUUID()}`;
    const forward = http.request({ host: upstream.hostname, port: upstream.port, method: req.method, path: req.url, headers }, (answer) => {
      if (isRefund && state.fault === 'lose-answer') {
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
    set(next: RefundFault) {
      state.fault = next;
    },
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}
