import 'reflect-metadata';
import cluster from 'node:cluster';
import type { Server } from 'node:http';
import { ConfigError, loadConfig, loadDotEnv, type AppConfig } from './config/env';
import type { Logger } from 'pino';
import { runClusterPrimary } from './cluster-primary';
import { createDataSource } from './db/connection-options';
import { Database } from './db/database';
import { createApp } from './app';
import { createLogger } from './logger';
import { productVersion } from './version';

loadDotEnv();
let config;
try {
  config = loadConfig();
} catch (error) {
  if (error instanceof ConfigError) {
    process.stderr.write(`${error.message}\n`);
    process.exit(2);
  }
  throw error;
}
const logger = createLogger(config);
if (config.APP_WORKERS > 1 && cluster.isPrimary) runClusterPrimary(config.APP_WORKERS, logger);
else serve(config, logger);

/** One app process: the API and client on the configured port (shared with its siblings in a cluster). */
function serve(config: AppConfig, logger: Logger): void {
  const database = new Database(createDataSource(config, 'app'));
  const app = createApp({ config, database, logger, version: productVersion }, { clientDir: 'dist/client' });

  // Connect in the background and keep retrying: health answers 503 until the database is back.
  async function connectWithRetry(): Promise<void> {
    for (let attempt = 1; ; attempt++) {
      try {
        await database.connect();
        logger.info('database connected');
        return;
      } catch (error) {
        logger.warn({ err: error, attempt }, 'database not reachable yet; retrying');
        await new Promise((done) => setTimeout(done, Math.min(5_000, 250 * attempt)));
      }
    }
  }
  void connectWithRetry();

  const server: Server = app.listen(config.PORT, config.HOST, () => {
    logger.info(`Ingotrace ${productVersion} listening on ${config.PUBLIC_URL}`);
  });
  server.on('error', (error) => {
    logger.fatal({ err: error }, 'cannot listen');
    process.exit(1);
  });

  let stopping = false;
  async function shutdown(signal: string): Promise<void> {
    if (stopping) return;
    stopping = true;
    logger.info(`${signal} received; stopping`);
    const force = setTimeout(() => server.closeAllConnections(), 5_000);
    const closed = new Promise<void>((done) => server.close(() => done()));
    server.closeIdleConnections();
    await closed;
    clearTimeout(force);
    await app.shutdown();
    await database.close();
    process.exit(0);
  }
  process.on('SIGTERM', () => void shutdown('SIGTERM'));
  process.on('SIGINT', () => void shutdown('SIGINT'));
}
