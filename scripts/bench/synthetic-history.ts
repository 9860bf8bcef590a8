// A synthetic production history for the trace benchmark, generated inside MariaDB with bulk
// INSERT … SELECT over its sequence tables (seq_1_to_N), so that a million lots take minutes.
// Invented throughout: no record here describes real material or a real firm.
import { gs1CheckDigit } from '../../shared/domain/gs1/gtin';
import type { DataSource } from 'typeorm';
import { derivedLotHeatsSql } from '../../server/src/modules/manufacturing/lot-heats.repository';
import { log } from '../lib/run';

export interface HistoryShape {
  lots: number;
  heats: number;
  suppliers: number;
  barsPerHeat: number;
  lotsPerRun: number;
  consignees: number;
  years: number;
}

/** ~200 lots per heat, runs of ~20 lots, 40 suppliers, 5,000 consignees, ten years. */
export function shapeFor(lots: number): HistoryShape {
  const heats = Math.max(10, Math.round(lots / 200));
  return {
    lots,
    heats,
    suppliers: Math.min(40, heats),
    barsPerHeat: 5,
    lotsPerRun: 20,
    consignees: Math.min(5_000, Math.max(50, Math.round(lots / 200))),
    years: 10,
  };
}

export interface HistoryCounts {
  [table: string]: number;
}

/**
 * Fills an empty, migrated database. Lot n: every 33rd is split off the lot before it, every
 * 100th (at 50) is merged from the two before it; the others are cut from their own piece of a
 * bar of a heat. Every lot goes through a passivation run and a cleaning run (each of ~20 lots,
 * offset so that runs overlap different lots); released lots ship in one or two shipments.
 */
