// What the hardening scripts share: the app as a separate process (as it runs in production),
// waiting for its health, and reporting checks as "N passed, N failed".
import { spawn, type ChildProcess } from 'node:child_process';
import { openSync } from 'node:fs';
import { log } from '../lib/run';

/**
 * Starts `server/src/index.ts` with this process's environment (and `overrides`); its output
 * goes to `logFile` when given, else nowhere.
 */
export function startAppProcess(overrides: Record<string, string> = {}, logFile?: string): ChildProcess {
  const output = logFile ? openSync(logFile, 'a') : 'ignore';
  // APP_NODE_ARGS passes options to the app's Node, e.g. '--cpu-prof --cpu-prof-dir=.data/profiles'.
  const nodeArgs = (process.env.APP_NODE_ARGS ?? '').split(' ').filter(Boolean);
  return spawn(process.execPath, [...nodeArgs, '--import', 'tsx', 'server/src/index.ts'], {
    env: { ...process.env, ...overrides },
    stdio: ['ignore', output, output],
  });
}

/** Milliseconds until `base`/api/health answers 200 (polled every 50 ms); throws after the limit. */
export async function untilHealthy(base: string, limitMs = 60_000): Promise<number> {
  const started = Date.now();
  while (Date.now() - started < limitMs) {
    try {
      if ((await fetch(`${base}/api/health`)).status === 200) return Date.now() - started;
    } catch {
      // not listening yet
    }
    await new Promise((done) => setTimeout(done, 50));
  }
  throw new Error(`the app did not answer health within ${limitMs / 1000} s`);
}

/** Prints each check as ok or FAILED and the summary line; sets a failing exit code when one failed. */
export function reportChecks(checks: ReadonlyArray<readonly [string, boolean]>): void {
  for (const [text, ok] of checks) log(`${ok ? 'ok    ' : 'FAILED'} ${text}`);
  const failed = checks.filter(([, ok]) => !ok).length;
  process.stdout.write(`${checks.length - failed} passed, ${failed} failed\n`);
  if (failed) process.exitCode = 1;
}
