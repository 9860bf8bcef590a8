import type { z } from 'zod';
import { createHash } from 'node:crypto';
import { lotAuditTrail } from './audit-trail';
import type { DataSource } from 'typeorm';
import { contentHash } from '@shared/domain/signatures';
import type { Person } from '@shared/schemas/people';
import { labelMovementSchema, type ReleaseQueueQuery } from '@shared/schemas/release';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, sha256Hex, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import { signaturesFor } from '../signatures/signatures.repository';
import { releaseDossier, releaseDossierIn } from './release-dossier';
import { packetData, renderReleasePacket } from './release-packet';
import { queueReleaseMail } from './release-mails';
import type { ReleaseQueuePage } from '@shared/schemas/release';
import { changeLotStatus, findLot, lockLot } from '../manufacturing/production-lot.repository';
import {
  addLabelMovement,
  addSubmission,
  labelCounts,
  releasedSubmissionId,
  releaseQueueCounts,
  releaseQueueRows,
  storedPacket,
  storePacketOnce,
  submissionsOf,
} from './release.repository';

/** The lot's readiness checklist, its dossier and where it stands in the release workflow. */
export async function releaseView(dataSource: DataSource, lotId: number) {
  if (!(await findLot(dataSource.manager, lotId))) throw AppError.notFound('Lot');
  const dossier = await releaseDossier(dataSource, lotId);
  const hash = contentHash(dossier.content, sha256Hex);
  const submissions = await submissionsOf(dataSource.manager, lotId);
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
      submittedAt: row.submittedAt.toISOString(),
      submittedBy: row.submittedBy,
      outcome: row.outcome,
      changedSinceSubmission: row.outcome === 'pending' && row.dossierHash !== hash,
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
    const lot = await lockLot(manager, lotId);
    if (!lot) throw AppError.notFound('Lot');
    if (lot.status !== 'open')
      throw AppError.rule(`Lot ${lot.lotNumber} is ${lot.status}; only an open lot can be submitted`, {
        lot: lot.status,
      });
    const dossier = await releaseDossierIn(manager, lotId);
    const failing = dossier.readiness.items.filter((item) => item.verdict === 'fail');
    if (failing.length) {
      throw AppError.rule(
        `Lot ${lot.lotNumber} is not ready for release: ` +
          `${failing.map((item) => `${item.title.toLowerCase()} (${item.why})`).join('; ')}`,
        Object.fromEntries(failing.map((item) => [item.key, item.why])),
      );
    }
    const hash = contentHash(dossier.content, sha256Hex);
    await addSubmission(manager, { lotId, submittedBy: person.id, dossierHash: hash });
    await changeLotStatus(manager, lotId, 'submit-for-release');
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
  input: z.output<typeof labelMovementSchema>,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
) {
  return inTransaction(dataSource, async (manager) => {
    const lot = await lockLot(manager, lotId);
    if (!lot) throw AppError.notFound('Lot');
    if (lot.status !== 'open')
      throw AppError.rule(`Lot ${lot.lotNumber} is ${lot.status}; labels are counted before submission`, {
        qty: lot.status,
      });
    const counts = await labelCounts(manager, lotId);
    const net = counts.printed - counts.voided;
    if (input.kind === 'void' && input.qty > net)
      throw AppError.rule(`Only ${net} labels are out for lot ${lot.lotNumber}`, { qty: `At most ${net}` });
    await addLabelMovement(manager, {
      lotId,
      kind: input.kind,
      qty: input.qty,
      reason: input.reason ?? null,
      recordedBy: person.id,
    });
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

/** Lots waiting at each step of the release workflow, oldest submission first, with the count of every queue. */
export async function releaseQueue(dataSource: DataSource, query: ReleaseQueueQuery): Promise<ReleaseQueuePage> {
  const [counts, rows] = await Promise.all([
    releaseQueueCounts(dataSource.manager),
    releaseQueueRows(dataSource.manager, query),
  ]);
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
  const lot = await findLot(dataSource.manager, lotId);
  if (!lot) throw AppError.notFound('Lot');
  if (lot.status !== 'released')
    throw AppError.rule(`Lot ${lot.lotNumber} is ${lot.status}; a release packet exists only for a released lot`);
  const submissionId = await releasedSubmissionId(dataSource.manager, lotId);
  if (submissionId === null) throw AppError.rule(`Lot ${lot.lotNumber} has no released submission`);
  const stored = () => storedPacket(dataSource.manager, submissionId);
  const existing = await stored();
  if (existing) return { lotNumber: lot.lotNumber, sha256: existing.sha256, content: existing.content, created: false };
  const content = await renderReleasePacket(await packetData(dataSource.manager, lotId, publicUrl));
  const sha256 = createHash('sha256').update(content).digest('hex');
  await inTransaction(dataSource, async (manager) => {
    if (await storePacketOnce(manager, { lotId, submissionId, sha256, content })) {
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
  return { lotNumber: lot.lotNumber, sha256: kept.sha256, content: kept.content, created: kept.sha256 === sha256 };
}
