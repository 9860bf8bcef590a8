// npm run bench:ledger: ledger writes per second under concurrency, and verification time, in a
// scratch database on the test profile's MariaDB. Prints a table and, last, one JSON line.
import { parseArgs } from 'node:util';
import { loadConfig, loadDotEnv, testProfileEnvironment } from '../../server/src/config/env';
import { createDataSource } from '../../server/src/db/connection-options';
import { inTransaction } from '../../server/src/db/transaction';
import { appendLedgerEvent } from '../../server/src/modules/ledger/ledger.repository';
import { verifyLedger } from '../../server/src/modules/ledger/ledger-verification';
import { bootstrapDatabase } from '../lib/bootstrap-database';
import { fail, log } from '../lib/run';

async function main(): Promise<void> {
  const { values } = parseArgs({
    options: {
      events: { type: 'string', default: '100000' },
      writers: { type: 'string', default: '20' },
      'timed-events': { type: 'string', default: '2000' },
    },
  });
  const total = Number(values.events);
  const writers = Number(values.writers);
  const timedEvents = Number(values['timed-events']);
  if (
    !Number.isInteger(total) ||
    total < 1 ||
    !Number.isInteger(writers) ||
    writers < 1 ||
    !Number.isInteger(timedEvents) ||
    timedEvents < writers
  ) {
    throw new Error('--events, --writers and --timed-events take positive whole numbers (timed-events ≥ writers)');
  }
  loadDotEnv();
  Object.assign(process.env, testProfileEnvironment(), {
    DB_NAME: 'ingotrace_bench_ledger',
    DB_POOL_SIZE: String(Math.max(writers, 10)),
  });
  const config = loadConfig();
  // Durable commits, as in production, for the write figure.
  const server = await bootstrapDatabase(config, { reset: true, relaxedDurability: false });
  const dataSource = createDataSource(config, 'app');
  await dataSource.initialize();
  try {
    const write = async (writer: number, index: number) =>
      inTransaction(dataSource, (manager) =>
        appendLedgerEvent(manager, {
          actor: { id: writer, name: `writer ${writer}`, role: 'manufacturing-engineer' },
          action: 'bench.write',
          entity: { type: 'bench', id: `${writer}-${index}` },
          after: { writer, index, note: 'Łódź Győr' },
        }),
      );
    log(`writing ${timedEvents} events from ${writers} concurrent connections…`);
    const perWriter = Math.floor(timedEvents / writers);
    const started = performance.now();
    await Promise.all(
      Array.from({ length: writers }, async (_unused, writer) => {
        for (let index = 0; index < perWriter; index++) await write(writer, index);
      }),
    );
    const writeSeconds = (performance.now() - started) / 1000;
    const written = perWriter * writers;
    log(`filling the ledger to ${total} events…`);
    for (let done = written; done < total; done += 500) {
      await Promise.all(
        Array.from({ length: Math.min(10, writers) }, async (_unused, writer) => {
          for (let index = 0; index < 50 && done + writer * 50 + index < total; index++)
            await write(writer, done + index);
        }),
      );
    }
    const verification = await verifyLedger(dataSource.manager);
    if (!verification.ok) throw new Error(verification.summary);
    const figures = {
      writers,
      eventsWritten: written,
      eventsPerSecond: Math.round(written / writeSeconds),
      verifiedEvents: verification.events,
      verifyMilliseconds: verification.milliseconds,
    };
    process.stdout.write(
      `\nledger writes, ${writers} concurrent connections, durable commits: ${figures.eventsPerSecond} events/s\n`,
    );
    process.stdout.write(`verification of ${figures.verifiedEvents} events: ${figures.verifyMilliseconds} ms\n`);
    process.stdout.write(`${JSON.stringify(figures)}\n`);
  } finally {
    await dataSource.destroy();
    await server.adminSql('DROP DATABASE IF EXISTS `ingotrace_bench_ledger`;');
    await server.stop();
  }
}

main().catch(fail('bench:ledger'));
