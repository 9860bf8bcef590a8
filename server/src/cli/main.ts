import { Command, CommanderError } from 'commander';
import { productVersion } from '../version';
import { auditCommand } from './audit.command';
import { CliExit } from './cli-exit';
import { evaluateCommand } from './evaluate.command';
import { configCommand } from './config.command';
import { gs1Command } from './gs1.command';
import { organisationCommand } from './organisation.command';

/** Builds the ingotrace command-line program; later features add their commands here. */
export function buildProgram(): Command {
  const program = new Command('ingotrace')
    .description('Ingotrace command-line tool: checks and exports for implant lot traceability records')
    .version(productVersion, '-v, --version', 'print the version')
    .showHelpAfterError('(run "ingotrace --help" for the commands)')
    .exitOverride();
  program.addCommand(configCommand());
  program.addCommand(auditCommand());
  program.addCommand(evaluateCommand());
  program.addCommand(gs1Command());
  program.addCommand(organisationCommand());
  return program;
}

/** Runs the CLI; returns the process exit code instead of exiting, so that tests can call it. */
export async function runCli(argv: string[]): Promise<number> {
  const program = buildProgram();
  try {
    await program.parseAsync(argv);
    return 0;
  } catch (error) {
    if (error instanceof CommanderError) return error.exitCode;
    if (error instanceof CliExit) {
      process.stderr.write(`ingotrace: ${error.message}\n`);
      return error.exitCode;
    }
    process.stderr.write(`ingotrace: ${error instanceof Error ? error.message : String(error)}\n`);
    return 1;
  }
}
