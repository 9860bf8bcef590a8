import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A QA reviewer's acknowledgement of a certificate screening finding for one heat, with the
 * reason, stored once: a heat with a finding nobody acknowledged cannot be accepted.
 */
export class CreateScreeningAcknowledgement1764684000000 implements MigrationInterface {
  name = 'CreateScreeningAcknowledgement1764684000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE IF NOT EXISTS screening_acknowledgement (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        heat_id INT UNSIGNED NOT NULL,
        finding_key VARCHAR(160) CHARACTER SET ascii NOT NULL,
        kind VARCHAR(40) CHARACTER SET ascii NOT NULL,
        explanation TEXT NOT NULL,
        reason VARCHAR(1000) NOT NULL,
        acknowledged_by INT UNSIGNED NOT NULL,
        acknowledged_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (id),
        UNIQUE KEY screening_acknowledgement_finding (heat_id, finding_key),
        CONSTRAINT screening_acknowledgement_heat FOREIGN KEY (heat_id) REFERENCES heat (id),
        CONSTRAINT screening_acknowledgement_person FOREIGN KEY (acknowledged_by) REFERENCES person (id)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`,
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE IF EXISTS screening_acknowledgement');
  }
}