export async function generateHistory(admin: DataSource, shape: HistoryShape): Promise<HistoryCounts> {
  const n = shape.lots;
  const bars = shape.heats * shape.barsPerHeat;
  const lotsPerBar = Math.ceil(n / bars);
  const runs = Math.ceil(n / shape.lotsPerRun);
  const days = shape.years * 365;
  const seq = (count: number) => `seq_1_to_${count}`;
  const [person] = await admin.query('SELECT id FROM person ORDER BY id LIMIT 1');
  if (!person) throw new Error('the demo people must be seeded first');
  const by = Number(person.id);
  const step = async (what: string, sql: string) => {
    const started = performance.now();
    await admin.query(sql);
    log(`  ${what} (${((performance.now() - started) / 1000).toFixed(1)} s)`);
  };
  await admin.query('SET SESSION foreign_key_checks = 0, unique_checks = 0');
  const start = "TIMESTAMP('2016-12-01 06:00:00')";
  await step(
    `${shape.suppliers} suppliers`,
    `INSERT INTO supplier (id, name, country, approval) SELECT seq, CONCAT('Synthetic mill ', seq), ` +
      `'Nowhere', 'approved' FROM ${seq(shape.suppliers)}`,
  );
  await step(
    `${shape.heats} heats`,
    `INSERT INTO heat (id, heat_number, supplier_id, spec_id, spec_revision, melt_route, product_form, size_mm,
        heat_condition, status, received_by, received_at)
     SELECT seq, CONCAT('SH-', LPAD(seq, 6, '0')), 1 + (seq MOD ${shape.suppliers}), 'ASTM F136', 'L1',
        'VAR x2', 'bar', 25.4, 'annealed', 'accepted', ${by},
            ${start} + INTERVAL FLOOR((seq - 1) * ${days} / ${shape.heats}) DAY
       FROM ${seq(shape.heats)}`,
  );
  await step(
    `${bars} bars`,
    `INSERT INTO bar_piece (id, tag, heat_id, parent_id, diameter_mm, length_mm, location, status, created_by)
     SELECT seq, CONCAT('SB-', LPAD(seq, 7, '0')), 1 + FLOOR((seq - 1) / ${shape.barsPerHeat}), NULL, 25.4,
        3000, 'synthetic', 'cut', ${by} FROM ${seq(bars)}`,
  );
  await step(
    `${n} cut pieces (one per lot)`,
    `INSERT INTO bar_piece (id, tag, heat_id, parent_id, diameter_mm, length_mm, location, status, created_by)
     SELECT ${bars} + seq, CONCAT('SC-', LPAD(seq, 8, '0')), 1 + FLOOR(FLOOR((seq - 1) / ${lotsPerBar}) /
        ${shape.barsPerHeat}), 1 + FLOOR((seq - 1) / ${lotsPerBar}), 25.4, 60, 'synthetic', 'in-stock', ${by}
       FROM ${seq(n)}`,
  );
  // GTINs with their GS1 check digit, so that the parts' UDIs read back as UDIs.
  const partGtins = [1, 2, 3, 4, 5]
    .map((seq) => `0952123999${String(seq).padStart(3, '0')}`)
    .map((base) => `'${base}${gs1CheckDigit(base)}'`)
    .join(', ');
  await admin.query(`INSERT INTO part (id, part_number, revision, description, gtin, unit_length_mm,
      cutoff_allowance_mm, reconciliation_tolerance_pct, lot_pattern, created_by)
     SELECT seq, CONCAT('SYN-', seq), 'A', CONCAT('Synthetic part ', seq), ELT(seq, ${partGtins}), 40, 2, 2,
       'S{SEQ:8}', ${by} FROM seq_1_to_5`);
  await admin.query(
    `INSERT INTO routing_step (part_id, step_no, kind, name, process_method) SELECT seq, 10, 'passivation', ` +
      `'Passivate', 'F86-NITRIC' FROM seq_1_to_5`,
  );
  await admin.query(
    `INSERT INTO routing_step (part_id, step_no, kind, name, process_method) SELECT seq, 20, 'cleaning', ` +
      `'Final clean', 'KIW-CLEAN-AQ' FROM seq_1_to_5`,
  );
  // The last 1 % are still open; merges and splits come from the lots just before them.
  const child = (column: string) =>
    `CASE WHEN ${column} MOD 100 = 50 THEN 'merge' WHEN ${column} MOD 33 = 0 THEN 'split' ELSE 'bar' END`;
  await step(
    `${n} lots`,
    `INSERT INTO production_lot (id, lot_number, part_id, planned_qty, start_qty, origin, status, released_qty,
        opened_by, opened_at)
     SELECT seq, CONCAT('S', LPAD(seq, 8, '0')), 1 + (seq MOD 5), 20, 20, ${child('seq')}, IF(seq >
        ${Math.floor(n * 0.99)}, 'open', 'released'),
            IF(seq > ${Math.floor(n * 0.99)}, 0, 20), ${by}, ${start} + INTERVAL FLOOR((seq - 1) * ${days} / ${n}) DAY
       FROM ${seq(n)}`,
  );
  await step(
    'split and merge links',
    `INSERT INTO lot_link (parent_lot_id, child_lot_id, kind, qty, after_step, recorded_by)
     SELECT seq - 1, seq, IF(seq MOD 100 = 50, 'merge', 'split'), 10, 10, ${by} FROM ${seq(n)} WHERE seq > 2
        AND (seq MOD 100 = 50 OR seq MOD 33 = 0)
     UNION ALL SELECT seq - 2, seq, 'merge', 10, 10, ${by} FROM ${seq(n)} WHERE seq MOD 100 = 50`,
  );
  await step(
    'material issues',
    `INSERT INTO material_movement (lot_id, bar_piece_id, kind, length_mm, recorded_by)
     SELECT seq, ${bars} + seq, 'issue', 50, ${by} FROM ${seq(n)} WHERE NOT (seq > 2 AND (seq MOD 100 = 50 OR
        seq MOD 33 = 0))`,
  );
  await step(
    'heats of each lot, through splits and merges',
    `INSERT INTO lot_heat (heat_id, lot_id) SELECT heat_id, lot_id FROM (${derivedLotHeatsSql}) AS derived`,
  );
  await step(
    `${2 * runs} passivation and cleaning runs`,
    `INSERT INTO process_run (id, run_number, kind, method_id, equipment, parameters_json, window_check_json,
        in_window, operator_name, run_at, recorded_by)
     SELECT seq, CONCAT(IF(seq <= ${runs}, 'SP-', 'SL-'), LPAD(seq, 7, '0')), IF(seq <= ${runs},
        'passivation', 'cleaning'), IF(seq <= ${runs}, 'F86-NITRIC', 'KIW-CLEAN-AQ'),
            'synthetic line', '{}', '{}', 1, 'synthetic', ${start} + INTERVAL FLOOR(((seq - 1) MOD
              ${runs}) * ${days} / ${runs}) DAY, ${by}
       FROM ${seq(2 * runs)}`,
  );
  for (const [stepNo, runOf] of [
    [10, `1 + FLOOR((seq - 1) / ${shape.lotsPerRun})`],
    [
      20,
      `${runs} + 1 + LEAST(${runs - 1}, FLOOR((seq - 1 + ${Math.floor(shape.lotsPerRun / 2)}) / ${shape.lotsPerRun}))`,
    ],
  ] as const) {
    await step(
      `operations at step ${stepNo}`,
      `INSERT INTO lot_operation (lot_id, routing_step_id, operator_name, work_centre, started_at, ended_at,
          qty_in, qty_good, qty_scrap, scrap_reasons, process_run_id, recorded_by)
       SELECT seq, s.id, 'synthetic', 'line', ${start}, ${start} + INTERVAL 1 HOUR, 20, 20, 0, '[]', ${runOf}, ${by}
         FROM ${seq(n)} JOIN routing_step s ON s.part_id = 1 + (seq MOD 5) AND s.step_no = ${stepNo}`,
    );
  }
  await step(
    `${shape.consignees} consignees`,
    `INSERT INTO consignee (id, name, kind, country) SELECT seq, CONCAT('Synthetic consignee ', seq), ELT(1 + ` +
      `seq MOD 3, 'customer', 'distributor', 'hospital'), 'Nowhere' FROM ${seq(shape.consignees)}`,
  );
  // Released lots: 12 units to one consignee, and (nine lots in ten) the other 8 to another.
  await step(
    'shipments',
    `INSERT INTO shipment (lot_id, consignee_id, qty, shipped_on, document_number, recorded_by)
     SELECT seq, 1 + (seq * 7919) MOD ${shape.consignees}, 12, DATE(${start} + INTERVAL FLOOR((seq - 1) *
        ${days} / ${n}) + 10 DAY), CONCAT('SD-', seq), ${by}
       FROM ${seq(Math.floor(n * 0.99))}
     UNION ALL
     SELECT seq, 1 + (seq * 104729) MOD ${shape.consignees}, 8, DATE(${start} + INTERVAL FLOOR((seq - 1) *
        ${days} / ${n}) + 20 DAY), CONCAT('SE-', seq), ${by}
       FROM ${seq(Math.floor(n * 0.99))} WHERE seq MOD 10 <> 0`,
  );
  await admin.query('SET SESSION foreign_key_checks = 1, unique_checks = 1');
  const counts: HistoryCounts = {};
  for (const table of [
    'supplier',
    'heat',
    'bar_piece',
    'production_lot',
    'lot_link',
    'material_movement',
    'lot_heat',
    'process_run',
    'lot_operation',
    'consignee',
    'shipment',
  ]) {
    const [row] = await admin.query(`SELECT COUNT(*) AS n FROM ${table}`);
    counts[table] = Number(row.n);
  }
  await admin.query(
    'ANALYZE TABLE heat, bar_piece, production_lot, lot_link, material_movement, lot_heat, lot_operation, shipment',
  );
  return counts;
}
