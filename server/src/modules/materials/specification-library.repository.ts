import type { EntityManager } from 'typeorm';
import { canonicalJson } from '@shared/domain/ledger-hash';
import { specificationLibrary } from '@shared/domain/materials/library';
import type { Specification } from '@shared/domain/materials/specification';
import { sha256Hex } from '../ledger/ledger.repository';

/**
 * Stores each shipped specification revision once. A stored revision is never changed: if the
 * shipped definition of an existing revision differs, start-up stops and asks for a new revision.
 */
export async function syncSpecificationLibrary(
  manager: EntityManager,
  library: readonly Specification[] = specificationLibrary,
): Promise<string[]> {
  const added: string[] = [];
  for (const specification of library) {
    const definition = canonicalJson(specification);
    const hash = sha256Hex(definition);
    const [stored]: Array<{ definition_hash: string }> = await manager.query(
      'SELECT definition_hash FROM specification_revision WHERE spec_id = ? AND revision = ?',
      [specification.id, specification.revision],
    );
    if (stored && stored.definition_hash !== hash) {
      throw new Error(
        `Revision ${specification.revision} of ${specification.id} in the shipped library differs from the ` +
          `stored one; stored revisions are immutable, so ship the change as a new revision`,
      );
    }
    if (!stored) {
      await manager.query(
        'INSERT INTO specification_revision (spec_id, revision, title, edition, definition_json, ' +
          'definition_hash) VALUES (?, ?, ?, ?, ?, ?)',
        [specification.id, specification.revision, specification.title, specification.edition, definition, hash],
      );
      added.push(`${specification.id} ${specification.revision}`);
    }
  }
  return added;
}

export async function storedSpecification(
  manager: EntityManager,
  specId: string,
  revision: string,
): Promise<Specification | null> {
  const [row]: Array<{ definition_json: string }> = await manager.query(
    'SELECT definition_json FROM specification_revision WHERE spec_id = ? AND revision = ?',
    [specId, revision],
  );
  return row ? (JSON.parse(row.definition_json) as Specification) : null;
}

/** The newest revision of each specification. */
export async function currentSpecifications(manager: EntityManager): Promise<Specification[]> {
  const rows: Array<{ spec_id: string; definition_json: string }> = await manager.query(
    'SELECT spec_id, definition_json FROM specification_revision ORDER BY spec_id, created_at DESC, revision DESC',
  );
  const seen = new Set<string>();
  const result: Specification[] = [];
  for (const row of rows) {
    if (seen.has(row.spec_id)) continue;
    seen.add(row.spec_id);
    result.push(JSON.parse(row.definition_json) as Specification);
  }
  return result;
}
