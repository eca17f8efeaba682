import { afterAll, afterEach, beforeAll } from 'vitest';
import { randomUUID } from 'node:crypto';
import type { Socket } from 'socket.io-client';
import type { Ack } from '@shared/http';
import type { ChatMessage, RoomState } from '@shared/chat';
import type { SaddlestepApp } from '@server/app';
import { startTestApp } from './app';
import { ask, listenOnFreePort } from './sockets';
import { socketFor } from './chat-factories';

/**
 * A socket test file's app: started on a free port before the file, sockets closed after each
 * test, the app closed after the file. `env` overrides settings (e.g. a tight chat rate limit).
 */
export function chatSuite(env: Record<string, string> = {}) {
  let saddlestep: SaddlestepApp | undefined;
  let baseUrl = '';
  const open: Socket[] = [];
  beforeAll(async () => {
    saddlestep = await startTestApp(env);
    baseUrl = await listenOnFreePort(saddlestep);
  });
  afterEach(() => {
    for (const s of open.splice(0)) s.close();
  });
  afterAll(async () => {
    await saddlestep?.close();
  });
  return {
    get saddlestep(): SaddlestepApp {
      if (!saddlestep) throw new Error('the chat suite app starts in beforeAll');
      return saddlestep;
    },
    get baseUrl() {
      return baseUrl;
    },
    /** A socket signed in as this client, closed after the test. */
    async connect(client: Parameters<typeof socketFor>[1]) {
      const socket = await socketFor(baseUrl, client);
      open.push(socket);
      return socket;
    },
  };
}

/** The data of an OK ack; anything else fails the test with the ack shown. */
export function ok<T>(ack: Ack<T>): T {
  if (ack.status !== 'OK') throw new Error(`expected OK, got ${JSON.stringify(ack)}`);
  return ack.data;
}

export const join = (socket: Socket, consultationId: number, afterSeq = 0) => ask<Ack<RoomState>>(socket, 'room:join', { consultationId, afterSeq });

export const send = (socket: Socket, consultationId: number, body: string, clientId: string = randomUUID()) =>
  ask<Ack<ChatMessage>>(socket, 'message:send', { consultationId, clientId, body });
