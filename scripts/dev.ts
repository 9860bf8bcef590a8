// npm run dev: the same bootstrap as npm start, then the API in watch mode and Vite with hot reload.
import { spawn } from 'node:child_process';
import { loadConfig, loadDotEnv } from '../server/src/config/env';
import { fail, log } from './lib/run';
import { onShutdownSignal, startSupportingServices, stopChild } from './lib/stack';

async function main(): Promise<void> {
  loadDotEnv();
  const config = loadConfig();
  const stack = await startSupportingServices(config);
  const env = { ...process.env, NODE_ENV: 'development' };
  const api = spawn('node_modules/.bin/tsx', ['watch', '--clear-screen=false', 'server/src/index.ts'], {
    stdio: 'inherit',
    env,
  });
  const client = spawn('node_modules/.bin/vite', [], { stdio: 'inherit', env });
  onShutdownSignal(async () => {
    await Promise.all([stopChild(client), stopChild(api)]);
    await stack.stop();
  });
  log(
    `API on ${config.PUBLIC_URL}; the client with hot reload on ` +
      `http://127.0.0.1:${process.env.CLIENT_DEV_PORT ?? 5173}`,
  );
  for (const [name, url] of Object.entries(stack.urls)) log(`${name}: ${url}`);
}

main().catch(fail('dev'));
