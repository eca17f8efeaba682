import { io, type Socket } from 'socket.io-client';
import type { ClientToServerEvents, ServerToClientEvents } from '@shared/chat';

export type AppSocket = Socket<ServerToClientEvents, ClientToServerEvents>;

/**
 * The app's one socket.io connection, same origin, carrying the session cookie. It opens after
 * sign-in and closes on sign-out; its listeners are bound once by the chat store
 * (`useChatStore().followSession`), never by components.
 */
export const socket: AppSocket = io({ autoConnect: false, withCredentials: true });

/** How long an acknowledgement may take before the request counts as lost (and may be sent again). */
export const ACK_TIMEOUT_MS = 10_000;

export type AckResult<T> = { status: 'OK'; data: T } | { status: 'ERROR'; errors: { code: string; message: string } };

/**
 * One request with an acknowledgement, always resolving to the shared ack shape: a timeout and a
 * closed connection become ERROR acks with the codes `timeout` and `disconnected`, so callers
 * decide in one place what may be sent again.
 */
export function withAck<T>(send: (done: (err: Error | null, result: AckResult<T>) => void) => void): Promise<AckResult<T>> {
  return new Promise((resolve) => {
    if (!socket.connected) {
      resolve({ status: 'ERROR', errors: { code: 'disconnected', message: 'You are offline; it will go as soon as the connection is back.' } });
      return;
    }
    send((err, result) => {
      if (err) resolve({ status: 'ERROR', errors: { code: 'timeout', message: 'No answer from the server yet; trying again.' } });
      else resolve(result);
    });
  });
}
