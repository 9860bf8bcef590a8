import type { EntityManager } from 'typeorm';
import { DecimalE29 } from '@shared/domain/materials/e29-rounding';
import type { BarListQuery, BarPiece } from '@shared/schemas/materials';

interface PieceRow {
  id: number;
  tag: string;
  heat_id: number;
  marked_heat_number: string | null;
  heat_number: string;
  heat_status: BarPiece['heat']['status'];
  spec_id: string;
  grade: string | null;
  parent_tag: string | null;
  child_tags: string | null;
  diameter_mm: string;
  length_mm: string;
  mass_kg: string | null;
  location: string;
  status: BarPiece['status'];
  created_at: Date;
  created_by_name: string;
  net_issued_mm: string | null;
}

const pieceSelect = `
  SELECT b.id, b.tag, b.heat_id, b.marked_heat_number, h.heat_number, h.status AS heat_status, h.spec_id,
    h.grade, parent.tag AS parent_tag,
         (SELECT GROUP_CONCAT(child.tag ORDER BY child.tag SEPARATOR ',') FROM bar_piece child WHERE
           child.parent_id = b.id) AS child_tags,
         b.diameter_mm, b.length_mm, b.mass_kg, b.location, b.status, b.created_at, p.name AS created_by_name,
         (SELECT SUM(CASE m.kind WHEN 'issue' THEN m.length_mm ELSE -m.length_mm END) FROM
           material_movement m WHERE m.bar_piece_id = b.id) AS net_issued_mm
  FROM bar_piece b JOIN heat h ON h.id = b.heat_id LEFT JOIN bar_piece parent ON parent.id = b.parent_id JOIN
    person p ON p.id = b.created_by`;

function toPiece(row: PieceRow): BarPiece {
  return {
    id: row.id,
    tag: row.tag,
    heat: {
      id: row.heat_id,
      heatNumber: row.heat_number,
      status: row.heat_status,
      specId: row.spec_id,
      grade: row.grade,
    },
    markedHeatNumber: row.marked_heat_number,
    parentTag: row.parent_tag,
    childTags: row.child_tags ? row.child_tags.split(',') : [],
    diameterMm: row.diameter_mm,
    lengthMm: row.length_mm,
    // Issues to production lots (less what came back) reduce it; a cut piece lives on in its children.
    remainingMm:
      row.status === 'cut' ? '0.00' : new DecimalE29(row.length_mm).minus(row.net_issued_mm ?? '0').toFixed(2),
    massKg: row.mass_kg,
    location: row.location,
    status: row.status,
    createdAt: new Date(row.created_at).toISOString(),
    createdBy: row.created_by_name,
  };
}

export async function findPiece(manager: EntityManager, id: number, lock = false): Promise<BarPiece | null> {
  if (lock) await manager.query('SELECT id FROM bar_piece WHERE id = ? FOR UPDATE', [id]);
  const [row]: PieceRow[] = await manager.query(`${pieceSelect} WHERE b.id = ?`, [id]);
  return row ? toPiece(row) : null;
}

export async function findPieceByTag(manager: EntityManager, tag: string): Promise<BarPiece | null> {
  const [row]: PieceRow[] = await manager.query(`${pieceSelect} WHERE b.tag = ?`, [tag]);
  return row ? toPiece(row) : null;
}

export async function listPieces(
  manager: EntityManager,
  query: BarListQuery,
): Promise<{ items: BarPiece[]; total: number }> {
  const where: string[] = [];
  const parameters: unknown[] = [];
  if (query.heatId) {
    where.push('b.heat_id = ?');
    parameters.push(query.heatId);
  }
  if (query.search) {
    where.push('(b.tag LIKE ? OR h.heat_number LIKE ? OR b.location LIKE ?)');
    const pattern = `%${query.search.replace(/[\\%_]/g, (character) => `\\${character}`)}%`;
    parameters.push(pattern, pattern, pattern);
  }
  if (query.inStockOnly === 'true')
    where.push(
      "b.status = 'in-stock' AND b.length_mm > COALESCE((SELECT SUM(CASE m.kind WHEN 'issue' THEN m.length_mm " +
        'ELSE -m.length_mm END) FROM material_movement m WHERE m.bar_piece_id = b.id), 0)',
    );
  const clause = where.length ? `WHERE ${where.join(' AND ')}` : '';
  const [count]: Array<{ total: string }> = await manager.query(
    `SELECT COUNT(*) AS total FROM bar_piece b JOIN heat h ON h.id = b.heat_id ${clause}`,
    parameters,
  );
  const rows: PieceRow[] = await manager.query(
    `${pieceSelect} ${clause} ORDER BY b.created_at DESC, b.tag LIMIT ? OFFSET ?`,
    [...parameters, query.pageSize, (query.page - 1) * query.pageSize],
  );
  return { items: rows.map(toPiece), total: Number(count?.total ?? 0) };
}

export async function insertPiece(
  manager: EntityManager,
  piece: {
    tag: string;
    heatId: number;
    markedHeatNumber: string | null;
    parentId: number | null;
    diameterMm: string;
    lengthMm: string;
    massKg: string | null;
    location: string;
    createdBy: number;
  },
): Promise<number> {
  const result: { insertId: number } = await manager.query(
    'INSERT INTO bar_piece (tag, heat_id, marked_heat_number, parent_id, diameter_mm, length_mm, mass_kg, ' +
      'location, created_by) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)',
    [
      piece.tag,
      piece.heatId,
      piece.markedHeatNumber,
      piece.parentId,
      piece.diameterMm,
      piece.lengthMm,
      piece.massKg,
      piece.location,
      piece.createdBy,
    ],
  );
  return Number(result.insertId);
}

export async function markCut(manager: EntityManager, id: number): Promise<void> {
  await manager.query("UPDATE bar_piece SET status = 'cut' WHERE id = ?", [id]);
}
