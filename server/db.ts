import { Sequelize } from 'sequelize';
import type { Config } from './config';
import type { Logger } from './logger';

/** One Sequelize instance per app; the connection comes only from DATABASE_URL. */
export function createSequelize(config: Pick<Config, 'DATABASE_URL' | 'DATABASE_POOL_MAX'>, logger?: Logger): Sequelize {
  return new Sequelize(config.DATABASE_URL, {
    dialect: 'mariadb',
    logging: logger ? (sql) => logger.trace({ sql }, 'sql') : false,
    pool: { max: config.DATABASE_POOL_MAX, min: 0, idle: 10_000, acquire: 30_000 },
    define: { underscored: true },
    // Store and read instants as UTC; every time zone conversion happens in code.
    timezone: '+00:00',
    dialectOptions: { connectTimeout: 10_000 },
  });
}
