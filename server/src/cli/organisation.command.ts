import { Command } from 'commander';
import { userInfo } from 'node:os';
import { inTransaction } from '../db/transaction';
import { appendLedgerEvent } from '../modules/ledger/ledger.repository';
import {
  administratorsMayApprove,
  peopleHoldingBoth,
  setAdministratorsMayApprove,
} from '../modules/people/role-change-requests.repository';
import { CliExit } from './cli-exit';
import { isTimeZone } from '@shared/domain/plant-time';
import { setPlantTimeZone } from '../modules/organisation/organisation.repository';
import { withDatabase } from './cli-database';

/**
 * `ingotrace organisation administrators-may-approve yes|no --reason R`: whether a person may hold
 * Administrator and QA approver together (no by default). Run by whoever operates the server, not
 * from a screen an administrator could use on himself; every change is an audit trail event.
 */
export function organisationCommand(): Command {
  const organisation = new Command('organisation').description(
    "organisation settings: separation of duties and the plant's time zone",
  );
  organisation
    .command('administrators-may-approve')
    .description(
      'allow (yes) or refuse (no) one person holding Administrator and QA approver together; shown on the ' +
        'people screen',
    )
    .argument('<answer>', 'yes or no')
    .requiredOption('--reason <text>', 'why, kept in the audit trail')
    .action(async (answer: string, options: { reason: string }) => {
      if (answer !== 'yes' && answer !== 'no') throw new CliExit(2, 'answer yes or no');
      if (options.reason.trim().length < 3) throw new CliExit(2, 'give a reason of at least 3 characters');
      const allowed = answer === 'yes';
      const outcome = await withDatabase((dataSource) =>
        inTransaction(dataSource, async (manager) => {
          const before = await administratorsMayApprove(manager);
          if (before === allowed) return 'unchanged';
          if (!allowed) {
            const both = await peopleHoldingBoth(manager);
            if (both.length)
              throw new CliExit(
                1,
                `${both.join(', ')} hold${both.length === 1 ? 's' : ''} both roles; remove one of them first`,
              );
          }
          await setAdministratorsMayApprove(manager, allowed);
          await appendLedgerEvent(manager, {
            actor: { id: null, name: `command line (${userInfo().username})`, role: null },
            action: 'organisation.setting-changed',
            entity: { type: 'organisation', id: null },
            before: { administratorsMayApprove: before },
            after: { administratorsMayApprove: allowed },
            reason: options.reason.trim(),
          });
          return 'changed';
        }),
      );
      process.stdout.write(
        outcome === 'unchanged'
          ? `administrators may ${allowed ? '' : 'not '}also be QA approvers already\n`
          : `administrators may ${allowed ? 'now' : 'no longer'} also be QA approvers\n`,
      );
    });
  organisation
    .command('time-zone')
    .description(
      "set the plant's time zone (an IANA name such as Europe/London); every date and time people read is on its clock",
    )
    .argument('<zone>', 'IANA time zone name')
    .requiredOption('--reason <text>', 'why, kept in the audit trail')
    .action(async (zone: string, options: { reason: string }) => {
      if (!isTimeZone(zone))
        throw new CliExit(2, `${zone} is not an IANA time zone name (for example Europe/London or America/Chicago)`);
      if (options.reason.trim().length < 3) throw new CliExit(2, 'give a reason of at least 3 characters');
      const before = await withDatabase((dataSource) =>
        inTransaction(dataSource, async (manager) => {
          const previous = await setPlantTimeZone(manager, zone);
          if (previous !== zone) {
            await appendLedgerEvent(manager, {
              actor: { id: null, name: `command line (${userInfo().username})`, role: null },
              action: 'organisation.setting-changed',
              entity: { type: 'organisation', id: null },
              before: { timeZone: previous },
              after: { timeZone: zone },
              reason: options.reason.trim(),
            });
          }
          return previous;
        }),
      );
      process.stdout.write(
        before === zone
          ? `the plant's time zone is ${zone} already\n`
          : `the plant's time zone is now ${zone} (was ${before})\n`,
      );
    });
  return organisation;
}
