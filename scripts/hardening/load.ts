// npm run test:load [-- --seconds N] [--connections N] [--light N] [--each-route N]: 200
// connections for 60 s (by default) against the app as it runs in production (a separate process,
// signed-in sessions in MariaDB): first the machine's ceiling (a bare Node server, GET /api/me),
// optionally each read route alone, then the main read routes as fast as they answer, the same
// reads from 10 connections (the latency a user sees below saturation), and a mixed profile with
// one write in ten. Reports requests per second, p50 and
// p99, errors, and that the ledger chain verifies afterwards. Targets on a 2-core machine: reads
// at least 1,500 req/s with p99 at most 50 ms, and no errors.
import { spawn, type ChildProcess } from 'node:child_process';
import { parseArgs } from 'node:util';
import type { Express } from 'express';
import { loadConfig, loadDotEnv, testProfileEnvironment } from '../../server/src/config/env';
import { createDataSource } from '../../server/src/db/connection-options';
import { verifyLedger } from '../../server/src/modules/ledger/ledger-verification';
import { csrfTokenOf, SamlTestDriver } from '../../tests/helpers/saml-round-trip';
import { bootstrapDatabase } from '../lib/bootstrap-database';
import { loadFromAnotherProcess, type LoadResult } from '../lib/load-generator';
import { fail, log } from '../lib/run';
import { seedIfEmpty } from '../seed/seed-if-empty';
import { reportChecks, startAppProcess, untilHealthy } from './app-process';

const { values } = parseArgs({
  options: {
    seconds: { type: 'string' },
    connections: { type: 'string' },
    'each-route': { type: 'string' },
    light: { type: 'string' },
  },
});
loadDotEnv();
Object.assign(process.env, testProfileEnvironment(), {
  DATA_DIR: '.data/load',
  DB_PORT: '3312',
  DB_NAME: 'ingotrace_load',
  PORT: '8094',
  LOG_LEVEL: 'error',
  SMTP_PORT: '1030',
  MAIL_WEB_PORT: '1083',
  IDP_PORT: '7014',
  DB_POOL_SIZE: '20',
  APP_WORKERS: process.env.APP_WORKERS ?? '2',
});
const config = loadConfig();
const base = `http://127.0.0.1:${config.PORT}`;
const seconds = Number(values.seconds ?? 60);
const connections = Number(values.connections ?? 200);
// The reads are also measured from a few connections: the latency a user sees below saturation.
const lightConnections = Number(values.light ?? 10);

