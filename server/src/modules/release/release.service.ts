import { createHash } from 'node:crypto';
import { lotAuditTrail } from './audit-trail';
import type { DataSource } from 'typeorm';
import { contentHash } from '@shared/domain/signatures';
import type { Person } from '@shared/schemas/people';
import { labelMovementSchema, type LabelMovement, type ReleaseQueueQuery } from '@shared/schemas/release';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, sha256Hex, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import { signaturesFor } from '../signatures/signatures.repository';
import { releaseDossier, releaseDossierIn } from './release-dossier';
import { packetData, renderReleasePacket } from './release-packet';
import { queueReleaseMail } from './release-mails';
import type { ReleaseQueuePage } from '@shared/schemas/release';

/** The lot's readiness checklist, its dossier and where it stands in the release workflow. */
export async function releaseView(dataSource: DataSource, lotId: number) {
  const [lot] = await dataSource.query('SELECT id FROM production_lot WHERE id = ?', [lotId]);
  if (!lot) throw AppError.notFound('Lot');
  const dossier = await releaseDossier(dataSource, lotId);
  const hash = contentHash(dossier.content, sha256Hex);
  const submissions: Array<{ id: number; submitted_at: Date; outcome: string; dossier_hash: string; name: string }> =
    await dataSource.query(
      'SELECT r.id, r.submitted_at, r.outcome, r.dossier_hash, p.name FROM release_submission r JOIN person p ON p.id = r.submitted_by WHERE r.lot_id = ? ORDER BY r.id DESC',
      [lotId],
    );
  const signatures = await signaturesFor(dataSource.manager, 'lot-release', String(lotId));
  return {
    lotId,
    lotNumber: dossier.lot.lotNumber,
    status: dossier.lot.status,
    readiness: dossier.readiness,
    dossier: dossier.content,
    dossierHash: hash,
    submissions: submissions.map((row) => ({
      id: row.id,
      submittedAt: new Date(row.submitted_at).toISOString(),
      submittedBy: row.name,
      outcome: row.outcome,
      changedSinceSubmission: row.outcome === 'pending' && row.dossier_hash !== hash,
    })),
    reviewedCurrent: signatures.some((row) => row.meaning === 'reviewed' && row.content_hash === hash),
    auditTrail: await lotAuditTrail(dataSource.manager, lotId, dossier.lineage),
  };
}

/** An engineer puts a ready lot forward for QA review; the dossier's hash is kept with the submission. */
export async function submitForRelease(
  dataSource: DataSource,
  lotId: number,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
) {
  return inTransaction(dataSource, async (manager) => {
    const [lot]: Array<{ id: number; lot_number: string; status: string }> = await manager.query(
      'SELECT id, lot_number, status FROM production_lot WHERE id = ? FOR UPDATE',
      [lotId],
    );
    if (!lot) throw AppError.notFound('Lot');
    if (lot.status !== 'open')
      throw AppError.rule(`Lot ${lot.lot_number} is ${lot.status}; only an open lot can be submitted`, {
        lot: lot.status,
      });
    const dossier = await releaseDossierIn(manager, lotId);
    const failing = dossier.readiness.items.filter((item) => item.verdict === 'fail');
    if (failing.length) {
      throw AppError.rule(
        `Lot ${lot.lot_number} is not ready for release: ${failing.map((item) => `${item.title.toLowerCase()} (${item.why})`).join('; ')}`,
        Object.fromEntries(failing.map((item) => [item.key, item.why])),
      );
    }
    const hash = contentHash(dossier.content, sha256Hex);
    await manager.query('INSERT INTO release_submission (lot_id, submitted_by, dossier_hash) VALUES (?, ?, ?)', [
      lotId,
      person.id,
      hash,
    ]);
    await manager.query("UPDATE production_lot SET status = 'submitted' WHERE id = ?", [lotId]);
    await queueReleaseMail(manager, lotId, 'submitted');
    await appendLedgerEvent(manager, {
      actor,
      action: 'lot.submitted-for-release',
      entity: { type: 'lot', id: lotId },
      before: { status: 'open' },
      after: { status: 'submitted', dossierHash: hash },
      origin,
    });
    return { lotId, status: 'submitted' as const, dossierHash: hash };
  });
}

