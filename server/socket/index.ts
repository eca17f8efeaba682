import type { Server as HttpServer, IncomingMessage, ServerResponse } from 'node:http';
import { Server } from 'socket.io';
import type { RequestHandler } from 'express';
import type { AppPassport } from '../auth/passport';
import type { AppContext } from '../context';
import { sessionRoom, userRoom } from './rooms';
import { guardEvents, startSocketSweep } from './session-guard';
import { createSendLimiter } from './rate-limit';
import { registerHandlers } from './handlers';
import type { AppServer } from './types';

interface SocketDeps {
  sessionMiddleware: RequestHandler;
  passport: AppPassport;
  ctx: AppContext;
}

type EngineMiddleware = (req: IncomingMessage & { _query?: Record<string, string> }, res: ServerResponse, next: (error?: unknown) => void) => void;

/** Run an Express middleware only on the handshake request, not on every polling request. */
function onlyForHandshake(middleware: RequestHandler): EngineMiddleware {
  return (req, res, next) => {
    const isHandshake = req._query?.sid === undefined;
    if (!isHandshake) return next();
    (middleware as unknown as EngineMiddleware)(req, res, next);
  };
}

/**
 * socket.io on the app's own HTTP server, sharing the signed-in session. Anonymous sockets are
 * refused before any event handler runs; the session is re-checked on events and by a periodic
 * sweep (session-guard.ts), and services close sockets when access ends (evict.ts). Each user joins
 * a private room for personal notices, and consultation rooms on `room:join` after the membership check.
 */
export function createSocketServer(httpServer: HttpServer, { sessionMiddleware, passport, ctx }: SocketDeps): AppServer {
  const io: AppServer = new Server(httpServer, {
    serveClient: false,
    // Chat messages are small; anything larger is refused before it is parsed.
    maxHttpBufferSize: 64 * 1024,
  });
  const sendLimiter = createSendLimiter({ capacity: ctx.config.CHAT_BURST, perSecond: ctx.config.CHAT_PER_SECOND });

  io.engine.use(onlyForHandshake(sessionMiddleware));
  io.engine.use(onlyForHandshake(passport.initialize() as unknown as RequestHandler));
  io.engine.use(onlyForHandshake(passport.session() as unknown as RequestHandler));

  io.use((socket, next) => {
    const user = (socket.request as IncomingMessage & { user?: Express.User }).user;
    if (!user || user.status !== 'active') {
      const error = new Error('not_signed_in') as Error & { data?: unknown };
      error.data = { status: 401, message: 'Please sign in to continue.' };
      return next(error);
    }
    socket.data.userId = user.id;
    socket.data.role = user.role;
    socket.data.displayName = user.displayName;
    // Kept so that signing this session out closes exactly its sockets, and so events can re-check it.
    socket.data.sessionId = (socket.request as IncomingMessage & { sessionID: string }).sessionID;
    socket.data.sessionCheckedAt = Date.now();
    next();
  });

  io.on('connection', (socket) => {
    void socket.join([userRoom(socket.data.userId), sessionRoom(socket.data.sessionId)]);
    guardEvents(socket, ctx.logger);
    registerHandlers({ io, socket, ctx, sendLimiter });
  });
  startSocketSweep(io, ctx);

  return io;
}
