import type { z } from 'zod';
import type { DataSource, EntityManager } from 'typeorm';
import {
  dispositionInputSchema,
  nonconformanceInputSchema,
  type NonconformanceListQuery,
} from '@shared/schemas/manufacturing';
import type { Person } from '@shared/schemas/people';
import { AppError } from '../../errors';
import { changeLotStatus, lockLot } from './production-lot.repository';
import { closePendingSubmission } from '../release/release.repository';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import type { SignableRecordType } from '../signatures/signable-records';
import {
  findNonconformance,
  insertNonconformance,
  listNonconformanceRows,
  setDisposition,
  setNonconformanceStatus,
  subjectExists,
} from './nonconformances.repository';

export async function listNonconformances(dataSource: DataSource, query: NonconformanceListQuery) {
  const { items, total } = await listNonconformanceRows(dataSource.manager, query);
  return { items: items.map(({ raisedById: _by, ...nc }) => nc), total, page: query.page, pageSize: query.pageSize };
}

export async function nonconformanceDetail(dataSource: DataSource, id: number) {
  const nc = await findNonconformance(dataSource.manager, id);
  if (!nc) throw AppError.notFound('Nonconformance');
  const { raisedById: _by, ...rest } = nc;
  return rest;
}

export async function raiseNonconformance(
  dataSource: DataSource,
  input: z.output<typeof nonconformanceInputSchema>,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
) {
  const id = await inTransaction(dataSource, async (manager) => {
    if (!(await subjectExists(manager, input.subjectType, input.subjectId)))
      throw AppError.rule(`No ${input.subjectType} with id ${input.subjectId}`, { subjectId: 'Unknown record' });
    const nc = await insertNonconformance(manager, {
      subjectType: input.subjectType,
      subjectId: input.subjectId,
      lotId: input.subjectType === 'lot' ? input.subjectId : null,
      runId: input.subjectType === 'process-run' ? input.subjectId : null,
      source: 'raised',
      description: input.description,
      containment: input.containment,
      raisedBy: person.id,
    });
    await appendLedgerEvent(manager, {
      actor,
      action: 'nonconformance.raised',
      entity: { type: 'nonconformance', id: nc.id },
      after: { ncNumber: nc.ncNumber, ...input },
      origin,
    });
    return nc.id;
  });
  return nonconformanceDetail(dataSource, id);
}

/** The QA approver states the disposition before signing it; it can change until it is signed. */
export async function proposeDisposition(
  dataSource: DataSource,
  id: number,
  input: z.output<typeof dispositionInputSchema>,
  actor: Actor,
  origin: RequestOrigin,
) {
  await inTransaction(dataSource, async (manager) => {
    const nc = await findNonconformance(manager, id, true);
    if (!nc) throw AppError.notFound('Nonconformance');
    if (nc.status !== 'open')
      throw AppError.rule(`${nc.ncNumber} is ${nc.status}; its disposition is signed`, {
        disposition: 'Already signed',
      });
    await setDisposition(manager, id, input.disposition, input.note);
    await appendLedgerEvent(manager, {
      actor,
      action: 'nonconformance.disposition-proposed',
      entity: { type: 'nonconformance', id },
      before: { disposition: nc.disposition, note: nc.dispositionNote },
      after: input,
      origin,
    });
  });
  return nonconformanceDetail(dataSource, id);
}

/**
 * A lot whose own nonconformance is dispositioned Scrap may never be released: it becomes
 * Rejected (terminal), and a release submission still pending ends with it. A released lot is
 * left as it is; its units in the field are a matter for a recall investigation.
 */
async function rejectScrappedLot(manager: EntityManager, ncId: number, actor: Actor, reason: string | null) {
  const nc = await findNonconformance(manager, ncId);
  if (!nc || nc.disposition !== 'scrap' || nc.subjectType !== 'lot') return;
  const lot = await lockLot(manager, nc.subjectId);
  if (!lot || lot.status === 'released' || lot.status === 'rejected') return;
  await changeLotStatus(manager, nc.subjectId, 'reject');
  await closePendingSubmission(manager, nc.subjectId, 'returned');
  await appendLedgerEvent(manager, {
    actor,
    action: 'lot.rejected',
    entity: { type: 'lot', id: nc.subjectId },
    before: { status: lot.status },
    after: { status: 'rejected', nonconformance: nc.ncNumber, disposition: 'scrap' },
    reason,
  });
}

/**
 * A nonconformance's disposition and its closure are each an electronic signature by a QA
 * approver who did not raise it; closing needs the disposition signed first and a reason.
 */
export const nonconformanceRecordType: SignableRecordType<{ status: string; content: { disposition: string | null } }> =
  {
    type: 'nonconformance',
    label: 'nonconformance',
    action: 'nonconformances.disposition',
    readAction: 'lots.read',
    meanings: ['dispositioned', 'closed'],
    async load(manager, recordId) {
      if (!/^\d{1,10}$/.test(recordId)) return null;
      const nc = await findNonconformance(manager, Number(recordId));
      if (!nc) return null;
      return {
        title: `${nc.ncNumber}: ${nc.subjectLabel}`,
        content: {
          nonconformance: nc.ncNumber,
          subject: nc.subjectLabel,
          lot: nc.lotNumber,
          run: nc.runNumber,
          description: nc.description,
          containment: nc.containment,
          disposition: nc.disposition,
          dispositionNote: nc.dispositionNote,
        },
        authorIds: [nc.raisedById],
        status: nc.status,
      };
    },
    refusal({ meaning, record }) {
      const facts = record;
      if (meaning === 'dispositioned') {
        if (facts.status !== 'open') return `The nonconformance is already ${facts.status}`;
        if (!facts.content.disposition) return 'State the disposition before signing it';
      }
      if (meaning === 'closed' && facts.status !== 'dispositioned')
        return facts.status === 'closed'
          ? 'The nonconformance is already closed'
          : 'Sign the disposition before closing the nonconformance';
      return null;
    },
    async afterSign(manager, { recordId, meaning, signer, reason }) {
      const status = meaning === 'dispositioned' ? 'dispositioned' : meaning === 'closed' ? 'closed' : null;
      if (!status) return;
      await setNonconformanceStatus(manager, Number(recordId), status);
      await appendLedgerEvent(manager, {
        actor: { id: signer.id, name: signer.name, role: signer.role },
        action: `nonconformance.${status}`,
        entity: { type: 'nonconformance', id: Number(recordId) },
        after: { status },
        reason,
      });
      if (status === 'dispositioned')
        await rejectScrappedLot(
          manager,
          Number(recordId),
          { id: signer.id, name: signer.name, role: signer.role },
          reason,
        );
    },
  };
