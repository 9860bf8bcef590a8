import cluster from 'node:cluster';
import type { Logger } from 'pino';

/**
 * The primary of a cluster of app processes sharing one port (node:cluster): it serves nothing
 * itself, starts `count` workers, starts a new one when one dies, and on SIGTERM or SIGINT asks
 * each to stop (each finishes its requests) and exits when all have.
 */
export function runClusterPrimary(count: number, logger: Logger): void {
  let stopping = false;
  const start = () => cluster.fork();
  for (let index = 0; index < count; index += 1) start();
  cluster.on('exit', (worker, code, signal) => {
    if (stopping) {
      if (Object.keys(cluster.workers ?? {}).length === 0) process.exit(0);
      return;
    }
    logger.error({ pid: worker.process.pid, code, signal }, 'an app process ended; starting another');
    start();
  });
  const stop = (signal: NodeJS.Signals) => {
    if (stopping) return;
    stopping = true;
    logger.info(`${signal} received; stopping ${count} app processes`);
    for (const worker of Object.values(cluster.workers ?? {})) worker?.process.kill(signal);
    setTimeout(() => process.exit(0), 10_000).unref();
  };
  process.on('SIGTERM', () => stop('SIGTERM'));
  process.on('SIGINT', () => stop('SIGINT'));
}
