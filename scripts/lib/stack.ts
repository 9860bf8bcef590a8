import { spawn, type ChildProcess } from 'node:child_process';
import type { AppConfig } from '../../server/src/config/env';
import { bootstrapDatabase } from './bootstrap-database';
import { startMailCatcher } from './mail-catcher';
import { log } from './run';
import { seedIfEmpty } from '../seed/seed-if-empty';
import { startStandInIdp } from '../stand-in-idp';

export interface Stack {
  urls: Record<string, string>;
  /** Stops everything this stack started, last started first. */
  stop(): Promise<void>;
}

export interface StackOptions {
  reset?: boolean;
  relaxedDurability?: boolean;
}

/** MariaDB (migrated, granted, seeded when empty) and the mail catcher: what the app needs around it. */
export async function startSupportingServices(config: AppConfig, options: StackOptions = {}): Promise<Stack> {
  const stops: Array<() => Promise<void>> = [];
  let stopping: Promise<void> | null = null;
  const stopInReverse = async () => {
    for (const stopOne of [...stops].reverse()) {
      try {
        await stopOne();
      } catch (error) {
        log(`while stopping: ${error instanceof Error ? error.message : String(error)}`);
      }
    }
  };
  const stack: Stack = {
    urls: {},
    stop: () => (stopping ??= stopInReverse()),
  };
  try {
    if (config.DB_SERVER === 'local') {
      const database = await bootstrapDatabase(config, options);
      stops.push(() => database.stop());
      if (await seedIfEmpty(config)) log('demo scenario seeded into the empty database');
    } else {
      log(`using the database at ${config.DB_HOST}:${config.DB_PORT} as it is (DB_SERVER=external)`);
    }
    // A rebuilt database starts with an empty mailbox too, so old mail cannot answer for new records.
    const mail = await startMailCatcher(config, { empty: Boolean(options.reset) });
    stops.push(mail.stop);
    stack.urls['Mail catcher (all e-mail the product sends)'] = mail.url;
    if (config.SAML_IDP_SSO_URL.startsWith(`http://127.0.0.1:${config.IDP_PORT}/`)) {
      const identityProvider = await startStandInIdp(config);
      stops.push(identityProvider.stop);
      stack.urls['Stand-in identity provider (demo sign-in)'] = identityProvider.url;
    }
  } catch (error) {
    await stack.stop();
    throw error;
  }
  return stack;
}

/** Starts a Node process running TypeScript through tsx, with the given environment. */
export function spawnNode(args: string[], env: Record<string, string | undefined>): ChildProcess {
  return spawn(process.execPath, ['--import', 'tsx', ...args], { stdio: 'inherit', env: { ...process.env, ...env } });
}

/** Waits until GET url answers 200, or fails after the timeout. */
export async function waitForHttp(url: string, timeoutMs = 60_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  let last = '';
  while (Date.now() < deadline) {
    try {
      const response = await fetch(url);
      if (response.ok) return;
      last = `${response.status} ${await response.text()}`;
    } catch (error) {
      last = error instanceof Error ? error.message : String(error);
    }
    await new Promise((done) => setTimeout(done, 250));
  }
  throw new Error(`${url} did not answer in time (last: ${last})`);
}

/** Stops a child process with SIGTERM and waits for it to exit. */
export function stopChild(child: ChildProcess, timeoutMs = 10_000): Promise<void> {
  return new Promise((done) => {
    if (child.exitCode !== null || child.signalCode !== null) return done();
    const timer = setTimeout(() => child.kill('SIGKILL'), timeoutMs);
    child.once('exit', () => {
      clearTimeout(timer);
      done();
    });
    child.kill('SIGTERM');
  });
}

/** Calls stop once on SIGINT or SIGTERM, then exits. */
export function onShutdownSignal(stop: () => Promise<void>): void {
  // A closed terminal or pipe must not kill us before we have stopped what we started.
  process.stdout.on('error', () => undefined);
  process.stderr.on('error', () => undefined);
  process.on('SIGHUP', () => void stop().finally(() => process.exit(129)));
  let stopping = false;
  const handler = (signal: NodeJS.Signals) => {
    if (stopping) return;
    stopping = true;
    log(`${signal} received; stopping everything that was started…`);
    stop().finally(() => process.exit(signal === 'SIGINT' ? 130 : 143));
  };
  process.on('SIGINT', handler);
  process.on('SIGTERM', handler);
}
