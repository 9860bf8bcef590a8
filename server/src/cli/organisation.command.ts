import { Command } from 'commander';
import { userInfo } from 'node:os';
import { inTransaction } from '../db/transaction';
import { appendLedgerEvent } from '../modules/ledger/ledger.repository';
import { administratorsMayApprove, peopleHoldingBoth, setAdministratorsMayApprove } from '../modules/people/role-change-requests.repository';
import { CliExit } from './cli-exit';
import { withDatabase } from './cli-database';

/**
 * `ingotrace organisation administrators-may-approve yes|no --reason R`: whether a person may hold
 * Administrator and QA approver together (no by default). Run by whoever operates the server, not
 * from a screen an administrator could use on himself; every change is an audit trail event.
 */
export function organisationCommand(): Command {
  const organisation = new Command('organisation').description('organisation settings that shape separation of duties');
  organisation
    .command('administrators-may-approve')
    .description('allow (yes) or refuse (no) one person holding Administrator and QA approver together; shown on the people screen')
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
            if (both.length) throw new CliExit(1, `${both.join(', ')} hold${both.length === 1 ? 's' : ''} both roles; remove one of them first`);
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
      process.stdout.write(outcome === 'unchanged' ? `administrators may ${allowed ? '' : 'not '}also be QA approvers already\n` : `administrators may ${allowed ? 'now' : 'no longer'} also be QA approvers\n`);
    });
  return organisation;
}
