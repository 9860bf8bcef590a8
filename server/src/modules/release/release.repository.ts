import type { EntityManager } from 'typeorm';
import type { ReleaseQueueQuery } from '@shared/schemas/release';
import { LabelPrint } from './entities/label-print.entity';
import { ReleasePacket } from './entities/release-packet.entity';
import { ReleaseSubmission } from './entities/release-submission.entity';

export interface SubmissionLine {
  id: number;
  submittedAt: Date;
  submittedBy: string;
  outcome: ReleaseSubmission['outcome'];
  dossierHash: string;
}

/** A lot's release submissions, newest first, with who submitted each. */
export async function submissionsOf(manager: EntityManager, lotId: number): Promise<SubmissionLine[]> {
  const rows = await manager.getRepository(ReleaseSubmission).find({
    where: { lotId },
    relations: { submittedByPerson: true },
    order: { id: 'DESC' },
  });
  return rows.map((row) => ({
    id: row.id,
    submittedAt: row.submittedAt,
    submittedBy: row.submittedByPerson!.name,
    outcome: row.outcome,
    dossierHash: row.dossierHash,
  }));
}

/** Who put the lot forward last, for the mails about its review. */
export async function lastSubmitter(
  manager: EntityManager,
  lotId: number,
): Promise<{ email: string; name: string } | null> {
  const row = await manager.getRepository(ReleaseSubmission).findOne({
    where: { lotId },
    relations: { submittedByPerson: true },
    order: { id: 'DESC' },
  });
  return row ? { email: row.submittedByPerson!.email, name: row.submittedByPerson!.name } : null;
}

export async function addSubmission(
  manager: EntityManager,
  submission: { lotId: number; submittedBy: number; dossierHash: string },
): Promise<void> {
  await manager.getRepository(ReleaseSubmission).insert(submission);
}

/** Ends the lot's pending submission (if any) with the outcome of the review. */
export async function closePendingSubmission(
  manager: EntityManager,
  lotId: number,
  outcome: 'released' | 'returned',
): Promise<void> {
  await manager
    .getRepository(ReleaseSubmission)
    .update({ lotId, outcome: 'pending' }, { outcome, closedAt: new Date() });
}

export async function releasedSubmissionId(manager: EntityManager, lotId: number): Promise<number | null> {
  const row = await manager
    .getRepository(ReleaseSubmission)
    .findOne({ select: { id: true }, where: { lotId, outcome: 'released' }, order: { id: 'DESC' } });
  return row?.id ?? null;
}

/** Labels printed and voided for a lot, in units. */
export async function labelCounts(manager: EntityManager, lotId: number): Promise<{ printed: number; voided: number }> {
  const row = await manager
    .getRepository(LabelPrint)
    .createQueryBuilder('label')
    .select("COALESCE(SUM(CASE label.kind WHEN 'print' THEN label.qty ELSE 0 END), 0)", 'printed')
    .addSelect("COALESCE(SUM(CASE label.kind WHEN 'void' THEN label.qty ELSE 0 END), 0)", 'voided')
    .where('label.lotId = :lotId', { lotId })
    .getRawOne<{ printed: string | number; voided: string | number }>();
  return { printed: Number(row?.printed ?? 0), voided: Number(row?.voided ?? 0) };
}

export async function addLabelMovement(
  manager: EntityManager,
  movement: { lotId: number; kind: 'print' | 'void'; qty: number; reason: string | null; recordedBy: number },
): Promise<void> {
  await manager.getRepository(LabelPrint).insert(movement);
}

export function storedPacket(manager: EntityManager, submissionId: number) {
  return manager
    .getRepository(ReleasePacket)
    .findOne({ select: { sha256: true, content: true }, where: { submissionId } });
}

/** Stores the packet unless one is stored for the submission already; true when this call stored it. */
export async function storePacketOnce(
  manager: EntityManager,
  packet: { lotId: number; submissionId: number; sha256: string; content: Buffer },
): Promise<boolean> {
  const result = await manager
    .getRepository(ReleasePacket)
    .createQueryBuilder()
    .insert()
    .values(packet)
    .orIgnore()
    // Without RETURNING, MariaDB's own count of rows written tells whether the row is new.
    .updateEntity(false)
    .execute();
  return (result.raw as { affectedRows: number }).affectedRows === 1;
}

/** The lot status each release desk tab lists. */
const queueStatuses = { review: 'submitted', approval: 'reviewed', released: 'released', returned: 'open' } as const;

const returnedClause =
  "AND EXISTS (SELECT 1 FROM release_submission r WHERE r.lot_id = l.id AND r.outcome = 'returned')";

/** How many lots wait in each release desk tab. */
export async function releaseQueueCounts(manager: EntityManager): Promise<Record<ReleaseQueueQuery['queue'], number>> {
  const [byStatus, [returned]]: [Array<{ status: string; total: string }>, Array<{ total: string }>] =
    await Promise.all([
      manager.query(
        "SELECT status, COUNT(*) AS total FROM production_lot WHERE status IN ('submitted', 'reviewed', " +
          "'released') GROUP BY status",
      ),
      manager.query(`SELECT COUNT(*) AS total FROM production_lot l WHERE l.status = 'open' ${returnedClause}`),
    ]);
  const countOf = (wanted: string) => Number(byStatus.find((row) => row.status === wanted)?.total ?? 0);
  return {
    review: countOf('submitted'),
    approval: countOf('reviewed'),
    released: countOf('released'),
    returned: Number(returned?.total ?? 0),
  };
}

export interface ReleaseQueueRow {
  id: number;
  lot_number: string;
  part_number: string;
  revision: string;
  released_qty: number;
  submitted_at: Date | null;
  submitted_by: string | null;
  reviewed_by: string | null;
  reviewed_at: Date | null;
}

/** One page of a release desk tab, oldest submission first (newest first for released lots). */
export function releaseQueueRows(manager: EntityManager, query: ReleaseQueueQuery): Promise<ReleaseQueueRow[]> {
  const returned = query.queue === 'returned' ? returnedClause : '';
  const lastReview = (column: string) =>
    `(SELECT s.${column} FROM electronic_signature s WHERE s.record_type = 'lot-release'
         AND s.record_id = CAST(l.id AS CHAR) AND s.meaning = 'reviewed' ORDER BY s.id DESC LIMIT 1)`;
  return manager.query(
    `SELECT l.id, l.lot_number, p.part_number, p.revision, l.released_qty,
            (SELECT MAX(r.submitted_at) FROM release_submission r WHERE r.lot_id = l.id) AS submitted_at,
            (SELECT person.name FROM release_submission r JOIN person ON person.id = r.submitted_by
              WHERE r.lot_id = l.id ORDER BY r.id DESC LIMIT 1) AS submitted_by,
            ${lastReview('signer_name')} AS reviewed_by,
            ${lastReview('signed_at')} AS reviewed_at
       FROM production_lot l JOIN part p ON p.id = l.part_id WHERE l.status = ? ${returned}
      ORDER BY submitted_at ${query.queue === 'released' ? 'DESC' : 'ASC'}, l.id LIMIT ? OFFSET ?`,
    [queueStatuses[query.queue], query.pageSize, (query.page - 1) * query.pageSize],
  );
}
