import type { EntityManager } from 'typeorm';
import type { MaterialFamily } from '@shared/domain/materials/specification';
import type { FirmMethodValidationView } from '@shared/schemas/process-methods';

interface ValidationRow {
  method_id: string;
  material_family: MaterialFamily;
  stands: number;
  reference: string;
  reason: string;
  recorded_by_name: string;
  recorded_at: Date;
}

/** The firm's validations that stand today: the latest row for each method and material, when it says it stands. */
export async function standingMethodValidations(manager: EntityManager): Promise<FirmMethodValidationView[]> {
  const rows: ValidationRow[] = await manager.query(
    `SELECT v.method_id, v.material_family, v.stands, v.reference, v.reason, v.recorded_at, p.name AS recorded_by_name
     FROM process_method_validation v JOIN person p ON p.id = v.recorded_by
     WHERE v.id = (SELECT MAX(w.id) FROM process_method_validation w WHERE w.method_id = v.method_id AND
        w.material_family = v.material_family)
     ORDER BY v.method_id, v.material_family`,
  );
  return rows
    .filter((row) => Boolean(row.stands))
    .map((row) => ({
      methodId: row.method_id,
      family: row.material_family,
      reference: row.reference,
      reason: row.reason,
      recordedBy: row.recorded_by_name,
      recordedAt: new Date(row.recorded_at).toISOString(),
    }));
}

export async function insertMethodValidation(
  manager: EntityManager,
  row: {
    methodId: string;
    family: MaterialFamily;
    stands: boolean;
    reference: string;
    reason: string;
    recordedBy: number;
  },
): Promise<number> {
  const result: { insertId: number } = await manager.query(
    'INSERT INTO process_method_validation (method_id, material_family, stands, reference, reason, ' +
      'recorded_by) VALUES (?, ?, ?, ?, ?, ?)',
    [row.methodId, row.family, row.stands ? 1 : 0, row.reference, row.reason, row.recordedBy],
  );
  return Number(result.insertId);
}
