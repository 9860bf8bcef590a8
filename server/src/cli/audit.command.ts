import { Command } from 'commander';
import { readFileSync, writeFileSync } from 'node:fs';
import { userInfo } from 'node:os';
import { loadConfig, loadDotEnv } from '../config/env';
import { inTransaction } from '../db/transaction';
import { appendLedgerEvent } from '../modules/ledger/ledger.repository';
import { exportLedger, verifyLedger, verifyLedgerExport } from '../modules/ledger/ledger-verification';
import { checkpointLedger, readWitnessFile, witnessFilePath } from '../modules/ledger/ledger-checkpoints';
import { installationPublicKey } from '../modules/ledger/ledger-signing-key';
import { CliExit } from './cli-exit';
import { withDatabase } from './cli-database';

/** `ingotrace audit verify [--file F]` and `ingotrace audit export --out F`. */
export function auditCommand(): Command {
  const audit = new Command('audit').description('verify and export the audit trail');

  audit
    .command('verify')
    .description(
      "recompute every hash of the audit trail, check every event's Ed25519 signature and every checkpoint " +
        'with the public key alone (and every electronic signature), or of an export file with --file; exit 1 ' +
        'naming the first broken event',
    )
    .option('--file <path>', 'verify an export file offline, without a database')
    .option('--public-key <path>', "the firm's published audit trail public key (PEM); by default this installation's")
    .option('--witness <path>', "the checkpoints file (one JSON checkpoint a line); by default this installation's")
    .action(async (options: { file?: string; publicKey?: string; witness?: string }) => {
      loadDotEnv();
      const readOrExit = (path: string) => {
        try {
          return readFileSync(path, 'utf8');
        } catch (error) {
          throw new CliExit(2, `cannot read ${path}: ${error instanceof Error ? error.message : String(error)}`);
        }
      };
      const config = loadConfig();
      const checkpoints = readWitnessFile(options.witness ?? witnessFilePath(config));
      if (options.file) {
        let bundle: unknown;
        try {
          bundle = JSON.parse(readOrExit(options.file));
        } catch (error) {
          if (error instanceof CliExit) throw error;
          throw new CliExit(
            2,
            `cannot read ${options.file}: ${error instanceof Error ? error.message : String(error)}`,
          );
        }
        // A file is checked against the installation's (or the given) key when there is one, else against its own key,
        // saying so.
        let publicKeyPem: string | null = options.publicKey ? readOrExit(options.publicKey) : null;
        if (!publicKeyPem) {
          try {
            publicKeyPem = installationPublicKey(config);
          } catch {
            publicKeyPem = null;
          }
        }
        const result = verifyLedgerExport(bundle, {
          publicKeyPem,
          checkpoints: options.witness || publicKeyPem ? checkpoints : [],
        });
        if (!result.ok) throw new CliExit(1, result.summary);
        process.stdout.write(`${result.summary}\n`);
        return;
      }
      let publicKeyPem: string;
      try {
        publicKeyPem = options.publicKey ? readOrExit(options.publicKey) : installationPublicKey(config);
      } catch (error) {
        if (error instanceof CliExit) throw error;
        throw new CliExit(2, error instanceof Error ? error.message : String(error));
      }
      const result = await withDatabase((dataSource) =>
        verifyLedger(dataSource.manager, { publicKeyPem, checkpoints }),
      );
      if (!result.ok) throw new CliExit(1, result.summary);
      process.stdout.write(`${result.summary} (${result.milliseconds} ms)\n`);
    });

  audit
    .command('export')
    .description('write every audit trail event with its content and hash, and the chain head, as JSON')
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
        await checkpointLedger(dataSource, loadConfig(), 'export');
        return exported;
      });
      try {
        writeFileSync(options.out, JSON.stringify(bundle));
      } catch (error) {
        throw new CliExit(2, `cannot write ${options.out}: ${error instanceof Error ? error.message : String(error)}`);
      }
      process.stdout.write(
        `exported ${bundle.events.length} events to ${options.out}, chain head ${bundle.chainHead.seq} ` +
          `${bundle.chainHead.hash}\n`,
      );
    });

  return audit;
}
