// npm run bench:trace [-- --lots N] [--json]: genealogy at production scale. Generates a synthetic
// history (default 1,000,000 lots, 5,000 heats, ten years) in its own MariaDB on its own port,
// serves the API in this process with a signed-in session, and measures for each query kind the
// p50/p95 through HTTP and of the bare SQL for the same query (the same service code over a plain
// mysql2 pool: no ORM, no Express, no JSON), their ratio, and the backward trace's throughput at
// 20 connections. Prints a table and, last, one JSON line.
import { createHash } from 'node:crypto';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { parseArgs } from 'node:util';
import mysql from 'mysql2/promise';
import pino from 'pino';
import type { DataSource, EntityManager } from 'typeorm';
import { canonicalJson } from '../../shared/domain/ledger-hash';
import { createApp } from '../../server/src/app';
import { loadConfig, loadDotEnv, testProfileEnvironment } from '../../server/src/config/env';
import { createDataSource } from '../../server/src/db/connection-options';
import { Database } from '../../server/src/db/database';
import { backwardTrace, forwardTraceIn } from '../../server/src/modules/trace/trace.service';
import { SamlTestDriver } from '../../tests/helpers/saml-round-trip';
import { bootstrapDatabase } from '../lib/bootstrap-database';
import { loadFromAnotherProcess } from '../lib/load-generator';
import { fail, log } from '../lib/run';
import { seedDemoScenario } from '../seed/demo-scenario';
import { generateHistory, shapeFor } from './synthetic-history';

interface Figures {
  apiP50Ms: number;
  apiP95Ms: number;
  sqlP50Ms: number;
  sqlP95Ms: number;
}

const round = (value: number) => Math.round(value * 100) / 100;

function percentiles(samples: number[]): { p50: number; p95: number } {
  const sorted = [...samples].sort((a, b) => a - b);
  return {
    p50: round(sorted[Math.floor(sorted.length * 0.5)]!),
    p95: round(sorted[Math.min(sorted.length - 1, Math.floor(sorted.length * 0.95))]!),
  };
}

async function timeEach<T>(inputs: T[], work: (input: T) => Promise<unknown>): Promise<{ p50: number; p95: number }> {
  const samples: number[] = [];
  for (const input of inputs) {
    const started = performance.now();
    await work(input);
    samples.push(performance.now() - started);
  }
  return percentiles(samples);
}

/** A small deterministic generator, so that two runs ask for the same starts. */
function randomInts(count: number, max: number, seed: number): number[] {
  let state = seed >>> 0;
  return Array.from({ length: count }, () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return 1 + (state % max);
  });
}