/** Labels printed for a lot, or spoiled ones voided; the net count must match the units to release. */
export async function recordLabels(
  dataSource: DataSource,
  lotId: number,
  raw: LabelMovement,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
) {
  const input = labelMovementSchema.parse(raw);
  return inTransaction(dataSource, async (manager) => {
    const [lot]: Array<{ lot_number: string; status: string }> = await manager.query(
      'SELECT lot_number, status FROM production_lot WHERE id = ? FOR UPDATE',
      [lotId],
    );
    if (!lot) throw AppError.notFound('Lot');
    if (lot.status !== 'open')
      throw AppError.rule(`Lot ${lot.lot_number} is ${lot.status}; labels are counted before submission`, {
        qty: lot.status,
      });
    const [counts]: Array<{ printed: string | null; voided: string | null }> = await manager.query(
      "SELECT SUM(CASE kind WHEN 'print' THEN qty ELSE 0 END) AS printed, SUM(CASE kind WHEN 'void' THEN qty ELSE 0 END) AS voided FROM label_print WHERE lot_id = ?",
      [lotId],
    );
    const net = Number(counts?.printed ?? 0) - Number(counts?.voided ?? 0);
    if (input.kind === 'void' && input.qty > net)
      throw AppError.rule(`Only ${net} labels are out for lot ${lot.lot_number}`, { qty: `At most ${net}` });
    await manager.query('INSERT INTO label_print (lot_id, kind, qty, reason, recorded_by) VALUES (?, ?, ?, ?, ?)', [
      lotId,
      input.kind,
      input.qty,
      input.reason ?? null,
      person.id,
    ]);
    await appendLedgerEvent(manager, {
      actor,
      action: input.kind === 'print' ? 'lot.labels-printed' : 'lot.labels-voided',
      entity: { type: 'lot', id: lotId },
      after: { ...input, netLabels: net + (input.kind === 'print' ? input.qty : -input.qty) },
      reason: input.reason ?? null,
      origin,
    });
    return { netLabels: net + (input.kind === 'print' ? input.qty : -input.qty) };
  });
}

const queueStatuses = { review: 'submitted', approval: 'reviewed', released: 'released', returned: 'open' } as const;

const returnedClause =
  "AND EXISTS (SELECT 1 FROM release_submission r WHERE r.lot_id = l.id AND r.outcome = 'returned')";

