import type { EntityManager } from 'typeorm';
import { Heat as HeatEntity } from './entities/heat.entity';
import type { CertificateDocument, HeatListQuery, HeatSummary } from '@shared/schemas/materials';
import { readStoredEvaluation, type Evaluation } from '@shared/schemas/evaluation';

interface HeatRow {
  id: number;
  heat_number: string;
  supplier_id: number;
  supplier_name: string;
  supplier_approval: HeatSummary['supplier']['approval'];
  spec_id: string;
  spec_revision: string;
  grade: string | null;
  melt_route: string;
  product_form: string;
  size_mm: string;
  heat_condition: string;
  status: HeatSummary['status'];
  verdict: HeatSummary['verdict'];
  received_at: Date;
  received_by_name: string;
  received_by: number;
}

/**
 * The verdict of a heat's newest evaluation; evaluations stored before the third outcome existed
 * said "incomplete", which reads as cannot be evaluated.
 */
export function latestVerdictSql(heatIdColumn: string): string {
  return (
    `(SELECT CASE e.verdict WHEN 'incomplete' THEN 'cannot-be-evaluated' ELSE e.verdict END FROM ` +
    `heat_evaluation e WHERE e.heat_id = ${heatIdColumn} ORDER BY e.id DESC LIMIT 1)`
  );
}

const heatSelect = `
  SELECT h.id, h.heat_number, h.supplier_id, s.name AS supplier_name, s.approval AS supplier_approval,
    h.spec_id, h.spec_revision,
         h.grade, h.melt_route, h.product_form, h.size_mm, h.heat_condition, h.status, h.received_at,
           h.received_by, p.name AS received_by_name,
         ${latestVerdictSql('h.id')} AS verdict
  FROM heat h JOIN supplier s ON s.id = h.supplier_id JOIN person p ON p.id = h.received_by`;

function toSummary(row: HeatRow): HeatSummary & { receivedById: number } {
  return {
    id: row.id,
    heatNumber: row.heat_number,
    supplier: { id: row.supplier_id, name: row.supplier_name, approval: row.supplier_approval },
    spec: { id: row.spec_id, revision: row.spec_revision, grade: row.grade },
    meltRoute: row.melt_route,
    productForm: row.product_form,
    sizeMm: row.size_mm,
    condition: row.heat_condition,
    status: row.status,
    verdict: row.verdict,
    receivedAt: new Date(row.received_at).toISOString(),
    receivedBy: row.received_by_name,
    receivedById: row.received_by,
  };
}

export async function findHeat(
  manager: EntityManager,
  id: number,
  lock = false,
): Promise<(HeatSummary & { receivedById: number }) | null> {
  if (lock) await manager.query('SELECT id FROM heat WHERE id = ? FOR UPDATE', [id]);
  const [row]: HeatRow[] = await manager.query(`${heatSelect} WHERE h.id = ?`, [id]);
  return row ? toSummary(row) : null;
}

export async function listHeats(
  manager: EntityManager,
  query: HeatListQuery,
): Promise<{ items: HeatSummary[]; total: number }> {
  const where: string[] = [];
  const parameters: unknown[] = [];
  if (query.search) {
    where.push('(h.heat_number LIKE ? OR s.name LIKE ? OR h.spec_id LIKE ?)');
    const pattern = `%${query.search.replace(/[\\%_]/g, (character) => `\\${character}`)}%`;
    parameters.push(pattern, pattern, pattern);
  }
  if (query.status) {
    where.push('h.status = ?');
    parameters.push(query.status);
  }
  const clause = where.length ? `WHERE ${where.join(' AND ')}` : '';
  const [count]: Array<{ total: string }> = await manager.query(
    `SELECT COUNT(*) AS total FROM heat h JOIN supplier s ON s.id = h.supplier_id ${clause}`,
    parameters,
  );
  const rows: HeatRow[] = await manager.query(
    `${heatSelect} ${clause} ORDER BY h.received_at DESC, h.id DESC LIMIT ? OFFSET ?`,
    [...parameters, query.pageSize, (query.page - 1) * query.pageSize],
  );
  return { items: rows.map((row) => toSummary(row)), total: Number(count?.total ?? 0) };
}

