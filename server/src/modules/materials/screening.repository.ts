import type { EntityManager } from 'typeorm';
import type { SupplierScreening } from '@shared/schemas/screening';

export interface HistoryRow {
  id: number;
  heat_number: string;
  received_at: Date;
  kind: 'chemistry' | 'mechanical' | null;
  item: string | null;
  as_reported: string | null;
}

/** Every heat of a supplier, specification and grade with its reported values (one row per value). */
export function supplierResultRows(
  manager: EntityManager,
  supplierId: number,
  specId: string,
  grade: string | null,
): Promise<HistoryRow[]> {
  return manager.query(
    `SELECT h.id, h.heat_number, h.received_at, r.kind, r.item, r.as_reported
       FROM heat h LEFT JOIN heat_result r ON r.heat_id = h.id
      WHERE h.supplier_id = ? AND h.spec_id = ? AND h.grade <=> ?
      ORDER BY h.id, r.kind, r.item`,
    [supplierId, specId, grade],
  );
}

/** The certificate hashes of a supplier's heats under one specification and grade. */
export function supplierCertificateHashes(
  manager: EntityManager,
  supplierId: number,
  specId: string,
  grade: string | null,
): Promise<Array<{ heat_id: number; sha256: string }>> {
  return manager.query(
    `SELECT c.heat_id, d.sha256 FROM heat_certificate c JOIN certificate_document d ON d.id = c.document_id
       JOIN heat h ON h.id = c.heat_id WHERE h.supplier_id = ? AND h.spec_id = ? AND h.grade <=> ? ORDER BY
         c.heat_id, d.sha256`,
    [supplierId, specId, grade],
  );
}

/** The screening findings acknowledged on a heat, with who acknowledged each and why. */
export function acknowledgementsOfHeat(
  manager: EntityManager,
  heatId: number,
): Promise<Array<{ finding_key: string; reason: string; acknowledged_at: Date; name: string }>> {
  return manager.query(
    `SELECT a.finding_key, a.reason, a.acknowledged_at, p.name FROM screening_acknowledgement a JOIN person p ON
        p.id = a.acknowledged_by
      WHERE a.heat_id = ? ORDER BY a.id`,
    [heatId],
  );
}

/** The supplier a screening is about. */
export function supplierForScreening(
  manager: EntityManager,
  supplierId: number,
): Promise<
  Array<{
    id: number;
    name: string;
    country: string;
    approval: SupplierScreening['supplier']['approval'];
  }>
> {
  return manager.query('SELECT id, name, country, approval FROM supplier WHERE id = ?', [supplierId]);
}

/** Per specification and grade the supplier delivers, the newest heat's revision, form and condition. */
export function screeningGroups(
  manager: EntityManager,
  supplierId: number,
): Promise<
  Array<{
    spec_id: string;
    grade: string | null;
    spec_revision: string;
    product_form: string;
    heat_condition: string;
  }>
> {
  return manager.query(
    `SELECT h.spec_id, h.grade, h.spec_revision, h.product_form, h.heat_condition FROM heat h
      WHERE h.supplier_id = ? AND h.id = (SELECT MAX(o.id) FROM heat o WHERE o.supplier_id = h.supplier_id
        AND o.spec_id = h.spec_id AND o.grade <=> h.grade)
      ORDER BY h.spec_id, h.grade`,
    [supplierId],
  );
}

/** Which findings were acknowledged on which of the supplier's heats. */
export function acknowledgedFindings(
  manager: EntityManager,
  supplierId: number,
): Promise<Array<{ heat_id: number; finding_key: string }>> {
  return manager.query(
    'SELECT a.heat_id, a.finding_key FROM screening_acknowledgement a JOIN heat h ON h.id = a.heat_id WHERE ' +
      'h.supplier_id = ?',
    [supplierId],
  );
}

/** Records a reviewer's acknowledgement of a finding on a heat. */
export async function insertAcknowledgement(
  manager: EntityManager,
  heatId: number,
  finding: { key: string; kind: string; explanation: string },
  reason: string,
  personId: number,
): Promise<void> {
  await manager.query(
    'INSERT INTO screening_acknowledgement (heat_id, finding_key, kind, explanation, reason, acknowledged_by) ' +
      'VALUES (?, ?, ?, ?, ?, ?)',
    [heatId, finding.key, finding.kind, finding.explanation, reason, personId],
  );
}