/** Lots waiting at each step of the release workflow, oldest submission first, with the count of every queue. */
export async function releaseQueue(dataSource: DataSource, query: ReleaseQueueQuery): Promise<ReleaseQueuePage> {
  const status = queueStatuses[query.queue];
  const returned = query.queue === 'returned' ? returnedClause : '';
  const [byStatus, [returnedCount]]: [Array<{ status: string; total: string }>, Array<{ total: string }>] =
    await Promise.all([
      dataSource.query(
        "SELECT status, COUNT(*) AS total FROM production_lot WHERE status IN ('submitted', 'reviewed', 'released') GROUP BY status",
      ),
      dataSource.query(`SELECT COUNT(*) AS total FROM production_lot l WHERE l.status = 'open' ${returnedClause}`),
    ]);
  const countOf = (wanted: string) => Number(byStatus.find((row) => row.status === wanted)?.total ?? 0);
  const counts = {
    review: countOf('submitted'),
    approval: countOf('reviewed'),
    released: countOf('released'),
    returned: Number(returnedCount?.total ?? 0),
  };
  const rows: Array<{
    id: number;
    lot_number: string;
    part_number: string;
    revision: string;
    released_qty: number;
    submitted_at: Date | null;
    submitted_by: string | null;
    reviewed_by: string | null;
    reviewed_at: Date | null;
  }> = await dataSource.query(
    `SELECT l.id, l.lot_number, p.part_number, p.revision, l.released_qty,
            (SELECT MAX(r.submitted_at) FROM release_submission r WHERE r.lot_id = l.id) AS submitted_at,
            (SELECT person.name FROM release_submission r JOIN person ON person.id = r.submitted_by WHERE r.lot_id = l.id ORDER BY r.id DESC LIMIT 1) AS submitted_by,
            (SELECT s.signer_name FROM electronic_signature s WHERE s.record_type = 'lot-release' AND s.record_id = CAST(l.id AS CHAR) AND s.meaning = 'reviewed' ORDER BY s.id DESC LIMIT 1) AS reviewed_by,
            (SELECT s.signed_at FROM electronic_signature s WHERE s.record_type = 'lot-release' AND s.record_id = CAST(l.id AS CHAR) AND s.meaning = 'reviewed' ORDER BY s.id DESC LIMIT 1) AS reviewed_at
       FROM production_lot l JOIN part p ON p.id = l.part_id WHERE l.status = ? ${returned}
      ORDER BY submitted_at ${query.queue === 'released' ? 'DESC' : 'ASC'}, l.id LIMIT ? OFFSET ?`,
    [status, query.pageSize, (query.page - 1) * query.pageSize],
  );
  return {
    items: rows.map((row) => ({
      lotId: row.id,
      lotNumber: row.lot_number,
      part: `${row.part_number} rev ${row.revision}`,
      releasedQty: row.released_qty,
      submittedAt: row.submitted_at ? new Date(row.submitted_at).toISOString() : null,
      submittedBy: row.submitted_by,
      reviewedBy: row.reviewed_by,
      reviewedAt: row.reviewed_at ? new Date(row.reviewed_at).toISOString() : null,
    })),
    total: counts[query.queue],
    page: query.page,
    pageSize: query.pageSize,
    counts,
  };
}

/**
 * The lot's release packet: rendered once from the released record and stored; later requests
 * return the stored bytes. Rendering again from the same data gives the same bytes.
 */
export async function releasePacket(
  dataSource: DataSource,
  lotId: number,
  publicUrl: string,
): Promise<{ lotNumber: string; sha256: string; content: Buffer; created: boolean }> {
  const [lot]: Array<{ lot_number: string; status: string }> = await dataSource.query(
    'SELECT lot_number, status FROM production_lot WHERE id = ?',
    [lotId],
  );
  if (!lot) throw AppError.notFound('Lot');
  if (lot.status !== 'released')
    throw AppError.rule(`Lot ${lot.lot_number} is ${lot.status}; a release packet exists only for a released lot`);
  const [submission]: Array<{ id: number }> = await dataSource.query(
    "SELECT id FROM release_submission WHERE lot_id = ? AND outcome = 'released' ORDER BY id DESC LIMIT 1",
    [lotId],
  );
  if (!submission) throw AppError.rule(`Lot ${lot.lot_number} has no released submission`);
  const stored = async () => {
    const [row]: Array<{ sha256: string; content: Buffer }> = await dataSource.query(
      'SELECT sha256, content FROM release_packet WHERE submission_id = ?',
      [submission.id],
    );
    return row ?? null;
  };
  const existing = await stored();
  if (existing)
    return { lotNumber: lot.lot_number, sha256: existing.sha256, content: existing.content, created: false };
  const content = await renderReleasePacket(await packetData(dataSource.manager, lotId, publicUrl));
  const sha256 = createHash('sha256').update(content).digest('hex');
  await inTransaction(dataSource, async (manager) => {
    const result: { affectedRows: number } = await manager.query(
      'INSERT IGNORE INTO release_packet (lot_id, submission_id, sha256, content) VALUES (?, ?, ?, ?)',
      [lotId, submission.id, sha256, content],
    );
    if (result.affectedRows === 1) {
      await appendLedgerEvent(manager, {
        actor: { id: null, name: 'Ingotrace', role: null },
        action: 'lot.release-packet-stored',
        entity: { type: 'lot', id: lotId },
        after: { sha256, bytes: content.length },
        reason: null,
      });
    }
  });
  const kept = (await stored())!;
  return { lotNumber: lot.lot_number, sha256: kept.sha256, content: kept.content, created: kept.sha256 === sha256 };
}
