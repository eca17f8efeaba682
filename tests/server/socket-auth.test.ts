import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import type { Socket } from 'socket.io-client';
import type { Ack } from '@shared/http';
import { currentConsent } from '@shared/rider';
import { Message, Session } from '@server/models';
import type { SaddlestepApp } from '@server/app';
import { SESSION_RECHECK_MS, sweepSockets } from '@server/socket/session-guard';
import { browserLikeAgent, startTestApp } from '../support/app';
import { signedInAs, TEST_PASSWORD } from '../support/factories';
import { ask, listenOnFreePort, openSocket } from '../support/sockets';
import { bookedPair, socketFor } from '../support/chat-factories';

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

const closed = (socket: Socket) => new Promise<string>((resolve) => (socket.disconnected ? resolve('already') : socket.once('disconnect', resolve)));
const send = (socket: Socket, consultationId: number, body: string) => ask<Ack<unknown>>(socket, 'message:send', { consultationId, clientId: randomUUID(), body });

describe('a socket ends with its session', () => {
  it('closes the signed-out tab\'s sockets at once, refuses further sends, and leaves another device signed in', async () => {
    const { rider, consultation } = await bookedPair(saddlestep.app);
    // The same rider signed in on a second device (its own session).
    const phone = await browserLikeAgent(saddlestep.app);
    const signIn = await phone.post('/api/auth/sign-in', { email: rider.user.email, password: TEST_PASSWORD }).expect(200);
    phone.csrfToken = signIn.body.csrfToken as string;
    const laptopSocket = await socketFor(baseUrl, rider);
    const phoneSocket = await socketFor(baseUrl, phone);
    for (const s of [laptopSocket, phoneSocket]) expect(await ask(s, 'room:join', { consultationId: consultation.id })).toMatchObject({ status: 'OK' });

    const gone = closed(laptopSocket);
    await rider.post('/api/auth/sign-out').expect(204);
    await rider.get('/api/auth/me').expect(401);
    expect(await gone).toBe('io server disconnect');
    // Nothing more gets through this socket: it is closed and cannot send.
    laptopSocket.emit('message:send', { consultationId: consultation.id, clientId: randomUUID(), body: 'after sign-out' });
    await new Promise((r) => setTimeout(r, 200));
    expect(await Message.count({ where: { consultationId: consultation.id, body: 'after sign-out' } })).toBe(0);

    expect(phoneSocket.connected).toBe(true);
    expect(await send(phoneSocket, consultation.id, 'from the phone')).toMatchObject({ status: 'OK' });
    phoneSocket.close();
  });

  it('refuses the next event with a typed ERROR ack once the session was ended elsewhere, then disconnects', async () => {
    const { rider, consultation } = await bookedPair(saddlestep.app);
    const socket = await socketFor(baseUrl, rider);
    expect(await ask(socket, 'room:join', { consultationId: consultation.id })).toMatchObject({ status: 'OK' });
    // Another process (or the store's expiry) removes the session row; no hook tells this process.
    await Session.destroy({ where: { userId: rider.user.id } });
    await new Promise((r) => setTimeout(r, SESSION_RECHECK_MS + 100));
    const gone = closed(socket);
    expect(await send(socket, consultation.id, 'ghost')).toEqual({ status: 'ERROR', errors: { code: 'not_signed_in', message: 'Your session has ended. Please sign in again.' } });
    await gone;
    expect(await Message.count({ where: { consultationId: consultation.id } })).toBe(0);
  }, 15_000);

  it('closes a quiet socket on the periodic sweep when its session is gone', async () => {
    const rider = await signedInAs(saddlestep.app, 'rider');
    const socket = await socketFor(baseUrl, rider);
    await Session.destroy({ where: { userId: rider.user.id } });
    const gone = closed(socket);
    await sweepSockets(saddlestep.io);
    expect(await gone).toBe('io server disconnect');
  });

  it('closes every socket of an account an admin switches off', async () => {
    const admin = await signedInAs(saddlestep.app, 'admin');
    const fitter = await signedInAs(saddlestep.app, 'fitter');
    const socket = await socketFor(baseUrl, fitter);
    const gone = closed(socket);
    await admin.patch(`/api/admin/users/${fitter.user.id}`, { status: 'disabled' }).expect(200);
    expect(await gone).toBe('io server disconnect');
  });
});

describe('a physio whose access is withdrawn', () => {
  it('stops receiving the room\'s messages at once and cannot join again', async () => {
    const { rider, fitter, consultation } = await bookedPair(saddlestep.app);
    const physio = await signedInAs(saddlestep.app, 'physio');
    const made = await fitter.post(`/api/consultations/${consultation.id}/referrals`, { urgency: 'soon', reason: 'Knee pain for a physio to see', findings: 'Ache after an hour.', attachmentIds: [], physioId: physio.user.id }).expect(201);
    const referralId = made.body.referral.id as number;
    await rider.post(`/api/rider/referrals/${referralId}/consent`, { version: currentConsent('share-with-physio')!.version, agreed: true }).expect(200);
    await physio.post(`/api/physio/referrals/${referralId}/accept`).expect(200);

    const physioSocket = await socketFor(baseUrl, physio);
    const fitterSocket = await socketFor(baseUrl, fitter);
    for (const s of [physioSocket, fitterSocket]) expect(await ask(s, 'room:join', { consultationId: consultation.id })).toMatchObject({ status: 'OK' });
    const heard: string[] = [];
    physioSocket.on('message:created', (m: { body: string }) => heard.push(m.body));
    expect(await send(fitterSocket, consultation.id, 'before')).toMatchObject({ status: 'OK' });
    await new Promise((r) => setTimeout(r, 150));
    expect(heard).toEqual(['before']);

    const { consents } = (await rider.get('/api/rider/consents').expect(200)).body as { consents: { id: number; kind: string }[] };
    await rider.post(`/api/rider/consents/${consents.find((k) => k.kind === 'share-with-physio')!.id}/withdraw`).expect(200);
    expect(await send(fitterSocket, consultation.id, 'after')).toMatchObject({ status: 'OK' });
    await new Promise((r) => setTimeout(r, 150));
    expect(heard).toEqual(['before']);
    expect(physioSocket.connected).toBe(true);
    expect(await ask(physioSocket, 'room:join', { consultationId: consultation.id })).toMatchObject({ status: 'ERROR', errors: { code: 'not_found' } });
    expect(await send(physioSocket, consultation.id, 'still here?')).toMatchObject({ status: 'ERROR' });
    for (const s of [physioSocket, fitterSocket]) s.close();
  });
});
