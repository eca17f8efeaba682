import type { AddressInfo } from 'node:net';
import { io as connect, type Socket } from 'socket.io-client';
import type { SaddlestepApp } from '@server/app';

/** Listen on a free loopback port (once) and return the base URL, for socket.io clients. */
export async function listenOnFreePort(saddlestep: SaddlestepApp): Promise<string> {
  if (!saddlestep.httpServer.listening) {
    await new Promise<void>((resolve) => saddlestep.httpServer.listen(0, '127.0.0.1', () => resolve()));
  }
  const { port } = saddlestep.httpServer.address() as AddressInfo;
  return `http://127.0.0.1:${port}`;
}

/** Connect with a browser's cookie header (or none), resolving on connect or connect_error. */
export function openSocket(baseUrl: string, cookie?: string): Promise<{ socket: Socket; error?: Error & { data?: unknown } }> {
  const socket = connect(baseUrl, {
    transports: ['websocket'],
    reconnection: false,
    forceNew: true,
    extraHeaders: cookie ? { Cookie: cookie } : {},
  });
  return new Promise((resolve) => {
    socket.once('connect', () => resolve({ socket }));
    socket.once('connect_error', (error) => resolve({ socket, error: error as Error & { data?: unknown } }));
  });
}

/** The session cookie of a signed-in supertest agent, as a Cookie header for socket.io. */
export async function cookieOf(client: { get: (url: string) => import('supertest').Test }): Promise<string> {
  const res = await client.get('/api/auth/me');
  return ([] as string[]).concat(res.headers['set-cookie'] ?? []).map((c) => c.split(';')[0]).join('; ');
}

/** emit with an acknowledgement, failing after a timeout instead of hanging the test. */
export function ask<T = unknown>(socket: Socket, event: string, payload: unknown, timeoutMs = 5000): Promise<T> {
  return socket.timeout(timeoutMs).emitWithAck(event, payload) as Promise<T>;
}
