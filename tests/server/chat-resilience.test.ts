import { describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import type { Ack } from '@shared/http';
import type { ChatMessage } from '@shared/chat';
import { Message } from '@server/models';
import { consultationRoom } from '@server/socket/rooms';
import { ask } from '../support/sockets';
import { chatSuite, join, ok } from '../support/chat-suite';
import { bookedPair } from '../support/chat-factories';

const suite = chatSuite();
const connect = suite.connect;

describe('a transport dropped mid-send', () => {
  it('loses nothing and doubles nothing after the server drops the room mid-send and the client reconnects and resends', async () => {
    const { rider, fitter, consultation } = await bookedPair(suite.saddlestep.app);
    const riderSocket = await connect(rider);
    const fitterSocket = await connect(fitter);
    ok(await join(riderSocket, consultation.id));
    ok(await join(fitterSocket, consultation.id));
    const seenByFitter = new Map<number, string>();
    fitterSocket.on('message:created', (m: ChatMessage) => seenByFitter.set(m.seq, m.body));

    // Ten sends in flight at once; the server drops every socket in the room while they travel.
    const outbox = Array.from({ length: 10 }, (_, i) => ({ clientId: randomUUID(), body: `m${i}` }));
    const acked = new Set<string>();
    const inFlight = outbox.map((m) => ask<Ack<ChatMessage>>(riderSocket, 'message:send', { consultationId: consultation.id, ...m }, 2000).then((a) => a.status === 'OK' && acked.add(m.clientId), () => false));
    suite.saddlestep.io.in(consultationRoom(consultation.id)).disconnectSockets(true);
    await Promise.all(inFlight);
    expect(riderSocket.connected).toBe(false);

    // Both come back: the fitter resumes after the last seq seen, the rider resends every message it has no ack for, in order, with the same ids.
    const riderAgain = await connect(rider);
    ok(await join(riderAgain, consultation.id));
    for (const m of outbox.filter((x) => !acked.has(x.clientId))) ok(await ask<Ack<ChatMessage>>(riderAgain, 'message:send', { consultationId: consultation.id, ...m }));
    // A resend of something already acked is harmless too.
    for (const m of outbox.filter((x) => acked.has(x.clientId))) ok(await ask<Ack<ChatMessage>>(riderAgain, 'message:send', { consultationId: consultation.id, ...m }));
    const fitterAgain = await connect(fitter);
    const catchUp = ok(await join(fitterAgain, consultation.id, Math.max(0, ...seenByFitter.keys())));
    catchUp.messages.forEach((m) => seenByFitter.set(m.seq, m.body));

    const stored = await Message.findAll({ where: { consultationId: consultation.id }, order: [['seq', 'ASC']] });
    expect(stored.map((m) => m.clientId).sort()).toEqual(outbox.map((m) => m.clientId).sort());
    expect(stored.map((m) => m.seq)).toEqual(Array.from({ length: 10 }, (_, i) => i + 1));
    expect([...seenByFitter.keys()].sort((a, b) => a - b)).toEqual(stored.map((m) => m.seq));
  });

  it('resends after the client\'s own transport closes under a pending send', async () => {
    const { rider, consultation } = await bookedPair(suite.saddlestep.app);
    const socket = await connect(rider);
    ok(await join(socket, consultation.id));
    const clientId = randomUUID();
    const lost = ask<Ack<ChatMessage>>(socket, 'message:send', { consultationId: consultation.id, clientId, body: 'maybe lost' }, 1000).catch(() => null);
    socket.io.engine.close();
    await lost;
    const again = await connect(rider);
    ok(await join(again, consultation.id));
    const first = ok(await ask<Ack<ChatMessage>>(again, 'message:send', { consultationId: consultation.id, clientId, body: 'maybe lost' }));
    const second = ok(await ask<Ack<ChatMessage>>(again, 'message:send', { consultationId: consultation.id, clientId, body: 'maybe lost' }));
    expect(second.id).toBe(first.id);
    expect(await Message.count({ where: { consultationId: consultation.id } })).toBe(1);
  });
});

describe('malformed payloads on every event', () => {
  const shapes = (consultationId: number): Record<string, unknown[]> => ({
    'room:join': [null, 'x', 7, [], {}, { consultationId: 'one' }, { consultationId: -1 }, { consultationId, afterSeq: -3 }, { consultationId, afterSeq: 1.5 }, { consultationId, extra: 1 }],
    'room:leave': [null, 'x', [], {}, { consultationId: '1' }, { consultationId: 0 }, { consultationId, extra: true }],
    'message:history': [null, {}, { consultationId }, { consultationId, beforeSeq: 'ten' }, { consultationId, beforeSeq: 5, limit: 0 }, { consultationId, beforeSeq: 5, limit: 101 }, { consultationId, beforeSeq: 5, extra: 1 }],
    'message:delivered': [null, {}, { consultationId }, { consultationId, seq: -1 }, { consultationId, seq: 'last' }, { consultationId, seq: 1, extra: 1 }],
    'message:read': [null, {}, { consultationId }, { consultationId, seq: 2 ** 40 }, { consultationId, seq: [1] }, { consultationId, seq: 1, extra: 1 }],
    'typing:set': [null, {}, { consultationId }, { consultationId, typing: 'yes' }, { consultationId, typing: true, extra: 1 }],
    'unread:list': [null, 'x', 5, [], { consultationId }],
    'message:send': [null, {}, { consultationId, clientId: 'nope', body: 'x' }, { consultationId, clientId: randomUUID(), body: '' }],
  });

  it('answers each with a typed validation ERROR ack and keeps the socket up', async () => {
    const { rider, consultation } = await bookedPair(suite.saddlestep.app);
    const socket = await connect(rider);
    ok(await join(socket, consultation.id));
    for (const [event, payloads] of Object.entries(shapes(consultation.id))) {
      for (const payload of payloads) {
        const ack = await ask<Ack<unknown>>(socket, event, payload);
        expect(ack, `${event} ${JSON.stringify(payload)}`).toMatchObject({ status: 'ERROR', errors: { code: 'validation_failed', message: expect.any(String) } });
      }
    }
    expect(socket.connected).toBe(true);
    // Still fully working afterwards.
    expect(ok(await join(socket, consultation.id)).lastSeq).toBe(0);
    expect(ok(await ask<Ack<null>>(socket, 'typing:set', { consultationId: consultation.id, typing: false }))).toBeNull();
    expect(ok(await ask<Ack<null>>(socket, 'room:leave', { consultationId: consultation.id }))).toBeNull();
  });

  it('answers typing for a room the socket has not joined with not_found', async () => {
    const { rider, consultation } = await bookedPair(suite.saddlestep.app);
    const socket = await connect(rider);
    expect(await ask(socket, 'typing:set', { consultationId: consultation.id, typing: true })).toMatchObject({ status: 'ERROR', errors: { code: 'not_found' } });
  });

  it('survives an event with no acknowledgement callback', async () => {
    const { rider, consultation } = await bookedPair(suite.saddlestep.app);
    const socket = await connect(rider);
    socket.emit('room:join', { nonsense: true });
    socket.emit('message:read');
    ok(await join(socket, consultation.id));
    expect(socket.connected).toBe(true);
  });
});

describe('attachments', () => {
  it('refuses an attachment sent by the fitter (only the rider adds photos and clips)', async () => {
    const { fitter, consultation } = await bookedPair(suite.saddlestep.app);
    const socket = await connect(fitter);
    ok(await join(socket, consultation.id));
    const ack = await ask<Ack<unknown>>(socket, 'message:send', { consultationId: consultation.id, clientId: randomUUID(), body: 'see this', attachmentId: 1 });
    expect(ack).toMatchObject({ status: 'ERROR', errors: { code: 'validation_failed', message: 'Only the rider adds photos and clips to the chat.' } });
  });
});
