import type { DataSource } from 'typeorm';
import { epcisDocument } from '@shared/domain/trace/epcis';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, sha256Hex, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import { linkTo } from '../mail/links';
import { findLot } from '../manufacturing/production-lot.repository';
import { findOrganisation } from '../organisation/organisation.repository';
import { latestScope } from '../recall/field-action.service';
import { findRecallRow } from '../recall/recall.repository';
import { epcisFacts } from './epcis.repository';
import { ancestorLots } from './genealogy.repository';

interface Exported {
  body: string;
  fileName: string;
}

async function build(dataSource: DataSource, lotIds: number[]): Promise<string> {
  const organisation = await findOrganisation(dataSource);
  const facts = await epcisFacts(dataSource.manager, lotIds);
  const document = epcisDocument(
    { base: linkTo('/'), timeZone: organisation?.timeZone ?? 'UTC', ...facts },
    new Date(),
  );
  return JSON.stringify(document, null, 2);
}

async function record(
  dataSource: DataSource,
  event: { action: string; entity: { type: string; id: number }; lots: number; body: string },
  actor: Actor,
  origin: RequestOrigin,
) {
  await inTransaction(dataSource, (manager) =>
    appendLedgerEvent(manager, {
      actor,
      action: event.action,
      entity: event.entity,
      after: { format: 'EPCIS 2.0 JSON-LD', lots: event.lots, sha256: sha256Hex(event.body) },
      origin,
    }),
  );
}

/** A recall's affected set as last traced, as EPCIS 2.0, for a consignee's or distributor's system. */
export async function recallEpcis(
  dataSource: DataSource,
  recallId: number,
  actor: Actor,
  origin: RequestOrigin,
): Promise<Exported> {
  const recall = await findRecallRow(dataSource.manager, recallId);
  if (!recall) throw AppError.notFound('Recall investigation');
  const scope = await latestScope(dataSource.manager, recallId);
  const lotIds = scope.lots.map((lot) => lot.id);
  const body = await build(dataSource, lotIds);
  await record(
    dataSource,
    { action: 'recall.epcis-exported', entity: { type: 'recall', id: recallId }, lots: lotIds.length, body },
    actor,
    origin,
  );
  return { body, fileName: `${recall.recall_number}-epcis.jsonld` };
}

/** A lot and every lot its units came from, as EPCIS 2.0. */
export async function lotEpcis(
  dataSource: DataSource,
  lotId: number,
  actor: Actor,
  origin: RequestOrigin,
): Promise<Exported> {
  const lot = await findLot(dataSource.manager, lotId);
  if (!lot) throw AppError.notFound('Lot');
  const lotIds = await ancestorLots(dataSource.manager, [lotId]);
  const body = await build(dataSource, lotIds);
  await record(
    dataSource,
    { action: 'lot.epcis-exported', entity: { type: 'lot', id: lotId }, lots: lotIds.length, body },
    actor,
    origin,
  );
  return { body, fileName: `${lot.lotNumber}-genealogy-epcis.jsonld` };
}
