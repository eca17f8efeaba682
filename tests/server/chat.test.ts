import { describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import type { Ack } from '@shared/http';
import type { ChatMessage } from '@shared/chat';
import { Message, ScheduledJob } from '@server/models';
import { createAppScheduler } from '@server/scheduler/app-scheduler';
import { signedInAs } from '../support/factories';
import { ask } from '../support/sockets';
import { chatSuite, join, ok, send } from '../support/chat-suite';
import { bookedPair } from '../support/chat-factories';
import { waitForMails } from '../support/mail';

const suite = chatSuite({ CHAT_BURST: '10', CHAT_PER_SECOND: '1' });
const connect = suite.connect;



describe('joining and sending', () => {
  it('refuses an unrelated rider and a fitter who is not assigned', async () => {
    const { consultation } = await bookedPair(suite.saddlestep.app);
    for (const role of ['rider', 'fitter', 'physio', 'admin'] as const) {
      const stranger = await connect(await signedInAs(suite.saddlestep.app, role));
      const ack = await join(stranger, consultation.id);
      expect(ack).toEqual({ status: 'ERROR', errors: { code: 'not_found', message: 'That consultation was not found.' } });
      const sent = await send(stranger, consultation.id, 'hello');
      expect(sent.status).toBe('ERROR');
    }
    expect(await Message.count({ where: { consultationId: consultation.id } })).toBe(0);
  });

  it('refuses a consultation that is only held, not paid', async () => {
    const { rider, consultation } = await bookedPair(suite.saddlestep.app, 'requested');
    expect((await join(await connect(rider), consultation.id)).status).toBe('ERROR');
  });

  it('stores the message before it acknowledges it, and the other side receives it', async () => {
    const { rider, fitter, consultation } = await bookedPair(suite.saddlestep.app);
    const riderSocket = await connect(rider);
    const fitterSocket = await connect(fitter);
    ok(await join(riderSocket, consultation.id));
    ok(await join(fitterSocket, consultation.id));
    const received = new Promise<ChatMessage>((resolve) => fitterSocket.once('message:created', resolve));
    const message = ok(await send(riderSocket, consultation.id, 'My left knee aches after an hour.'));
    // The row exists the moment the ack arrives.
    const row = await Message.findOne({ where: { consultationId: consultation.id, clientId: message.clientId } });
    expect(row?.seq).toBe(message.seq);
    expect((await received).id).toBe(message.id);
  });

  it('keeps an HTML payload as plain text', async () => {
    const { rider, consultation } = await bookedPair(suite.saddlestep.app);
    const socket = await connect(rider);
    ok(await join(socket, consultation.id));
    const body = '<img src=x onerror="alert(1)">';
    expect(ok(await send(socket, consultation.id, body)).body).toBe(body);
  });
});

describe('nothing lost, nothing doubled', () => {
  it('does not store a resent client id twice, even when both sends race', async () => {
    const { rider, consultation } = await bookedPair(suite.saddlestep.app);
    const socket = await connect(rider);
    ok(await join(socket, consultation.id));
    const clientId = randomUUID();
    const [a, b] = await Promise.all([send(socket, consultation.id, 'once', clientId), send(socket, consultation.id, 'once', clientId)]);
    expect(ok(a).id).toBe(ok(b).id);
    expect(await Message.count({ where: { consultationId: consultation.id } })).toBe(1);
  });

  it('catches up after a forced disconnect mid-send without losing or doubling anything', async () => {
    const { rider, fitter, consultation } = await bookedPair(suite.saddlestep.app);
    const fitterSocket = await connect(fitter);
    const seen = new Map<number, ChatMessage>();
    const first = ok(await join(fitterSocket, consultation.id));
    first.messages.forEach((m) => seen.set(m.seq, m));
    fitterSocket.on('message:created', (m: ChatMessage) => seen.set(m.seq, m));

    const riderSocket = await connect(rider);
    ok(await join(riderSocket, consultation.id));
    ok(await send(riderSocket, consultation.id, 'one'));
    const lastSeenByFitter = Math.max(0, ...seen.keys());

    // The fitter drops off; the rider keeps writing; the rider's own socket dies mid-send.
    fitterSocket.disconnect();
    ok(await send(riderSocket, consultation.id, 'two'));
    const pendingId = randomUUID();
    riderSocket.emit('message:send', { consultationId: consultation.id, clientId: pendingId, body: 'three' });
    riderSocket.disconnect();

    // The rider reconnects and resends what had no ack; the fitter reconnects and resumes.
    const riderAgain = await connect(rider);
    ok(await join(riderAgain, consultation.id));
    const resent = ok(await send(riderAgain, consultation.id, 'three', pendingId));
    const fitterAgain = await connect(fitter);
    const catchUp = ok(await join(fitterAgain, consultation.id, lastSeenByFitter));
    catchUp.messages.forEach((m) => seen.set(m.seq, m));

    const bodies = [...seen.values()].sort((x, y) => x.seq - y.seq).map((m) => m.body);
    expect(bodies).toEqual(['one', 'two', 'three']);
    expect(resent.body).toBe('three');
    expect(await Message.count({ where: { consultationId: consultation.id } })).toBe(3);
  });
});

describe('ordering', () => {
  it('gives gap-free sequence numbers and the same order to everyone with three senders at once', async () => {
    const { rider, fitter, consultation } = await bookedPair(suite.saddlestep.app);
    const senders = [await connect(rider), await connect(rider), await connect(fitter)];
    for (const s of senders) ok(await join(s, consultation.id));
    const received: number[][] = senders.map(() => []);
    senders.forEach((s, i) => s.on('message:created', (m: ChatMessage) => received[i]!.push(m.seq)));
    // Each sender writes in order, waiting for its own acks; the senders overlap one another.
    const perSender = 3;
    const acks = await Promise.all(
      senders.map(async (s, i) => {
        const seqs: number[] = [];
        for (let n = 0; n < perSender; n += 1) seqs.push(ok(await send(s, consultation.id, `s${i}-${n}`)).seq);
        return seqs;
      }),
    );
    for (const seqs of acks) expect([...seqs].sort((a, b) => a - b)).toEqual(seqs);
    const all = acks.flat().sort((a, b) => a - b);
    expect(all).toEqual(Array.from({ length: senders.length * perSender }, (_, i) => i + 1));
    await new Promise((r) => setTimeout(r, 200));
    // Broadcasts arrive in sequence order at every socket.
    for (const seqs of received) expect([...seqs].sort((a, b) => a - b)).toEqual(seqs);
  });
});

describe('limits and bad payloads', () => {
  it('rate-limits a flood and keeps the socket up', async () => {
    const { rider, consultation } = await bookedPair(suite.saddlestep.app);
    const socket = await connect(rider);
    ok(await join(socket, consultation.id));
    const acks = await Promise.all(Array.from({ length: 14 }, (_, i) => send(socket, consultation.id, `flood ${i}`)));
    const limited = acks.filter((a) => a.status === 'ERROR');
    expect(limited.length).toBeGreaterThanOrEqual(3);
    expect(limited[0]).toMatchObject({ errors: { code: 'rate_limited' } });
    expect(socket.connected).toBe(true);
  });

  it('answers malformed payloads with an ERROR ack and stays connected', async () => {
    const { rider, consultation } = await bookedPair(suite.saddlestep.app);
    const socket = await connect(rider);
    ok(await join(socket, consultation.id));
    const bad: unknown[] = [
      null,
      'a string',
      42,
      [],
      {},
      { consultationId: consultation.id, body: 'no client id' },
      { consultationId: consultation.id, clientId: 'not-a-uuid', body: 'x' },
      { consultationId: consultation.id, clientId: randomUUID(), body: 'x'.repeat(4001) },
      { consultationId: consultation.id, clientId: randomUUID(), body: 'bell\u0007' },
      { consultationId: consultation.id, clientId: randomUUID(), body: '   ' },
      { consultationId: 'one; DROP TABLE messages', clientId: randomUUID(), body: 'x' },
      { consultationId: consultation.id, clientId: randomUUID(), body: 'x', extra: true },
    ];
    for (const payload of bad) {
      const ack = await ask<Ack<unknown>>(socket, 'message:send', payload);
      expect(ack.status).toBe('ERROR');
      if (ack.status === 'ERROR') expect(ack.errors.message).toEqual(expect.any(String));
    }
    expect(socket.connected).toBe(true);
    expect(await Message.count({ where: { consultationId: consultation.id } })).toBe(0);
    expect(ok(await send(socket, consultation.id, 'still here')).seq).toBe(1);
  });

  it('refuses a send to a room the socket has not joined', async () => {
    const { rider, consultation } = await bookedPair(suite.saddlestep.app);
    const ack = await send(await connect(rider), consultation.id, 'sneaky');
    expect(ack.status).toBe('ERROR');
  });
});

describe('states, typing, presence and history', () => {
  it('moves messages from sent to delivered to read', async () => {
    const { rider, fitter, consultation } = await bookedPair(suite.saddlestep.app);
    const riderSocket = await connect(rider);
    const fitterSocket = await connect(fitter);
    ok(await join(riderSocket, consultation.id));
    ok(await join(fitterSocket, consultation.id));
    const message = ok(await send(riderSocket, consultation.id, 'hello'));
    const updates: { userId: number; deliveredSeq: number; readSeq: number }[] = [];
    riderSocket.on('receipt:updated', (u) => updates.push(u));
    ok(await ask<Ack<unknown>>(fitterSocket, 'message:delivered', { consultationId: consultation.id, seq: message.seq }));
    ok(await ask<Ack<unknown>>(fitterSocket, 'message:read', { consultationId: consultation.id, seq: 999 }));
    await new Promise((r) => setTimeout(r, 100));
    expect(updates.filter((u) => u.userId === fitter.user.id)).toEqual([
      { consultationId: consultation.id, userId: fitter.user.id, deliveredSeq: 1, readSeq: 0 },
      // A read past the end is clamped to the last message.
      { consultationId: consultation.id, userId: fitter.user.id, deliveredSeq: 1, readSeq: 1 },
    ]);
  });

  it('shows presence and a typing indicator that switches itself off', async () => {
    const { rider, fitter, consultation } = await bookedPair(suite.saddlestep.app);
    const riderSocket = await connect(rider);
    ok(await join(riderSocket, consultation.id));
    const presence = new Promise<{ online: number[] }>((resolve) => riderSocket.on('presence:changed', (p) => p.online.length === 2 && resolve(p)));
    const fitterSocket = await connect(fitter);
    const state = ok(await join(fitterSocket, consultation.id));
    expect(state.online.sort()).toEqual([rider.user.id, fitter.user.id].sort());
    expect((await presence).online).toContain(fitter.user.id);

    const typing: boolean[] = [];
    riderSocket.on('typing:changed', (t) => typing.push(t.typing));
    fitterSocket.emit('typing:set', { consultationId: consultation.id, typing: true });
    await new Promise((r) => setTimeout(r, 6500));
    expect(typing).toEqual([true, false]);
  }, 15_000);

  it('pages back through history', async () => {
    const { rider, consultation } = await bookedPair(suite.saddlestep.app);
    const socket = await connect(rider);
    ok(await join(socket, consultation.id));
    for (let i = 1; i <= 7; i += 1) ok(await send(socket, consultation.id, `m${i}`));
    const page = ok(await ask<Ack<{ messages: ChatMessage[]; hasMore: boolean }>>(socket, 'message:history', { consultationId: consultation.id, beforeSeq: 6, limit: 3 }));
    expect(page.messages.map((m) => m.body)).toEqual(['m3', 'm4', 'm5']);
    expect(page.hasMore).toBe(true);
  });
});

describe('offline notice by e-mail', () => {
  it('mails an offline fitter once per batch, with no message text', async () => {
    const { rider, fitter, consultation } = await bookedPair(suite.saddlestep.app);
    const socket = await connect(rider);
    ok(await join(socket, consultation.id));
    for (const body of ['my knee hurts', 'second', 'third']) ok(await send(socket, consultation.id, body));
    const jobs = await ScheduledJob.findAll({ where: { kind: 'chat-notice' } });
    const mine = jobs.filter((j) => (j.payload as { consultationId: number }).consultationId === consultation.id);
    expect(mine).toHaveLength(1);
    await ScheduledJob.update({ runAt: new Date(Date.now() - 1000) }, { where: { id: mine[0]!.id } });
    await createAppScheduler(suite.saddlestep.ctx).tick();
    const mails = await waitForMails(fitter.user.email, { subject: /New messages/ });
    expect(mails).toHaveLength(1);
    expect(`${mails[0]!.text} ${mails[0]!.html}`).not.toMatch(/knee|second|third/);
  });
});
