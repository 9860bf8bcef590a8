// npm start: everything the product needs on one machine, then the app on one port.
import { loadConfig, loadDotEnv } from '../server/src/config/env';
import { buildClientIfStale } from './lib/client-build';
import { fail, log } from './lib/run';
import { onShutdownSignal, spawnNode, startSupportingServices, stopChild, waitForHttp } from './lib/stack';

async function main(): Promise<void> {
  loadDotEnv();
  const config = loadConfig();
  const stack = await startSupportingServices(config);
  let shuttingDown = false;
  let stopAll = stack.stop;
  onShutdownSignal(() => {
    shuttingDown = true;
    return stopAll();
  });
  try {
    await buildClientIfStale();
  } catch (error) {
    await stack.stop();
    throw error;
  }
  const server = spawnNode(['server/src/index.ts'], { NODE_ENV: process.env.NODE_ENV ?? 'production' });
  stopAll = async () => {
    await stopChild(server);
    await stack.stop();
  };
  server.once('exit', (code) => {
    if (shuttingDown) return;
    log(`the app server exited (${code}); stopping the rest`);
    void stack.stop().finally(() => process.exit(code ?? 1));
  });
  await waitForHttp(`http://${config.HOST}:${config.PORT}/api/health`);
  const urls = { Ingotrace: config.PUBLIC_URL, ...stack.urls, Health: `${config.PUBLIC_URL}/api/health` };
  log('ready:');
  for (const [name, url] of Object.entries(urls)) process.stdout.write(`    ${name.padEnd(46)} ${url}\n`);
  log('press Ctrl-C to stop everything');
}

main().catch(fail('start'));
