// The parts of a lot's record its page shows beside the lot itself: bar issued and returned,
// files attached to steps, shipments. Raw SQL for the joins that name each row's people and heats.
import type { EntityManager } from 'typeorm';

export interface MovementRow {
  id: number;
  kind: 'issue' | 'return';
  tag: string;
  bar_piece_id: number;
  heat_id: number;
  heat_number: string;
  heat_status: string;
  supplier: string;
  spec_id: string;
  length_mm: string;
  recorded_at: Date;
  by: string;
}

export function lotMaterialMovements(manager: EntityManager, lotId: number): Promise<MovementRow[]> {
  return manager.query(
    `SELECT m.id, m.kind, b.tag, m.bar_piece_id, h.id AS heat_id, h.heat_number, h.status AS heat_status,
            s.name AS supplier, h.spec_id, m.length_mm, m.recorded_at, p.name AS \`by\`
       FROM material_movement m JOIN bar_piece b ON b.id = m.bar_piece_id JOIN heat h ON h.id = b.heat_id
       JOIN supplier s ON s.id = h.supplier_id JOIN person p ON p.id = m.recorded_by
      WHERE m.lot_id = ? ORDER BY m.recorded_at, m.id`,
    [lotId],
  );
}

export function lotOperationFiles(
  manager: EntityManager,
  lotId: number,
): Promise<Array<{ operation_id: number; document_id: number; name: string; sha256: string }>> {
  return manager.query(
    `SELECT f.operation_id, f.document_id, f.name, d.sha256
       FROM operation_file f JOIN certificate_document d ON d.id = f.document_id JOIN lot_operation o ON
         o.id = f.operation_id
      WHERE o.lot_id = ?`,
    [lotId],
  );
}

export interface ShipmentRow {
  id: number;
  consignee_id: number;
  name: string;
  kind: string;
  country: string;
  qty: number;
  shipped_on: Date | string;
  document_number: string;
  by: string;
}

export function lotShipmentRows(manager: EntityManager, lotId: number): Promise<ShipmentRow[]> {
  return manager.query(
    `SELECT s.id, s.consignee_id, c.name, c.kind, c.country, s.qty, s.shipped_on, s.document_number, p.name AS \`by\`
       FROM shipment s JOIN consignee c ON c.id = s.consignee_id JOIN person p ON p.id = s.recorded_by
      WHERE s.lot_id = ? ORDER BY s.shipped_on, s.id`,
    [lotId],
  );
}
