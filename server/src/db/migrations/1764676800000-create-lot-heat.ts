import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Which heats each lot's units are made of, directly or through splits and merges: one row per
 * heat and lot, written in the same transaction as the issue, split or merge that makes it true.
 * A forward trace from a heat or a supplier then reads its lots through an index instead of
 * walking the genealogy. Existing history is filled in by walking it once.
 */
export class CreateLotHeat1764676800000 implements MigrationInterface {
  name = 'CreateLotHeat1764676800000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE IF NOT EXISTS lot_heat (
        heat_id INT UNSIGNED NOT NULL,
        lot_id INT UNSIGNED NOT NULL,
        PRIMARY KEY (heat_id, lot_id),
        KEY lot_heat_lot (lot_id),
        CONSTRAINT lot_heat_heat FOREIGN KEY (heat_id) REFERENCES heat (id),
        CONSTRAINT lot_heat_lot FOREIGN KEY (lot_id) REFERENCES production_lot (id)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`,
    );
    await queryRunner.query(
      `INSERT INTO lot_heat (heat_id, lot_id)
       SELECT heat_id, lot_id FROM (
         WITH RECURSIVE made_of (heat_id, lot_id) AS (
           SELECT b.heat_id, m.lot_id FROM material_movement m JOIN bar_piece b ON b.id = m.bar_piece_id WHERE m.kind = 'issue'
           UNION SELECT made_of.heat_id, k.child_lot_id FROM lot_link k JOIN made_of ON k.parent_lot_id = made_of.lot_id)
         SELECT heat_id, lot_id FROM made_of) AS derived`,
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE IF EXISTS lot_heat');
  }
}