async function main(): Promise<void> {
  if (!Number.isInteger(seconds) || seconds < 5 || seconds > 3600)
    throw new Error('--seconds: a whole number from 5 to 3600');
  if (!Number.isInteger(lightConnections) || lightConnections < 1 || lightConnections > 1000)
    throw new Error('--light: a whole number of connections from 1 to 1,000');
  const server = await bootstrapDatabase(config, { reset: true });
  let app: ChildProcess | null = null;
  const admin = createDataSource(config, 'migration');
  try {
    await seedIfEmpty(config);
    const saml = await SamlTestDriver.create(config);
    app = startAppProcess();
    await untilHealthy(base);
    const reader = await saml.signIn(base as unknown as Express, 'kiw-0201');
    const writer = await saml.signIn(base as unknown as Express, 'kiw-0301');
    const writerCsrf = await csrfTokenOf(writer.agent);
    await admin.initialize();
    const [lot] = await admin.query(
      "SELECT lot_number FROM production_lot WHERE status = 'released' ORDER BY id LIMIT 1",
    );
    const [heat] = await admin.query("SELECT id FROM heat WHERE status = 'accepted' ORDER BY id LIMIT 1");
    const readPaths = [
      '/api/me',
      '/api/lots?page=1&pageSize=25',
      '/api/heats?page=1&pageSize=25',
      `/api/trace/backward?lot=${lot.lot_number}`,
      `/api/trace/forward?heatId=${heat.id}`,
      '/api/audit/events?page=1&pageSize=25',
      '/api/bar-pieces?page=1&pageSize=25',
      '/api/recalls',
      '/api/suppliers',
      '/api/organisation',
    ];
    for (const path of readPaths) {
      const response = await fetch(`${base}${path}`, { headers: { cookie: reader.cookie } });
      if (response.status !== 200) throw new Error(`${path} answered ${response.status} before the load`);
    }
    // What this machine can do at all, for reading the figures below: a bare Node HTTP server
    // answering a fixed JSON, and the cheapest signed-in route (one session read), under the same load.
    const calibration = Math.min(seconds, 15);
    const bare = await bareServerLoad(calibration);
    const cheapest = await loadFromAnotherProcess({
      url: base,
      connections,
      duration: calibration,
      reader: reader.cookie,
      readPaths: ['/api/me'],
    });
    // --each-route N: each read route alone for N seconds, to see which routes cost the most.
    const eachRoute: Array<[string, LoadResult]> = [];
    for (const path of values['each-route'] ? readPaths : []) {
      eachRoute.push([
        path,
        await loadFromAnotherProcess({
          url: base,
          connections,
          duration: Number(values['each-route']),
          reader: reader.cookie,
          readPaths: [path],
        }),
      ]);
    }
    const eventsBefore = Number((await admin.query('SELECT COUNT(*) AS n FROM audit_event'))[0].n);
    log(`reads: ${connections} connections for ${seconds} s over ${readPaths.length} routes…`);
    const reads = await loadFromAnotherProcess({
      url: base,
      connections,
      duration: seconds,
      reader: reader.cookie,
      readPaths,
    });
    log(`light: the same reads from ${lightConnections} connections for ${seconds} s…`);
    const light = await loadFromAnotherProcess({
      url: base,
      connections: lightConnections,
      duration: seconds,
      reader: reader.cookie,
      readPaths,
    });
    log(`mixed: one write in ten, ${connections} connections for ${seconds} s…`);
    const mixed = await loadFromAnotherProcess({
      url: base,
      connections,
      duration: seconds,
      reader: reader.cookie,
      writer: { cookie: writer.cookie, csrf: writerCsrf },
      readPaths,
      writeEvery: 10,
    });
    // Requests that the load generator gave up on may still be running in the app: stop it first.
    await stopApp(app);
    const [counts] = await admin.query(
      "SELECT (SELECT COUNT(*) FROM supplier WHERE name LIKE 'Load writer %') AS written, (SELECT COUNT(*) " +
        'FROM audit_event) AS events',
    );
    const written = Number(counts.written);
    const eventsAfter = Number(counts.events);
    const ledger = await verifyLedger(admin.manager);
    const line = (name: string, result: LoadResult) =>
      `${name.padEnd(6)} ${String(result.requestsPerSecond).padStart(6)} req/s  p50 ` +
      `${String(result.p50Ms).padStart(4)} ms  p99 ${String(result.p99Ms).padStart(5)} ms  ` +
      `${result.requests} requests, ${result.errors} errors, ${result.timeouts} timeouts, ${result.non2xx} ` +
      `non-2xx ${JSON.stringify(result.statusCodes)}`;
    process.stdout.write(
      `\n${line('bare', bare)}   (a bare Node HTTP server, fixed JSON: this machine's ` +
        `ceiling)\n${line('me', cheapest)}   (GET /api/me: the cheapest signed-in ` +
        `route)\n` +
        eachRoute.map(([path, result]) => `${line('route', result)}   ${path}\n`).join('') +
        `${line('reads', reads)}\n${line('light', light)} ` +
        `  (the same reads from ${lightConnections} connections)\n${line('mixed', mixed)}\n`,
    );
    // Little's law for a closed loop of connections: mean latency = connections / throughput.
    log(
      `with ${connections} connections each waiting for its answer, the mean latency is ${connections} / ` +
        `throughput (Little's law): ${Math.round((connections / Math.max(1, reads.requestsPerSecond)) * 1000)} ` +
        `ms here; a p99 of 50 ms needs more than ${Math.round(connections / 0.05)} req/s`,
    );
    const checks = [
      [`reads at least 1,500 req/s (${reads.requestsPerSecond})`, reads.requestsPerSecond >= 1500],
      [`reads p99 at most 50 ms (${reads.p99Ms})`, reads.p99Ms <= 50],
      [
        `no errors, timeouts or failed answers (reads ${reads.errors + reads.timeouts + reads.non2xx}, mixed ` +
          `${mixed.errors + mixed.timeouts + mixed.non2xx})`,
        reads.errors + reads.timeouts + reads.non2xx + mixed.errors + mixed.timeouts + mixed.non2xx === 0,
      ],
      [
        `every write acknowledged is a supplier with its ledger event (${written} suppliers, ` +
          `${eventsAfter - eventsBefore} events)`,
        eventsAfter - eventsBefore === written,
      ],
      [ledger.summary, ledger.ok],
    ] as const;
    reportChecks(checks);
  } finally {
    if (app && app.exitCode === null) app.kill('SIGTERM');
    if (admin.isInitialized) await admin.destroy();
    await server.stop();
  }
}

/** Load on a bare node:http server in its own process (no framework, no database), for comparison. */
async function bareServerLoad(duration: number): Promise<LoadResult> {
  const port = config.PORT + 7;
  const code =
    `require('node:http').createServer((q, r) => { r.writeHead(200, { 'content-type': 'application/json' }); ` +
    `r.end(JSON.stringify({ id: 1, name: 'bare', roles: ['qa-reviewer'] })); }).listen(${port}, '127.0.0.1', ` +
    `() => console.log('up'));`;
  const bareServer = spawn(process.execPath, ['-e', code], { stdio: ['ignore', 'pipe', 'inherit'] });
  try {
    await new Promise<void>((ready) => bareServer.stdout.once('data', () => ready()));
    return await loadFromAnotherProcess({
      url: `http://127.0.0.1:${port}`,
      connections,
      duration,
      reader: '',
      readPaths: ['/'],
    });
  } finally {
    bareServer.kill('SIGTERM');
  }
}

function stopApp(app: ChildProcess): Promise<void> {
  if (app.exitCode !== null) return Promise.resolve();
  return new Promise((done) => {
    app.once('exit', () => done());
    app.kill('SIGTERM');
  });
}

main()
  .then(() => process.exit(process.exitCode ?? 0))
  .catch(fail('test:load'));
