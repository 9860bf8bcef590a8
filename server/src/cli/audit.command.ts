import { Command } from 'commander';
import { readFileSync, writeFileSync } from 'node:fs';
import { userInfo } from 'node:os';
import { loadConfig, loadDotEnv } from '../config/env';
import { createDataSource } from '../db/connection-options';
import { inTransaction } from '../db/transaction';
import { appendLedgerEvent } from '../modules/ledger/ledger.repository';
import { exportLedger, verifyLedger, verifyLedgerExport } from '../modules/ledger/ledger-verification';
import { CliExit } from './cli-exit';


async function withDatabase<T>(work: (dataSource: ReturnType<typeof createDataSource>) => Promise<T>): Promise<T> {
  loadDotEnv();
  const dataSource = createDataSource(loadConfig(), 'app');
  try {
    await dataSource.initialize();
  } catch (error) {
    throw new CliExit(2, `cannot reach the database: ${error instanceof Error ? error.message : String(error)}`);
  }
  try {
    return await work(dataSource);
  } finally {
    await dataSource.destroy();
  }
}

/** `ingotrace audit verify [--file F]` and `ingotrace audit export --out F`. */
export function auditCommand(): Command {
  const audit = new Command('audit').description('verify and export the audit ledger');

  audit
    .command('verify')
    .description('recompute every hash of the ledger (and every signature), or of an export file with --file; exit 1 naming the first broken event')
    .option('--file <path>', 'verify an export file offline, without a database')
    .action(async (options: { file?: string }) => {
      if (options.file) {
        let bundle: unknown;
        try {
          bundle = JSON.parse(readFileSync(options.file, 'utf8'));
        } catch (error) {
          throw new CliExit(2, `cannot read ${options.file}: ${error instanceof Error ? error.message : String(error)}`);
        }
        const result = verifyLedgerExport(bundle);
        if (!result.ok) throw new CliExit(1, result.summary);
        process.stdout.write(`${result.summary}\n`);
        return;
      }
      const result = await withDatabase((dataSource) => verifyLedger(dataSource.manager));
      if (!result.ok) throw new CliExit(1, result.summary);
      process.stdout.write(`${result.summary} (${result.milliseconds} ms)\n`);
    });

  audit
    .command('export')
    .description('write every ledger event with its content and hash, and the chain head, as JSON')
    .requiredOption('--out <path>', 'the file to write')
    .action(async (options: { out: string }) => {
      const bundle = await withDatabase(async (dataSource) => {
        const exported = await exportLedger(dataSource);
        await inTransaction(dataSource, (manager) =>
          appendLedgerEvent(manager, {
            actor: { id: null, name: `command line (${userInfo().username})`, role: null },
            action: 'audit.exported',
            entity: { type: 'audit-ledger', id: null },
            after: { format: 'bundle', chainHead: exported.chainHead, file: options.out },
          }),
        );
        return exported;
      });
      try {
        writeFileSync(options.out, JSON.stringify(bundle));
      } catch (error) {
        throw new CliExit(2, `cannot write ${options.out}: ${error instanceof Error ? error.message : String(error)}`);
      }
      process.stdout.write(`exported ${bundle.events.length} events to ${options.out}, chain head ${bundle.chainHead.seq} ${bundle.chainHead.hash}\n`);
    });

  return audit;
}
