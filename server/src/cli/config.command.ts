import { Command } from 'commander';
import { existsSync, readFileSync } from 'node:fs';
import { loadConfig, loadDotEnv } from '../config/env';
import { keyIdOf, ledgerKeyPath, publicKeyPathOf } from '../modules/ledger/ledger-signing-key';

const secretKeys = new Set(['DB_PASSWORD', 'DB_MIGRATION_PASSWORD']);

/** `ingotrace config`: validates the environment and prints the effective settings, secrets masked. */
export function configCommand(): Command {
  return new Command('config')
    .description('check the configuration (.env and environment) and print the effective settings as JSON')
    .action(() => {
      loadDotEnv();
      const config = loadConfig();
      const shown = Object.fromEntries(
        Object.entries(config).map(([key, value]) => [key, secretKeys.has(key) ? '********' : value]),
      );
      // The ledger's public key is published with the configuration (never the key itself).
      const publicKeyFile = publicKeyPathOf(ledgerKeyPath(config));
      const ledgerPublicKey = existsSync(publicKeyFile)
        ? { file: publicKeyFile, keyId: keyIdOf(readFileSync(publicKeyFile, 'utf8')) }
        : { file: publicKeyFile, keyId: null };
      process.stdout.write(`${JSON.stringify({ ...shown, ledgerPublicKey }, null, 2)}\n`);
    });
}
