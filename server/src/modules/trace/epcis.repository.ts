import type { EntityManager } from 'typeorm';
import type { EpcisFacts } from '@shared/domain/trace/epcis';

const iso = (value: Date | string) => new Date(value).toISOString();

/** What an EPCIS document of these lots tells: the lots, their bars, their splits and merges, their shipments. */
export async function epcisFacts(
  manager: EntityManager,
  lotIds: number[],
): Promise<Omit<EpcisFacts, 'base' | 'timeZone'>> {
  if (!lotIds.length) return { lots: [], issues: [], links: [], shipments: [] };
  const lots: Array<{
    id: number;
    lot_number: string;
    gtin: string;
    origin: 'bar' | 'split' | 'merge';
    opened_at: Date;
    start_qty: number | null;
    planned_qty: number;
    released_qty: number;
    released_at: Date | null;
  }> = await manager.query(
    `SELECT l.id, l.lot_number, p.gtin, l.origin, l.opened_at, l.start_qty, l.planned_qty, l.released_qty,
            (SELECT MAX(s.closed_at) FROM release_submission s WHERE s.lot_id = l.id AND s.outcome = 'released')
              AS released_at
       FROM production_lot l JOIN part p ON p.id = l.part_id
      WHERE l.id IN (?) ORDER BY l.id`,
    [lotIds],
  );
  const issues: Array<{ lot_id: number; tag: string; heat_number: string; length_mm: string; recorded_at: Date }> =
    await manager.query(
      `SELECT m.lot_id, b.tag, h.heat_number, m.length_mm, m.recorded_at
         FROM material_movement m JOIN bar_piece b ON b.id = m.bar_piece_id JOIN heat h ON h.id = b.heat_id
        WHERE m.kind = 'issue' AND m.lot_id IN (?) ORDER BY m.id`,
      [lotIds],
    );
  const links: Array<{
    parent_lot_id: number;
    child_lot_id: number;
    kind: 'split' | 'merge';
    qty: number;
    recorded_at: Date;
  }> = await manager.query(
    `SELECT parent_lot_id, child_lot_id, kind, qty, recorded_at FROM lot_link
        WHERE child_lot_id IN (?) ORDER BY recorded_at, parent_lot_id`,
    [lotIds],
  );
  const shipments: Array<{
    id: number;
    lot_id: number;
    consignee_id: number;
    qty: number;
    document_number: string;
    recorded_at: Date;
  }> = await manager.query(
    `SELECT id, lot_id, consignee_id, qty, document_number, recorded_at FROM shipment WHERE lot_id IN (?) ORDER BY id`,
    [lotIds],
  );
  return {
    lots: lots.map((lot) => ({
      id: lot.id,
      lotNumber: lot.lot_number,
      gtin: lot.gtin,
      origin: lot.origin,
      openedAt: iso(lot.opened_at),
      startQty: lot.start_qty ?? lot.planned_qty,
      released: lot.released_at && lot.released_qty ? { qty: lot.released_qty, at: iso(lot.released_at) } : null,
    })),
    issues: issues.map((issue) => ({
      lotId: issue.lot_id,
      barTag: issue.tag,
      heatNumber: issue.heat_number,
      lengthMm: issue.length_mm,
      at: iso(issue.recorded_at),
    })),
    links: links.map((link) => ({
      parentLotId: link.parent_lot_id,
      childLotId: link.child_lot_id,
      kind: link.kind,
      qty: link.qty,
      at: iso(link.recorded_at),
    })),
    shipments: shipments.map((shipment) => ({
      id: shipment.id,
      lotId: shipment.lot_id,
      consigneeId: shipment.consignee_id,
      qty: shipment.qty,
      documentNumber: shipment.document_number,
      at: iso(shipment.recorded_at),
    })),
  };
}