export async function insertHeat(
  manager: EntityManager,
  heat: {
    heatNumber: string;
    supplierId: number;
    specId: string;
    specRevision: string;
    grade: string | null;
    meltRoute: string;
    productForm: string;
    sizeMm: string;
    condition: string;
    receivedBy: number;
    receivedOn?: string;
  },
): Promise<number> {
  const result: { insertId: number } = await manager.query(
    `INSERT INTO heat (heat_number, supplier_id, spec_id, spec_revision, grade, melt_route, product_form, size_mm,
        heat_condition, received_by, received_at)
     VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
    [
      heat.heatNumber,
      heat.supplierId,
      heat.specId,
      heat.specRevision,
      heat.grade,
      heat.meltRoute,
      heat.productForm,
      heat.sizeMm,
      heat.condition,
      heat.receivedBy,
      heat.receivedOn ? `${heat.receivedOn} 00:00:00` : new Date(),
    ],
  );
  return Number(result.insertId);
}

export async function setHeatStatus(manager: EntityManager, id: number, status: HeatSummary['status']): Promise<void> {
  await manager.query('UPDATE heat SET status = ? WHERE id = ?', [status, id]);
}

export interface StoredResults {
  chemistry: Record<string, string>;
  mechanical: Record<string, string>;
}

export async function heatResults(manager: EntityManager, heatId: number): Promise<StoredResults> {
  const rows: Array<{ kind: 'chemistry' | 'mechanical'; item: string; as_reported: string }> = await manager.query(
    'SELECT kind, item, as_reported FROM heat_result WHERE heat_id = ? ORDER BY kind, item',
    [heatId],
  );
  const results: StoredResults = { chemistry: {}, mechanical: {} };
  for (const row of rows) results[row.kind][row.item] = row.as_reported;
  return results;
}

export async function replaceHeatResults(
  manager: EntityManager,
  heatId: number,
  rows: Array<{ kind: 'chemistry' | 'mechanical'; item: string; asReported: string; value: string }>,
): Promise<void> {
  await manager.query('DELETE FROM heat_result WHERE heat_id = ?', [heatId]);
  for (const row of rows) {
    await manager.query('INSERT INTO heat_result (heat_id, kind, item, as_reported, value) VALUES (?, ?, ?, ?, ?)', [
      heatId,
      row.kind,
      row.item,
      row.asReported,
      row.value,
    ]);
  }
}

export async function insertEvaluation(
  manager: EntityManager,
  evaluation: { heatId: number; specId: string; revision: string; verdict: string; json: string; evaluatedBy: number },
): Promise<void> {
  await manager.query(
    'INSERT INTO heat_evaluation (heat_id, spec_id, spec_revision, verdict, evaluation_json, evaluated_by) ' +
      'VALUES (?, ?, ?, ?, ?, ?)',
    [
      evaluation.heatId,
      evaluation.specId,
      evaluation.revision,
      evaluation.verdict,
      evaluation.json,
      evaluation.evaluatedBy,
    ],
  );
}

export async function latestEvaluation(
  manager: EntityManager,
  heatId: number,
): Promise<{ id: number; evaluation: Evaluation; evaluatedBy: number } | null> {
  const [row]: Array<{ id: number; evaluation_json: string; evaluated_by: number }> = await manager.query(
    'SELECT id, evaluation_json, evaluated_by FROM heat_evaluation WHERE heat_id = ? ORDER BY id DESC LIMIT 1',
    [heatId],
  );
  return row
    ? {
        id: Number(row.id),
        evaluation: readStoredEvaluation(JSON.parse(row.evaluation_json)),
        evaluatedBy: row.evaluated_by,
      }
    : null;
}

export async function evaluatorIds(manager: EntityManager, heatId: number): Promise<number[]> {
  const rows: Array<{ evaluated_by: number }> = await manager.query(
    'SELECT DISTINCT evaluated_by FROM heat_evaluation WHERE heat_id = ?',
    [heatId],
  );
  return rows.map((row) => row.evaluated_by);
}

export async function heatCertificates(manager: EntityManager, heatId: number): Promise<CertificateDocument[]> {
  const rows: Array<{
    id: number;
    sha256: string;
    media_type: string;
    size_bytes: number;
    original_name: string;
    uploaded_at: Date;
  }> = await manager.query(
    `SELECT d.id, d.sha256, d.media_type, d.size_bytes, d.original_name, d.uploaded_at FROM heat_certificate ` +
      `c JOIN certificate_document d ON d.id = c.document_id WHERE c.heat_id = ? ORDER BY c.attached_at`,
    [heatId],
  );
  return rows.map((row) => ({
    id: row.id,
    sha256: row.sha256,
    mediaType: row.media_type,
    sizeBytes: Number(row.size_bytes),
    originalName: row.original_name,
    uploadedAt: new Date(row.uploaded_at).toISOString(),
  }));
}

/** Stores the bytes once (same SHA-256, same row) and returns the document id and whether it was new. */
export async function storeDocument(
  manager: EntityManager,
  document: { sha256: string; mediaType: string; bytes: Buffer; originalName: string; uploadedBy: number },
): Promise<{ id: number; created: boolean }> {
  const [existing]: Array<{ id: number }> = await manager.query(
    'SELECT id FROM certificate_document WHERE sha256 = ?',
    [document.sha256],
  );
  if (existing) return { id: existing.id, created: false };
  const result: { insertId: number } = await manager.query(
    'INSERT INTO certificate_document (sha256, media_type, size_bytes, original_name, content, uploaded_by) ' +
      'VALUES (?, ?, ?, ?, ?, ?)',
    [
      document.sha256,
      document.mediaType,
      document.bytes.length,
      document.originalName,
      document.bytes,
      document.uploadedBy,
    ],
  );
  return { id: Number(result.insertId), created: true };
}

export async function attachDocument(
  manager: EntityManager,
  heatId: number,
  documentId: number,
  attachedBy: number,
): Promise<boolean> {
  const result: { affectedRows: number } = await manager.query(
    'INSERT IGNORE INTO heat_certificate (heat_id, document_id, attached_by) VALUES (?, ?, ?)',
    [heatId, documentId, attachedBy],
  );
  return result.affectedRows === 1;
}

export async function documentOfHeat(
  manager: EntityManager,
  heatId: number,
  documentId: number,
): Promise<{ mediaType: string; originalName: string; content: Buffer; sha256: string } | null> {
  const [row]: Array<{ media_type: string; original_name: string; content: Buffer; sha256: string }> =
    await manager.query(
      'SELECT d.media_type, d.original_name, d.content, d.sha256 FROM heat_certificate c JOIN ' +
        'certificate_document d ON d.id = c.document_id WHERE c.heat_id = ? AND c.document_id = ?',
      [heatId, documentId],
    );
  return row
    ? { mediaType: row.media_type, originalName: row.original_name, content: row.content, sha256: row.sha256 }
    : null;
}

/** Other heats whose certificate is the very same document (a sign of a copied certificate). */
export async function otherHeatsWithDocument(
  manager: EntityManager,
  heatId: number,
  documentId: number,
): Promise<string[]> {
  const rows: Array<{ heat_number: string }> = await manager.query(
    'SELECT h.heat_number FROM heat_certificate c JOIN heat h ON h.id = c.heat_id WHERE c.document_id = ? AND ' +
      'c.heat_id <> ?',
    [documentId, heatId],
  );
  return rows.map((row) => row.heat_number);
}

/**
 * Other heats of the same specification whose reported results are exactly the same (a sign of a copied certificate).
 */
export async function heatsWithIdenticalResults(manager: EntityManager, heatId: number): Promise<string[]> {
  const rows: Array<{ heat_number: string }> = await manager.query(
    `SELECT other.heat_number FROM heat this_heat
       JOIN heat other ON other.id <> this_heat.id AND other.spec_id = this_heat.spec_id
     WHERE this_heat.id = ?
       AND (SELECT COUNT(*) FROM heat_result r WHERE r.heat_id = this_heat.id) > 0
       AND (SELECT GROUP_CONCAT(CONCAT(kind, ':', item, '=', value) ORDER BY kind, item SEPARATOR ';') FROM
         heat_result WHERE heat_id = this_heat.id)
         = (SELECT GROUP_CONCAT(CONCAT(kind, ':', item, '=', value) ORDER BY kind, item SEPARATOR ';')
           FROM heat_result WHERE heat_id = other.id)
     ORDER BY other.heat_number`,
    [heatId],
  );
  return rows.map((row) => row.heat_number);
}

/** One element's reported values for a supplier's heats under a specification (and grade), oldest first. */
export function chemistryHistory(
  manager: EntityManager,
  of: { supplierId: number; specId: string; element: string; grade: string | null },
): Promise<Array<{ heat_id: number; heat_number: string; received_at: Date; value: string }>> {
  return manager.query(
    `SELECT h.id AS heat_id, h.heat_number, h.received_at, r.value
       FROM heat_result r JOIN heat h ON h.id = r.heat_id
      WHERE h.supplier_id = ? AND h.spec_id = ? AND r.kind = 'chemistry' AND r.item = ?
        ${of.grade !== null ? 'AND h.grade = ?' : ''}
      ORDER BY h.received_at, h.id`,
    [of.supplierId, of.specId, of.element, ...(of.grade !== null ? [of.grade] : [])],
  );
}

/** The heat a supplier numbered so, or null. */
export async function heatOf(
  manager: EntityManager,
  supplierId: number,
  heatNumber: string,
): Promise<{ id: number; status: HeatEntity['status'] } | null> {
  return manager
    .getRepository(HeatEntity)
    .findOne({ select: { id: true, status: true }, where: { supplierId, heatNumber } });
}

/** The heat a supplier (named) numbered so, or null. */
export async function heatOfSupplierNamed(
  manager: EntityManager,
  supplierName: string,
  heatNumber: string,
): Promise<{ id: number; status: HeatEntity['status'] } | null> {
  return manager
    .getRepository(HeatEntity)
    .findOne({ select: { id: true, status: true }, where: { heatNumber, supplier: { name: supplierName } } });
}
