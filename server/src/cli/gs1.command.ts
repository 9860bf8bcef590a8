import { Command } from 'commander';
import {
  buildDigitalLink,
  buildElementString,
  gs1DateToIso,
  Gs1Error,
  parseUdi,
} from '@shared/domain/gs1/element-string';
import { CliExit } from './cli-exit';

const guard = <T>(work: () => T): T => {
  try {
    return work();
  } catch (error) {
    if (error instanceof Gs1Error) throw new CliExit(2, error.message);
    throw error;
  }
};

/** `ingotrace gs1 parse|build`: UDI element strings and GS1 Digital Link URIs. */
export function gs1Command(): Command {
  const gs1 = new Command('gs1').description(
    'read and write GS1 UDIs: element strings (AIs 01, 11, 17, 10, 21) and Digital Link URIs',
  );
  gs1
    .command('parse')
    .description('read a UDI (element string with or without parentheses, or a Digital Link URI); prints JSON')
    .argument(
      '<udi>',
      'e.g. "(01)09506000134352(17)261231(10)ABC123" or "https://id.gs1.org/01/09521234543213/10/ABC123"',
    )
    .action((udi: string) => {
      const parts = guard(() => parseUdi(udi));
      process.stdout.write(
        `${JSON.stringify({
          gtin: parts.gtin,
          lot: parts.lot,
          expiry: parts.expiry ? gs1DateToIso(parts.expiry) : null,
          productionDate: parts.productionDate ? gs1DateToIso(parts.productionDate) : null,
          serial: parts.serial,
        })}\n`,
      );
    });
  gs1
    .command('build')
    .description('print the element string (first line) and the GS1 Digital Link URI (second line)')
    .requiredOption('--gtin <gtin>', 'GTIN-14 with its check digit')
    .requiredOption('--lot <lot>', 'lot number (AI 10)')
    .option('--expiry <yymmdd>', 'expiry date (AI 17)')
    .option('--serial <serial>', 'serial number (AI 21)')
    .option('--base <uri>', 'Digital Link domain and path prefix', 'https://id.gs1.org')
    .action((options: { gtin: string; lot: string; expiry?: string; serial?: string; base: string }) => {
      const parts = {
        gtin: options.gtin,
        lot: options.lot,
        expiry: options.expiry ?? null,
        serial: options.serial ?? null,
        productionDate: null,
      };
      const lines = guard(() => [buildElementString(parts), buildDigitalLink(parts, options.base)]);
      process.stdout.write(`${lines.join('\n')}\n`);
    });
  return gs1;
}
