import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Proposed new revisions of a specification; one becomes a stored revision when a QA approver signs it. */
export class CreateSpecificationDrafts1764658800000 implements MigrationInterface {
  name = 'CreateSpecificationDrafts1764658800000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE IF NOT EXISTS specification_draft (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        spec_id VARCHAR(40) NOT NULL,
        base_revision VARCHAR(20) NOT NULL,
        revision VARCHAR(20) NOT NULL,
        definition_json LONGTEXT NOT NULL,
        note VARCHAR(1000) NOT NULL,
        status ENUM('draft', 'approved', 'rejected') NOT NULL DEFAULT 'draft',
        created_by INT UNSIGNED NOT NULL,
        created_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (id),
        KEY specification_draft_spec (spec_id),
        CONSTRAINT specification_draft_base FOREIGN KEY (spec_id, base_revision) REFERENCES specification_revision (spec_id, revision),
        CONSTRAINT specification_draft_author FOREIGN KEY (created_by) REFERENCES person (id)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE IF EXISTS specification_draft');
  }
}
