import { fileURLToPath } from 'node:url';
import path from 'node:path';
import { Sequelize } from 'sequelize';
import { SequelizeStorage, Umzug } from 'umzug';
import type { Logger } from './logger';

const MIGRATIONS_DIR = path.join(path.dirname(fileURLToPath(import.meta.url)), 'migrations');

export interface MigrationContext {
  sequelize: Sequelize;
  logger?: Logger;
}

/** Umzug over server/migrations/*.ts, recording applied names in `schema_migrations`. */
export function createMigrator(sequelize: Sequelize, logger?: Logger) {
  return new Umzug<MigrationContext>({
    migrations: {
      glob: ['*.ts', { cwd: MIGRATIONS_DIR, ignore: ['*.d.ts'] }],
      resolve: ({ name, path: file, context }) => ({
        name,
        up: async () => (await import(file!)).up(context),
        down: async () => (await import(file!)).down(context),
      }),
    },
    context: { sequelize, logger },
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: logger ? { info: (m) => logger.debug(m), warn: (m) => logger.warn(m), error: (m) => logger.error(m), debug: (m) => logger.trace(m) } : undefined,
  });
}

export type Migration = (ctx: MigrationContext) => Promise<void>;

/** Apply every pending migration; safe to call on every start. */
export async function migrateUp(sequelize: Sequelize, logger?: Logger): Promise<string[]> {
  const applied = await createMigrator(sequelize, logger).up();
  return applied.map((m) => m.name);
}
