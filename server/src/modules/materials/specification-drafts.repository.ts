import type { EntityManager } from 'typeorm';
import { insertReturningId } from '../../db/insert-returning-id';
import type { SpecificationDraftView } from '@shared/schemas/materials';
import { SpecificationDraft } from './entities/specification-draft.entity';
import { SpecificationRevision } from './entities/specification-revision.entity';

export interface DraftRow {
  id: number;
  spec_id: string;
  base_revision: string;
  revision: string;
  definition_json: string;
  note: string;
  status: SpecificationDraftView['status'];
  created_by: number;
  created_by_name: string;
  created_at: Date;
}

/** A draft with who created it, optionally locked for the rest of the transaction. */
export async function draftRow(manager: EntityManager, id: number, lock = false): Promise<DraftRow | null> {
  if (lock) await manager.query('SELECT id FROM specification_draft WHERE id = ? FOR UPDATE', [id]);
  const [row]: DraftRow[] = await manager.query(
    'SELECT d.*, p.name AS created_by_name FROM specification_draft d JOIN person p ON p.id = d.created_by ' +
      'WHERE d.id = ?',
    [id],
  );
  return row ?? null;
}

export async function insertDraft(
  manager: EntityManager,
  draft: Pick<SpecificationDraft, 'specId' | 'baseRevision' | 'revision' | 'definitionJson' | 'note' | 'createdBy'>,
): Promise<number> {
  return insertReturningId(manager, SpecificationDraft, draft);
}

export async function setDraftStatus(
  manager: EntityManager,
  id: number,
  status: SpecificationDraft['status'],
): Promise<void> {
  await manager.getRepository(SpecificationDraft).update({ id }, { status });
}

/** Adds an approved revision to the specification library. */
export async function insertRevision(
  manager: EntityManager,
  revision: Pick<
    SpecificationRevision,
    'specId' | 'revision' | 'title' | 'edition' | 'definitionJson' | 'definitionHash'
  >,
): Promise<void> {
  await manager.getRepository(SpecificationRevision).insert(revision);
}

/** The hundred newest drafts, with who created each. */
export function latestDraftRows(manager: EntityManager): Promise<DraftRow[]> {
  return manager.query(
    'SELECT d.*, p.name AS created_by_name FROM specification_draft d JOIN person p ON p.id = d.created_by ' +
      'ORDER BY d.id DESC LIMIT 100',
  );
}

/** Whether the revision exists in the library or in a draft not rejected. */
export async function revisionTaken(manager: EntityManager, specId: string, revision: string): Promise<boolean> {
  const rows: unknown[] = await manager.query(
    `SELECT 1 FROM specification_revision WHERE spec_id = ? AND revision = ?
      UNION SELECT 1 FROM specification_draft WHERE spec_id = ? AND revision = ? AND status <> 'rejected'`,
    [specId, revision, specId, revision],
  );
  return rows.length > 0;
}
