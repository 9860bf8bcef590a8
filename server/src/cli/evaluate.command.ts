import { Command } from 'commander';
import { evaluateCertificate, EvaluationInputError } from '@shared/domain/materials/evaluate-certificate';
import { CliExit } from './cli-exit';

async function readStdin(): Promise<string> {
  if (process.stdin.isTTY) throw new CliExit(2, 'pipe one JSON certificate into ingotrace evaluate (see --help)');
  const chunks: Buffer[] = [];
  for await (const chunk of process.stdin) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks).toString('utf8');
}

/** `ingotrace evaluate`: one JSON certificate on stdin, its evaluation as JSON on stdout. */
export function evaluateCommand(): Command {
  return new Command('evaluate')
    .description(
      'evaluate one certificate (JSON on stdin) against the specification library with ASTM E29 rounding; ' +
        'prints the evaluation as JSON',
    )
    .addHelpText(
      'after',
      `
Input, for example:
  {"spec": "ASTM F136", "grade": null, "form": "bar", "condition": "annealed", "sizeMm": "25",
   "chemistry": {"Al": "6.1", "V": "4.0", "Fe": "0.18", "O": "0.12", "C": "0.02", "N": "0.01", "H": "0.004"},
   "mechanical": {"utsMPa": "950", "ysMPa": "880", "elongationPct": "14", "reductionOfAreaPct": "40"}}
Chemistry in wt % (or "40 ppm"); numbers may be JSON strings or numbers. The condition is one of
annealed, cold-worked, hot-worked, warm-worked, extra-hard. The verdict is conforms,
does-not-conform or cannot-be-evaluated (each such item gives its reason: no-requirement,
missing-value, unverified-written-form); restsOnUnverified names the items judged against
unverified limits. Exit 0 whatever the verdict; exit 2 with a message for invalid input or an
unknown specification.`,
    )
    .action(async () => {
      const text = await readStdin();
      let input: unknown;
      try {
        input = JSON.parse(text);
      } catch (error) {
        throw new CliExit(2, `the input is not JSON: ${error instanceof Error ? error.message : String(error)}`);
      }
      try {
        const evaluation = evaluateCertificate(input as never);
        process.stdout.write(`${JSON.stringify(evaluation, null, 2)}\n`);
      } catch (error) {
        if (error instanceof EvaluationInputError) {
          const details = Object.entries(error.fields).map(([field, message]) => `  ${field}: ${message}`);
          throw new CliExit(2, [error.message, ...details].join('\n'));
        }
        throw error;
      }
    });
}
