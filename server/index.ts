import { loadConfig } from './config';
import { createApp } from './app';
import { migrateUp } from './migrator';
import { createAppScheduler } from './scheduler/app-scheduler';

/** Production entry: migrate, then listen. The dev/test launchers call `startServer` directly. */
export async function startServer(config = loadConfig()) {
  const saddlestep = createApp(config);
  await migrateUp(saddlestep.sequelize, saddlestep.logger);
  const scheduler = createAppScheduler(saddlestep.ctx, { intervalMs: config.SCHEDULER_INTERVAL_SECONDS * 1000 });
  saddlestep.ctx.onClose(() => scheduler.stop());
  if (config.SCHEDULER_INTERVAL_SECONDS > 0) scheduler.start();
  await new Promise<void>((resolve, reject) => {
    saddlestep.httpServer.once('error', reject);
    saddlestep.httpServer.listen(config.PORT, config.HOST, () => resolve());
  });
  const address = saddlestep.httpServer.address();
  const port = typeof address === 'object' && address ? address.port : config.PORT;
  saddlestep.logger.info({ port }, 'Saddlestep is listening');
  return { ...saddlestep, port };
}

const isEntry = import.meta.url === `file://${process.argv[1]}`;
if (isEntry) {
  startServer()
    .then(({ close, logger }) => {
      const stop = (signal: string) => {
        logger.info({ signal }, 'shutting down');
        close().then(() => process.exit(0), () => process.exit(1));
      };
      process.once('SIGINT', stop);
      process.once('SIGTERM', stop);
    })
    .catch((error: unknown) => {
      console.error(error instanceof Error ? error.message : error);
      process.exit(1);
    });
}
