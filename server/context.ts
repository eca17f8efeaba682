import type { Sequelize } from 'sequelize';
import type { AppServer } from './socket/types';
import type { RunInOrder } from './socket/sequencer';
import type Stripe from 'stripe';
import type { Config } from './config';
import type { Logger } from './logger';
import type { Mailer } from './mail/mailer';

/**
 * What feature routers, services and socket handlers may use. Built once in createApp and passed
 * down explicitly (no module-level singletons), so tests can build several apps side by side.
 */
export interface AppContext {
  config: Config;
  logger: Logger;
  sequelize: Sequelize;
  mailer: Mailer;
  /** null when Stripe is not configured. */
  stripe: Stripe | null;
  /** Set right after the socket server is created; routers read it lazily at request time. */
  io: AppServer | null;
  /** Serialises work per key, e.g. storing and broadcasting one consultation's chat messages. */
  runInOrder: RunInOrder;
  /** Tasks to run on close (timers, schedulers). */
  onClose: (task: () => Promise<void> | void) => void;
}
