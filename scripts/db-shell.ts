// npm run db:shell [-- <mariadb client arguments>]: the mariadb client as the administrator on the
// project's own server, in the app's database. Starts the server for the session if it is down.
import { spawn } from 'node:child_process';
import { loadConfig, loadDotEnv } from '../server/src/config/env';
import { localServerFor } from './lib/bootstrap-database';
import { fail } from './lib/run';

async function main(): Promise<void> {
  loadDotEnv();
  const config = loadConfig();
  const server = localServerFor(config);
  await server.start();
  const args = server.clientArgs([config.DB_NAME, ...process.argv.slice(2)]);
  const code = await new Promise<number>((resolve) => {
    const client = spawn(server.tool('mariadb'), args, { stdio: 'inherit' });
    client.on('close', (exitCode) => resolve(exitCode ?? 1));
  });
  await server.stop();
  process.exit(code);
}

main().catch(fail('db:shell'));
