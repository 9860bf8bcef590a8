import { Command } from 'commander';
import { loadConfig, loadDotEnv } from '../config/env';

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
      process.stdout.write(`${JSON.stringify(shown, null, 2)}\n`);
    });
}
