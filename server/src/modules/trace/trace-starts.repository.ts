import type { EntityManager } from 'typeorm';
import { ProductionLot } from '../manufacturing/entities/production-lot.entity';
import type { TraceStart } from '@shared/schemas/trace';

const PER_KIND = 6;
const like = (text: string) => `%${text.replace(/[\\%_]/g, (character) => `\\${character}`)}%`;

/**
 * Where a forward trace can start, matching what a person types: part of a heat number (shown with
 * its supplier), a bar tag (with its heat), a run number (with its method), a supplier's name, or a
 * part by its number, description or GTIN (a GTIN-8, -12 or -13 typed as printed matches the
 * part's GTIN-14 with its leading zeros, GS1 General Specifications §3.3.2).
 * Ids stay behind the choice; people never see or type them.
 */
export async function findTraceStarts(manager: EntityManager, text: string): Promise<TraceStart[]> {
  const pattern = like(text);
  const digits = /^[\d\s()]+$/.test(text) ? text.replace(/\D/g, '').replace(/^01(?=\d{14}$)/, '') : '';
  const gtin = digits.length >= 8 && digits.length <= 14 ? digits.padStart(14, '0') : null;
  const [heats, pieces, runs, suppliers, parts] = await Promise.all([
    manager.query(
      `SELECT h.id, h.heat_number AS label, CONCAT('Heat from ', s.name, ' · ', h.spec_id) AS detail FROM heat h
          JOIN supplier s ON s.id = h.supplier_id
        WHERE h.heat_number LIKE ? ORDER BY h.heat_number LIMIT ?`,
      [pattern, PER_KIND],
    ) as Promise<Array<{ id: number; label: string; detail: string }>>,
    manager.query(
      `SELECT b.id, b.tag AS label, CONCAT('Bar of heat ', h.heat_number) AS detail FROM bar_piece b JOIN heat h ON
          h.id = b.heat_id
        WHERE b.tag LIKE ? ORDER BY b.tag LIMIT ?`,
      [pattern, PER_KIND],
    ) as Promise<Array<{ id: number; label: string; detail: string }>>,
    manager.query(
      `SELECT id, run_number AS label, CONCAT(IF(kind = 'passivation', 'Passivation run', 'Cleaning run'), ' ` +
        `· ', method_id) AS detail FROM process_run WHERE run_number LIKE ? ORDER BY run_number DESC LIMIT ?`,
      [pattern, PER_KIND],
    ) as Promise<Array<{ id: number; label: string; detail: string }>>,
    manager.query(
      `SELECT id, name AS label, CONCAT('Supplier, ', country, ' · ', CASE approval WHEN 'approved' THEN ` +
        `'approved' WHEN 'conditional' THEN 'conditionally approved' ELSE 'disqualified' END) AS detail FROM ` +
        `supplier WHERE name LIKE ? ORDER BY name LIMIT ?`,
      [pattern, PER_KIND],
    ) as Promise<Array<{ id: number; label: string; detail: string }>>,
    manager.query(
      `SELECT id, CONCAT(part_number, ' rev ', revision) AS label, CONCAT('Part · ', description, ' · GTIN ', gtin)
          AS detail FROM part
        WHERE part_number LIKE ? OR description LIKE ? OR gtin LIKE ? OR gtin = ? ORDER BY part_number,
          revision LIMIT ?`,
      [pattern, pattern, pattern, gtin ?? '', PER_KIND],
    ) as Promise<Array<{ id: number; label: string; detail: string }>>,
  ]);
  const as = (kind: TraceStart['kind'], rows: Array<{ id: number; label: string; detail: string }>) =>
    rows.map((row) => ({ kind, id: Number(row.id), label: row.label, detail: row.detail }));
  return [
    ...as('heat', heats),
    ...as('piece', pieces),
    ...as('run', runs),
    ...as('supplier', suppliers),
    ...as('part', parts),
  ];
}

/** The lot with this number made as the part with this GTIN-14 (the key a label carries), or null. */
export function lotOfGtin(manager: EntityManager, gtin: string, lotNumber: string): Promise<{ id: number } | null> {
  return manager.getRepository(ProductionLot).findOne({ select: { id: true }, where: { lotNumber, part: { gtin } } });
}
