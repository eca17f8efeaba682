import type { Server, Socket } from 'socket.io';
import type { ClientToServerEvents, ServerToClientEvents } from '@shared/chat';
import type { AppContext } from '../context';
import type { SendLimiter } from './rate-limit';

export interface SocketData {
  userId: number;
  role: string;
  displayName: string;
  /** The express-session id the handshake carried; re-checked while the socket is open. */
  sessionId: string;
  /** When the session was last found valid (ms since epoch), so events re-check it cheaply. */
  sessionCheckedAt: number;
}

export type AppServer = Server<ClientToServerEvents, ServerToClientEvents, Record<string, never>, SocketData>;
export type AppSocket = Socket<ClientToServerEvents, ServerToClientEvents, Record<string, never>, SocketData>;

/** What every event handler factory receives. */
export interface HandlerDeps {
  io: AppServer;
  socket: AppSocket;
  ctx: AppContext;
  sendLimiter: SendLimiter;
}
