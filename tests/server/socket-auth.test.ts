import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SaddlestepApp } from '@server/app';
import { startTestApp } from '../support/app';
import { signedInAs } from '../support/factories';
import { listenOnFreePort, openSocket } from '../support/sockets';

let saddlestep: SaddlestepApp;
let baseUrl: string;
beforeAll(async () => {
  saddlestep = await startTestApp();
  baseUrl = await listenOnFreePort(saddlestep);
});
afterAll(async () => {
  await saddlestep.close();
});

function cookieHeader(setCookie: string[] | string | undefined): string {
  return ([] as string[]).concat(setCookie ?? []).map((c) => c.split(';')[0]).join('; ');
}

describe('socket.io sign-in', () => {
  it('refuses an anonymous socket with a 401-style error', async () => {
    const { socket, error } = await openSocket(baseUrl);
    expect(error?.message).toBe('not_signed_in');
    expect(error?.data).toMatchObject({ status: 401 });
    socket.close();
  });

  it('refuses a socket with a forged session cookie', async () => {
    const { socket, error } = await openSocket(baseUrl, 'saddlestep.sid=s%3Aforged.signature');
    expect(error?.message).toBe('not_signed_in');
    socket.close();
  });

  it('accepts a socket carrying a signed-in session', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const res = await rider.get('/api/auth/me').expect(200);
    const { socket, error } = await openSocket(baseUrl, cookieHeader(res.headers['set-cookie']));
    expect(error).toBeUndefined();
    expect(socket.connected).toBe(true);
    socket.close();
  });
});
