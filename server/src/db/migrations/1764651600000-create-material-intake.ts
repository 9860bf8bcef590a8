import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Material intake: the specification library's revisions (immutable once used), suppliers and
 * their approval, heats with their certificate documents, reported results and evaluations.
 */
export class CreateMaterialIntake1764651600000 implements MigrationInterface {
  name = 'CreateMaterialIntake1764651600000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE IF NOT EXISTS specification_revision (
        spec_id VARCHAR(40) NOT NULL,
        revision VARCHAR(20) NOT NULL,
        title VARCHAR(300) NOT NULL,
        edition VARCHAR(200) NOT NULL,
        definition_json LONGTEXT NOT NULL,
        definition_hash CHAR(64) CHARACTER SET ascii NOT NULL,
        created_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (spec_id, revision)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await queryRunner.query(`
      CREATE TABLE IF NOT EXISTS supplier (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        name VARCHAR(200) NOT NULL,
        country VARCHAR(100) NOT NULL,
        approval ENUM('approved', 'conditional', 'disqualified') NOT NULL,
        created_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (id),
        UNIQUE KEY supplier_name (name)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await queryRunner.query(`
      CREATE TABLE IF NOT EXISTS heat (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        heat_number VARCHAR(60) NOT NULL,
        supplier_id INT UNSIGNED NOT NULL,
        spec_id VARCHAR(40) NOT NULL,
        spec_revision VARCHAR(20) NOT NULL,
        grade VARCHAR(20) NULL,
        melt_route VARCHAR(100) NOT NULL,
        product_form VARCHAR(20) NOT NULL,
        size_mm DECIMAL(9,3) NOT NULL,
        heat_condition VARCHAR(40) NOT NULL,
        status ENUM('received', 'accepted', 'rejected', 'quarantined') NOT NULL DEFAULT 'received',
        received_by INT UNSIGNED NOT NULL,
        received_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (id),
        UNIQUE KEY heat_supplier_number (supplier_id, heat_number),
        KEY heat_spec (spec_id, spec_revision),
        KEY heat_received (received_at),
        CONSTRAINT heat_supplier FOREIGN KEY (supplier_id) REFERENCES supplier (id),
        CONSTRAINT heat_specification FOREIGN KEY (spec_id, spec_revision) REFERENCES specification_revision (spec_id, revision),
        CONSTRAINT heat_received_by FOREIGN KEY (received_by) REFERENCES person (id)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await queryRunner.query(`
      CREATE TABLE IF NOT EXISTS certificate_document (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        sha256 CHAR(64) CHARACTER SET ascii NOT NULL,
        media_type VARCHAR(60) NOT NULL,
        size_bytes INT UNSIGNED NOT NULL,
        original_name VARCHAR(255) NOT NULL,
        content LONGBLOB NOT NULL,
        uploaded_by INT UNSIGNED NOT NULL,
        uploaded_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (id),
        UNIQUE KEY certificate_document_sha256 (sha256)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await queryRunner.query(`
      CREATE TABLE IF NOT EXISTS heat_certificate (
        heat_id INT UNSIGNED NOT NULL,
        document_id INT UNSIGNED NOT NULL,
        attached_by INT UNSIGNED NOT NULL,
        attached_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (heat_id, document_id),
        KEY heat_certificate_document (document_id),
        CONSTRAINT heat_certificate_heat FOREIGN KEY (heat_id) REFERENCES heat (id),
        CONSTRAINT heat_certificate_document FOREIGN KEY (document_id) REFERENCES certificate_document (id)
      ) ENGINE=InnoDB`);
    await queryRunner.query(`
      CREATE TABLE IF NOT EXISTS heat_result (
        heat_id INT UNSIGNED NOT NULL,
        kind ENUM('chemistry', 'mechanical') NOT NULL,
        item VARCHAR(40) NOT NULL,
        as_reported VARCHAR(40) NOT NULL,
        value DECIMAL(16,6) NOT NULL,
        PRIMARY KEY (heat_id, kind, item),
        CONSTRAINT heat_result_heat FOREIGN KEY (heat_id) REFERENCES heat (id)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await queryRunner.query(`
      CREATE TABLE IF NOT EXISTS heat_evaluation (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        heat_id INT UNSIGNED NOT NULL,
        spec_id VARCHAR(40) NOT NULL,
        spec_revision VARCHAR(20) NOT NULL,
        verdict ENUM('conforms', 'does-not-conform', 'incomplete') NOT NULL,
        evaluation_json LONGTEXT NOT NULL,
        evaluated_by INT UNSIGNED NOT NULL,
        evaluated_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (id),
        KEY heat_evaluation_heat (heat_id),
        CONSTRAINT heat_evaluation_heat FOREIGN KEY (heat_id) REFERENCES heat (id),
        CONSTRAINT heat_evaluation_specification FOREIGN KEY (spec_id, spec_revision) REFERENCES specification_revision (spec_id, revision)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const table of ['heat_evaluation', 'heat_result', 'heat_certificate', 'certificate_document', 'heat', 'supplier', 'specification_revision']) {
      await queryRunner.query(`DROP TABLE IF EXISTS ${table}`);
    }
  }
}
