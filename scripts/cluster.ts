// npm run cluster:start | cluster:stop | cluster:status: a three-node MariaDB Galera cluster on
// loopback with HAProxy in front (127.0.0.1:3330), holding the app's database: migrated, the app
// account granted, the demo scenario seeded when empty. Run the app against it with
//   DB_SERVER=external DB_PORT=3330 npm start
import { parseArgs } from 'node:util';
import { loadConfig, loadDotEnv } from '../server/src/config/env';
import { bootstrapDatabase } from './lib/bootstrap-database';
import { defaultClusterLayout, GaleraCluster } from './lib/galera';
import { fail, log } from './lib/run';
import { seedIfEmpty } from './seed/seed-if-empty';

const usage = 'usage: node --import tsx scripts/cluster.ts start|stop|status';

async function main(): Promise<void> {
  const { positionals } = parseArgs({ allowPositionals: true });
  const [command] = positionals;
  loadDotEnv();
  const cluster = new GaleraCluster(defaultClusterLayout);
  const config = loadConfig({ ...process.env, DB_SERVER: 'external', DB_PORT: String(cluster.proxyPort) });
  switch (command) {
    case 'start': {
      await cluster.start();
      await bootstrapDatabase(config, { server: cluster.nodes[0]!.server });
      if (await seedIfEmpty(config)) log('demo scenario seeded into the empty database');
      log(`ready: run the app against it with  DB_SERVER=external DB_PORT=${cluster.proxyPort} npm start`);
      return;
    }
    case 'stop':
      await cluster.stop();
      return;
    case 'status':
      for (const node of cluster.nodes) {
        const status = (await node.server.isRunning()) ? await node.status() : null;
        log(
          `${node.name} (port ${node.sqlPort}): ` +
            (status
              ? `${status.state}, cluster size ${status.clusterSize}, ${status.ready ? 'ready' : 'not ready'}`
              : 'not running'),
        );
      }
      return;
    default:
      throw new Error(usage);
  }
}

main()
  .then(() => process.exit(0))
  .catch(fail('cluster'));
