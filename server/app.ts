import { createServer, type Server as HttpServer } from 'node:http';
import path from 'node:path';
import fs from 'node:fs';
import express, { type RequestHandler } from 'express';
import session from 'express-session';
import connectSessionSequelize from 'connect-session-sequelize';
import { pinoHttp } from 'pino-http';
import type { Sequelize } from 'sequelize';
import type { Config } from './config';
import { createLogger, type Logger } from './logger';
import { createSequelize } from './db';
import { initModels } from './models';
import { createPassport } from './auth/passport';
import { createPasswordHasher } from './services/passwords';
import { createAuthController } from './controllers/auth';
import { createApiRouter } from './routes';
import { authRateLimit, createCsrf, securityHeaders } from './middleware/security';
import { createErrorHandler } from './middleware/error-handler';
import { createSocketServer } from './socket';
import { createMailer } from './mail/mailer';
import { createStripe } from './payments/stripe-client';
import type { AppContext } from './context';
import type { AppServer } from './socket/types';
import { createKeyedSequencer } from './socket/sequencer';
import { createStripeWebhookHandler } from './controllers/stripe-webhook';

export const SESSION_COOKIE = 'saddlestep.sid';

export interface SaddlestepApp {
  app: express.Express;
  httpServer: HttpServer;
  io: AppServer;
  sequelize: Sequelize;
  logger: Logger;
  ctx: AppContext;
  /** Stop accepting work and release every connection and timer. */
  close: () => Promise<void>;
}

/**
 * Build the whole app (HTTP API, static client, socket.io) without listening. Only
 * server/index.ts listens, so tests can run the same app on a port of their choosing.
 */
export function createApp(config: Config, options: { logger?: Logger } = {}): SaddlestepApp {
  const logger = options.logger ?? createLogger(config);
  const sequelize = createSequelize(config, logger);
  initModels(sequelize);

  const SequelizeStore = connectSessionSequelize(session.Store);
  const store = new SequelizeStore({
    db: sequelize,
    table: 'Session',
    checkExpirationInterval: 15 * 60 * 1000,
    expiration: config.SESSION_TTL_HOURS * 3600 * 1000,
    extendDefaultFields: (defaults: { data: string; expires: Date }, sess: { passport?: { user?: number } }) => ({
      data: defaults.data,
      expires: defaults.expires,
      userId: sess.passport?.user ?? null,
    }),
  });

  const production = config.NODE_ENV === 'production';
  const sessionMiddleware = session({
    name: SESSION_COOKIE,
    secret: config.SESSION_SECRET,
    store,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    proxy: Boolean(config.TRUST_PROXY),
    cookie: { httpOnly: true, sameSite: 'lax', secure: production, maxAge: config.SESSION_TTL_HOURS * 3600 * 1000 },
  });

  const closeTasks: (() => Promise<void> | void)[] = [];
  const ctx: AppContext = {
    config,
    logger,
    sequelize,
    mailer: createMailer(config, logger),
    stripe: createStripe(config),
    io: null,
    runInOrder: createKeyedSequencer(),
    onClose: (task) => closeTasks.push(task),
  };

  const hasher = createPasswordHasher(config.BCRYPT_COST);
  const passport = createPassport(hasher);
  const csrf = createCsrf();

  const app = express();
  app.disable('x-powered-by');
  if (config.TRUST_PROXY) app.set('trust proxy', config.TRUST_PROXY);
  app.use(securityHeaders(config));
  app.use(pinoHttp({ logger, autoLogging: { ignore: (req) => !req.url?.startsWith('/api') } }));
  // Stripe signs the exact bytes it sends, so its webhook reads the raw body before any JSON parsing.
  app.post('/api/stripe/webhook', express.raw({ type: 'application/json', limit: '512kb' }), createStripeWebhookHandler(ctx));
  app.use(express.json({ limit: '100kb', strict: true }));
  app.use(sessionMiddleware);
  app.use(passport.initialize());
  app.use(passport.session());
  app.use('/api', csrf.protect);

  const health: RequestHandler = async (_req, res) => {
    await sequelize.authenticate();
    res.json({ ok: true });
  };
  const auth = createAuthController({ passport, hasher, generateCsrfToken: csrf.generateToken, ctx });
  app.use('/api', createApiRouter(ctx, { auth, authRateLimit: authRateLimit(config), health, hasher }));

  serveClient(app, config);
  app.use(createErrorHandler(logger));

  const httpServer = createServer(app);
  const io = createSocketServer(httpServer, { sessionMiddleware, passport, ctx });
  ctx.io = io;

  let closed = false;
  const close = async () => {
    if (closed) return;
    closed = true;
    for (const task of closeTasks.reverse()) await task();
    await new Promise<void>((resolve) => io.close(() => resolve()));
    if (httpServer.listening) await new Promise<void>((resolve) => httpServer.close(() => resolve()));
    store.stopExpiringSessions();
    ctx.mailer.close();
    await sequelize.close();
  };

  return { app, httpServer, io, sequelize, logger, ctx, close };
}

/** The built client, with long caching for hashed assets and index.html for client routes. */
function serveClient(app: express.Express, config: Config) {
  if (!config.CLIENT_DIST) return;
  const dist = path.resolve(config.CLIENT_DIST);
  const index = path.join(dist, 'index.html');
  app.use('/assets', express.static(path.join(dist, 'assets'), { immutable: true, maxAge: '365d', fallthrough: false }));
  app.use(express.static(dist, { index: false, maxAge: '1h' }));
  app.get(/^(?!\/api\/|\/socket\.io\/).*/, (_req, res, next) => {
    if (!fs.existsSync(index)) return next();
    res.setHeader('Cache-Control', 'no-cache');
    // `dotfiles: 'allow'` because the project folder itself may sit under a dot-folder.
    res.sendFile(index, { dotfiles: 'allow' });
  });
}
