import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { runCommand, log } from './run';

const inputs = ['src', 'shared', 'vite.config.ts', 'package-lock.json', 'tsconfig.client.json'];
const output = 'dist/client/index.html';

function newestMtime(path: string): number {
  if (!existsSync(path)) return 0;
  const stat = statSync(path);
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = stat.mtimeMs;
  for (const entry of readdirSync(path)) newest = Math.max(newest, newestMtime(join(path, entry)));
  return newest;
}

/** Builds the client with Vite unless dist/client is newer than every input. */
export async function buildClientIfStale(force = false): Promise<void> {
  const built = existsSync(output) ? statSync(output).mtimeMs : 0;
  const newestInput = Math.max(...inputs.map(newestMtime));
  if (!force && built > newestInput) {
    log('client build is current');
    return;
  }
  log('building the client…');
  const started = Date.now();
  await runCommand(process.execPath, ['node_modules/vite/bin/vite.js', 'build', '--logLevel', 'warn']);
  log(`client built in ${((Date.now() - started) / 1000).toFixed(1)} s`);
}
