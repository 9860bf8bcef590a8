import type { MigrationInterface, QueryRunner } from 'typeorm';

const table = 'ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci';

/** Release: each submission of a lot for review, labels printed and voided, and the stored release packets. */
export class CreateRelease1764666000000 implements MigrationInterface {
  name = 'CreateRelease1764666000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    const statements = [
      `CREATE TABLE IF NOT EXISTS release_submission (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        lot_id INT UNSIGNED NOT NULL,
        submitted_by INT UNSIGNED NOT NULL,
        submitted_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        dossier_hash CHAR(64) CHARACTER SET ascii NOT NULL,
        outcome ENUM('pending', 'released', 'rejected') NOT NULL DEFAULT 'pending',
        closed_at DATETIME(6) NULL,
        PRIMARY KEY (id),
        KEY release_submission_lot (lot_id, submitted_at),
        KEY release_submission_outcome (outcome, submitted_at),
        CONSTRAINT release_submission_lot FOREIGN KEY (lot_id) REFERENCES production_lot (id),
        CONSTRAINT release_submission_by FOREIGN KEY (submitted_by) REFERENCES person (id)
      ) ${table}`,
      `CREATE TABLE IF NOT EXISTS label_print (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        lot_id INT UNSIGNED NOT NULL,
        kind ENUM('print', 'void') NOT NULL,
        qty INT UNSIGNED NOT NULL,
        reason VARCHAR(500) NULL,
        recorded_by INT UNSIGNED NOT NULL,
        recorded_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (id),
        KEY label_print_lot (lot_id),
        CONSTRAINT label_print_lot FOREIGN KEY (lot_id) REFERENCES production_lot (id),
        CONSTRAINT label_print_by FOREIGN KEY (recorded_by) REFERENCES person (id)
      ) ${table}`,
      `CREATE TABLE IF NOT EXISTS release_packet (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        lot_id INT UNSIGNED NOT NULL,
        submission_id INT UNSIGNED NOT NULL,
        sha256 CHAR(64) CHARACTER SET ascii NOT NULL,
        content LONGBLOB NOT NULL,
        created_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (id),
        UNIQUE KEY release_packet_submission (submission_id),
        KEY release_packet_lot (lot_id),
        CONSTRAINT release_packet_lot FOREIGN KEY (lot_id) REFERENCES production_lot (id),
        CONSTRAINT release_packet_submission FOREIGN KEY (submission_id) REFERENCES release_submission (id)
      ) ${table}`,
    ];
    for (const statement of statements) await queryRunner.query(statement);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const name of ['release_packet', 'label_print', 'release_submission']) await queryRunner.query(`DROP TABLE IF EXISTS ${name}`);
  }
}
