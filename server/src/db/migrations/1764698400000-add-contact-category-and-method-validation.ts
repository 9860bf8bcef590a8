import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A part states where its device touches the body (its endotoxin limit follows from it); parts
 * registered before this default to blood, lymph, bone or other tissue, the category every
 * shipped limit assumed until now. A firm's own validation of a process method for a material
 * outside the method's published scope is kept as rows that are added, never rewritten: the
 * latest row for a method and material says whether it stands.
 */
export class AddContactCategoryAndMethodValidation1764698400000 implements MigrationInterface {
  name = 'AddContactCategoryAndMethodValidation1764698400000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE part ADD COLUMN contact_category ENUM('general-tissue', 'cerebrospinal-fluid') NOT NULL DEFAULT 'general-tissue' AFTER lot_pattern`);
    await queryRunner.query(
      `CREATE TABLE IF NOT EXISTS process_method_validation (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        method_id VARCHAR(40) CHARACTER SET ascii NOT NULL,
        material_family VARCHAR(40) CHARACTER SET ascii NOT NULL,
        stands TINYINT(1) NOT NULL,
        reference VARCHAR(120) NOT NULL,
        reason VARCHAR(1000) NOT NULL,
        recorded_by INT UNSIGNED NOT NULL,
        recorded_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (id),
        KEY process_method_validation_scope (method_id, material_family, id),
        CONSTRAINT process_method_validation_person FOREIGN KEY (recorded_by) REFERENCES person (id)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`,
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE IF EXISTS process_method_validation');
    await queryRunner.query('ALTER TABLE part DROP COLUMN contact_category');
  }
}
