import type { DataSource } from 'typeorm';
import { readBulkLines } from '@shared/domain/trace/bulk-lines';
import type { BulkTraceReply } from '@shared/schemas/bulk-trace';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, sha256Hex, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import { lotsNumbered, openRecallScopes } from './bulk-trace.repository';

/**
 * A list of UDIs or lot numbers traced in one step: each line found (with its lot, status, hold,
 * open recall and heats), unknown, or malformed with the reason. Looked up set-based.
 */
export async function bulkTrace(
  dataSource: DataSource,
  text: string,
  actor: Actor,
  origin: RequestOrigin,
): Promise<BulkTraceReply> {
  const { lines, tooMany } = readBulkLines(text);
  if (tooMany) throw AppError.rule('Trace at most 100,000 lines at once; split the list', { lines: 'Too many lines' });
  if (!lines.length)
    throw AppError.rule('Give at least one UDI or lot number, one a line', { lines: 'Nothing to trace' });
  const wanted = [...new Set(lines.flatMap((line) => (line.kind === 'malformed' ? [] : [line.lot])))];
  const byNumber = new Map((await lotsNumbered(dataSource.manager, wanted)).map((row) => [row.lot_number, row]));
  const recallsOf = new Map<number, string[]>();
  for (const scope of await openRecallScopes(dataSource.manager))
    for (const lotId of scope.lot_ids) recallsOf.set(lotId, [...(recallsOf.get(lotId) ?? []), scope.recall_number]);
  const results: BulkTraceReply['lines'] = lines.map((line) => {
    if (line.kind === 'malformed')
      return { line: line.line, input: line.input, outcome: 'malformed', reason: line.reason };
    const candidate = byNumber.get(line.lot);
    // A UDI names a lot only under its own part's GTIN.
    const lot = candidate && (line.kind === 'lot' || candidate.gtin === line.gtin) ? candidate : undefined;
    if (!lot)
      return {
        line: line.line,
        input: line.input,
        outcome: 'unknown',
        reason: line.kind === 'udi' ? 'No lot with this GTIN and lot number' : 'No lot with this number',
      };
    return {
      line: line.line,
      input: line.input,
      outcome: 'found',
      lot: {
        id: lot.id,
        lotNumber: lot.lot_number,
        partNumber: lot.part_number,
        gtin: lot.gtin,
        status: lot.status,
        onHold: Number(lot.held) === 1,
        openRecalls: recallsOf.get(lot.id) ?? [],
        heats: lot.heats ? lot.heats.split(' ') : [],
      },
    };
  });
  const count = (outcome: string) => results.filter((result) => result.outcome === outcome).length;
  const summary = {
    lines: results.length,
    found: count('found'),
    unknown: count('unknown'),
    malformed: count('malformed'),
    onHold: results.filter((result) => result.outcome === 'found' && result.lot.onHold).length,
    inOpenRecall: results.filter((result) => result.outcome === 'found' && result.lot.openRecalls.length).length,
  };
  await inTransaction(dataSource, (manager) =>
    appendLedgerEvent(manager, {
      actor,
      action: 'trace.bulk',
      entity: { type: 'trace', id: null },
      after: { ...summary, listSha256: sha256Hex(text) },
      origin,
    }),
  );
  return { summary, lines: results };
}