async function main(): Promise<void> {
  const { values } = parseArgs({
    options: { lots: { type: 'string' }, json: { type: 'boolean' }, keep: { type: 'boolean' } },
  });
  const lots = Number(values.lots ?? 1_000_000);
  if (!Number.isInteger(lots) || lots < 1_000 || lots > 5_000_000)
    throw new Error('--lots must be a whole number from 1000 to 5000000');
  loadDotEnv();
  // Its own data folder, port and database: the benchmark never touches the demo or test databases.
  Object.assign(process.env, testProfileEnvironment(), {
    DATA_DIR: '.data/bench',
    DB_PORT: '3310',
    DB_NAME: 'ingotrace_bench_trace',
    LOG_LEVEL: 'error',
    DB_POOL_SIZE: '20',
  });
  const config = loadConfig();
  const shape = shapeFor(lots);
  const server = await bootstrapDatabase(config, {
    reset: true,
    relaxedDurability: true,
    bufferPoolMb: Math.max(512, Math.round(lots / 400)),
  });
  const admin = createDataSource(config, 'migration');
  const appData = createDataSource(config, 'app');
  await admin.initialize();
  await appData.initialize();
  const pool = mysql.createPool({
    host: config.DB_HOST,
    port: config.DB_PORT,
    user: config.DB_USER,
    password: config.DB_PASSWORD,
    database: config.DB_NAME,
    connectionLimit: 4,
    timezone: 'Z',
    supportBigNumbers: true,
    bigNumberStrings: true,
  });
  let listening: import('node:http').Server | null = null;
  let summary = '';
  let shutdown: (() => Promise<void>) | null = null;
  try {
    await seedDemoScenario(appData, config.roleMap);
    log(`generating ${lots} lots, ${shape.heats} heats, ${shape.consignees} consignees over ${shape.years} years…`);
    const generated = performance.now();
    const counts = await generateHistory(admin, shape);
    const generateSeconds = Math.round((performance.now() - generated) / 1000);
    log(
      `generated in ${generateSeconds} s: ${Object.entries(counts)
        .map(([table, count]) => `${table} ${count}`)
        .join(', ')}`,
    );

    // The API as it runs in production, signed in through the real SAML round trip.
    const saml = await SamlTestDriver.create(config);
    const app = createApp(
      { config, database: new Database(appData), logger: pino({ level: 'silent' }), version: 'bench' },
      { mailWorker: false },
    );
    shutdown = () => app.shutdown();
    listening = app.listen(0, '127.0.0.1');
    await new Promise((done) => listening!.once('listening', done));
    const base = `http://127.0.0.1:${(listening.address() as AddressInfo).port}`;
    const { cookie, agent } = await saml.signIn(app, 'kiw-0501');
    const me = await agent.get('/api/me');
    const headers = { cookie, 'x-csrf-token': me.body.csrfToken as string, 'content-type': 'application/json' };
    // A keep-alive client, as a browser holds its connection open.
    const keepAlive = new http.Agent({ keepAlive: true, maxSockets: 1 });
    const call = (method: 'GET' | 'POST', path: string, body?: unknown) =>
      new Promise<{ status: number; json: unknown }>((resolveCall, rejectCall) => {
        const request = http.request(`${base}${path}`, { method, headers, agent: keepAlive }, (response) => {
          const chunks: Buffer[] = [];
          response.on('data', (chunk: Buffer) => chunks.push(chunk));
          response.on('end', () =>
            resolveCall({ status: response.statusCode ?? 0, json: JSON.parse(Buffer.concat(chunks).toString('utf8')) }),
          );
        });
        request.on('error', rejectCall);
        request.end(body === undefined ? undefined : JSON.stringify(body));
      });
    const get = async (path: string) => {
      const response = await call('GET', path);
      if (response.status !== 200) throw new Error(`${path}: ${response.status} ${JSON.stringify(response.json)}`);
      return response.json as { lots: unknown[] };
    };

    // The same service code over a bare mysql2 pool.
    const bare = {
      query: async (sql: string, parameters?: unknown[]) => (await pool.query(sql, parameters))[0],
    } as unknown as EntityManager;
    const bareData = { manager: bare } as unknown as DataSource;

    const lotNumber = (id: number) => `S${String(id).padStart(8, '0')}`;
    const backwardStarts = randomInts(400, lots, 7);
    const heatStarts = randomInts(100, shape.heats, 11);
    const supplierStarts = randomInts(12, shape.suppliers, 13);
    const snapshotHeats = randomInts(40, shape.heats, 17);
    const warm = async () => {
      for (const id of randomInts(50, lots, 3)) await get(`/api/trace/backward?lot=${lotNumber(id)}`);
      for (const id of randomInts(20, shape.heats, 5)) await get(`/api/trace/forward?heatId=${id}`);
      await get(`/api/trace/forward?supplierId=1`);
    };
    log('warming the cache…');
    await warm();
    const sizes = {
      backwardLots: (await get(`/api/trace/backward?lot=${lotNumber(backwardStarts[0]!)}`)).lots.length as number,
      forwardHeatLots: (await get(`/api/trace/forward?heatId=${heatStarts[0]}`)).lots.length as number,
      forwardSupplierLots: (await get(`/api/trace/forward?supplierId=${supplierStarts[0]}`)).lots.length as number,
    };
    log('measuring…');
    const measure = async (
      apiWork: (input: number) => Promise<unknown>,
      sqlWork: (input: number) => Promise<unknown>,
      inputs: number[],
    ): Promise<Figures> => {
      const api = await timeEach(inputs, apiWork);
      const sql = await timeEach(inputs, sqlWork);
      return { apiP50Ms: api.p50, apiP95Ms: api.p95, sqlP50Ms: sql.p50, sqlP95Ms: sql.p95 };
    };
    const [{ id: coordinatorId }] = await appData.query("SELECT id FROM person WHERE subject = 'kiw-0501'");
    let lastRecallId = 0;
    const queries = {
      backward: await measure(
        (id) => get(`/api/trace/backward?lot=${lotNumber(id)}`),
        (id) => backwardTrace(bareData, { lot: lotNumber(id) }),
        backwardStarts,
      ),
      forwardHeat: await measure(
        (id) => get(`/api/trace/forward?heatId=${id}`),
        (id) => forwardTraceIn(bare, { heatId: id }),
        heatStarts,
      ),
      forwardSupplier: await measure(
        (id) => get(`/api/trace/forward?supplierId=${id}`),
        (id) => forwardTraceIn(bare, { supplierId: id }),
        supplierStarts,
      ),
      // A drill freezes the same snapshot as a recall without holds or mail. Its bare SQL is the
      // trace and the snapshot's insert, in a transaction that is rolled back.
      recallSnapshot: await measure(
        async (id) => {
          const response = await call('POST', '/api/recalls', {
            trigger: { heatId: id },
            mode: 'drill',
            reason: 'Benchmark drill of one heat',
          });
          if (response.status !== 201) throw new Error(`recall: ${response.status} ${JSON.stringify(response.json)}`);
          lastRecallId = (response.json as { id: number }).id;
        },
        async (id) => {
          const connection = await pool.getConnection();
          try {
            await connection.beginTransaction();
            const manager = {
              query: async (sql: string, parameters?: unknown[]) => (await connection.query(sql, parameters))[0],
            } as unknown as EntityManager;
            const trace = await forwardTraceIn(manager, { heatId: id });
            const text = canonicalJson({ trace, takenAt: new Date().toISOString() });
            await connection.query(
              "INSERT INTO recall_snapshot (recall_id, kind, taken_by, content, sha256) VALUES (?, 'rerun', ?, ?, ?)",
              [lastRecallId, coordinatorId, text, createHash('sha256').update(text).digest('hex')],
            );
          } finally {
            await connection.rollback();
            connection.release();
          }
        },
        snapshotHeats,
      ),
    };
    log('backward trace throughput, 20 connections for 15 s…');
    const load = await loadFromAnotherProcess({
      url: base,
      connections: 20,
      duration: 15,
      reader: cookie,
      readPaths: randomInts(200, lots, 23).map((id) => `/api/trace/backward?lot=${lotNumber(id)}`),
    });
    const throughput = {
      requestsPerSecond: load.requestsPerSecond,
      p99Ms: load.p99Ms,
      errors: load.errors + load.timeouts + load.non2xx,
    };
    // A list of 10,000 UDIs (element strings of random lots, repeats allowed) traced in one request.
    log('bulk trace of 10,000 UDIs…');
    const bulkIds = randomInts(10_000, lots, 29);
    const gtinOf = new Map(
      (
        (await appData.query(
          'SELECT l.id, p.gtin FROM production_lot l JOIN part p ON p.id = l.part_id WHERE l.id IN (?)',
          [[...new Set(bulkIds)]],
        )) as Array<{ id: number; gtin: string }>
      ).map((row) => [Number(row.id), row.gtin]),
    );
    const bulkText = bulkIds.map((id) => `(01)${gtinOf.get(id)}(10)${lotNumber(id)}`).join('\n');
    const postText = (path: string, text: string) =>
      new Promise<{ status: number; found: number }>((resolveCall, rejectCall) => {
        const request = http.request(
          `${base}${path}`,
          { method: 'POST', headers: { ...headers, 'content-type': 'text/plain' }, agent: keepAlive },
          (response) => {
            const chunks: Buffer[] = [];
            response.on('data', (chunk: Buffer) => chunks.push(chunk));
            response.on('end', () => {
              const reply = JSON.parse(Buffer.concat(chunks).toString('utf8')) as { summary?: { found: number } };
              resolveCall({ status: response.statusCode ?? 0, found: reply.summary?.found ?? 0 });
            });
          },
        );
        request.on('error', rejectCall);
        request.end(text);
      });
    const bulkRuns = await timeEach([1, 2, 3, 4, 5], async () => {
      const response = await postText('/api/trace/bulk', bulkText);
      if (response.status !== 200 || response.found !== bulkIds.length)
        throw new Error(`bulk trace: ${response.status}, ${response.found} of ${bulkIds.length} found`);
    });
    const bulk = { udis: bulkIds.length, apiMs: bulkRuns.p50 };
    const ratios = Object.fromEntries(
      Object.entries(queries).map(([name, figures]) => [name, round(figures.apiP50Ms / figures.sqlP50Ms)]),
    );
    const result = {
      lots: counts.production_lot,
      heats: counts.heat,
      generateSeconds,
      rows: counts,
      sizes,
      queries,
      apiToSqlP50: ratios,
      backwardThroughput: throughput,
      bulk,
    };
    if (!values.json) {
      const line = (name: string, figures: Figures) =>
        `${name.padEnd(18)} API p50 ${String(figures.apiP50Ms).padStart(8)} ms  p95 ` +
        `${String(figures.apiP95Ms).padStart(8)} ms   SQL p50 ${String(figures.sqlP50Ms).padStart(8)} ms  ` +
        `p95 ${String(figures.sqlP95Ms).padStart(8)} ms   ratio ${ratios[name]}`;
      process.stdout.write(`\n${result.lots} lots, ${result.heats} heats, generated in ${generateSeconds} s\n`);
      process.stdout.write(
        `sizes: backward ${sizes.backwardLots} lot(s), forward from a heat ${sizes.forwardHeatLots} lots, ` +
          `from a supplier ${sizes.forwardSupplierLots} lots\n`,
      );
      for (const [name, figures] of Object.entries(queries)) process.stdout.write(`${line(name, figures)}\n`);
      process.stdout.write(
        `backward at 20 connections: ${throughput.requestsPerSecond} req/s, p99 ${throughput.p99Ms} ms, ` +
          `${throughput.errors} errors\n`,
      );
      process.stdout.write(`bulk trace of ${bulk.udis} UDIs: ${bulk.apiMs} ms (p50 of 5)\n`);
    }
    summary = JSON.stringify(result);
  } finally {
    listening?.closeAllConnections();
    listening?.close();
    await shutdown?.();
    await pool.end();
    await appData.destroy();
    await admin.destroy();
    if (!values.keep) await server.adminSql('DROP DATABASE IF EXISTS `ingotrace_bench_trace`;');
    await server.stop();
  }
  // Last, after the database has stopped, so that it is the last line whatever else was printed.
  process.stdout.write(`${summary}\n`);
}

main()
  // The app's session store keeps timers; the benchmark is done once it has printed.
  .then(() => process.exit(0))
  .catch(fail('bench:trace'));
