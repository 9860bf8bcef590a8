import type { MigrationInterface, QueryRunner } from 'typeorm';

const table = 'ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci';

/**
 * Recall investigations: what started them, the affected sets frozen when they were opened and
 * each later re-run (stored once, never changed), and the holds they placed on lots.
 */
export class CreateRecall1764673200000 implements MigrationInterface {
  name = 'CreateRecall1764673200000';

  async up(queryRunner: QueryRunner): Promise<void> {
    const statements = [
      `CREATE TABLE IF NOT EXISTS recall_investigation (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        recall_number VARCHAR(20) NOT NULL,
        mode ENUM('recall', 'drill') NOT NULL,
        trigger_kind ENUM('heat', 'piece', 'run', 'supplier') NOT NULL,
        trigger_id INT UNSIGNED NOT NULL,
        window_from DATE NULL,
        window_to DATE NULL,
        trigger_label VARCHAR(300) NOT NULL,
        reason VARCHAR(2000) NOT NULL,
        status ENUM('open', 'closed') NOT NULL DEFAULT 'open',
        opened_by INT UNSIGNED NOT NULL,
        opened_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        closed_at DATETIME(6) NULL,
        PRIMARY KEY (id),
        UNIQUE KEY recall_investigation_number (recall_number),
        KEY recall_investigation_status (status, opened_at),
        CONSTRAINT recall_investigation_opened_by FOREIGN KEY (opened_by) REFERENCES person (id)
      ) ${table}`,
      `CREATE TABLE IF NOT EXISTS recall_snapshot (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        recall_id INT UNSIGNED NOT NULL,
        kind ENUM('opening', 'rerun') NOT NULL,
        taken_by INT UNSIGNED NOT NULL,
        taken_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        content LONGTEXT NOT NULL,
        sha256 CHAR(64) CHARACTER SET ascii NOT NULL,
        PRIMARY KEY (id),
        KEY recall_snapshot_recall (recall_id, id),
        CONSTRAINT recall_snapshot_recall FOREIGN KEY (recall_id) REFERENCES recall_investigation (id),
        CONSTRAINT recall_snapshot_by FOREIGN KEY (taken_by) REFERENCES person (id)
      ) ${table}`,
      `CREATE TABLE IF NOT EXISTS lot_hold (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        lot_id INT UNSIGNED NOT NULL,
        recall_id INT UNSIGNED NULL,
        reason VARCHAR(2000) NOT NULL,
        placed_by INT UNSIGNED NOT NULL,
        placed_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        lifted_at DATETIME(6) NULL,
        lifted_by INT UNSIGNED NULL,
        PRIMARY KEY (id),
        KEY lot_hold_lot (lot_id, lifted_at),
        KEY lot_hold_recall (recall_id),
        CONSTRAINT lot_hold_lot FOREIGN KEY (lot_id) REFERENCES production_lot (id),
        CONSTRAINT lot_hold_recall FOREIGN KEY (recall_id) REFERENCES recall_investigation (id),
        CONSTRAINT lot_hold_placed_by FOREIGN KEY (placed_by) REFERENCES person (id),
        CONSTRAINT lot_hold_lifted_by FOREIGN KEY (lifted_by) REFERENCES person (id)
      ) ${table}`,
    ];
    for (const statement of statements) await queryRunner.query(statement);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const name of ['lot_hold', 'recall_snapshot', 'recall_investigation']) await queryRunner.query(`DROP TABLE IF EXISTS ${name}`);
  }
}
