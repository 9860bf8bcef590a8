import type { MigrationInterface, QueryRunner } from 'typeorm';

/** The firm that runs Ingotrace: its name, site and GS1 company prefix. */
export class CreateOrganisation1764633600000 implements MigrationInterface {
  name = 'CreateOrganisation1764633600000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE IF NOT EXISTS organisation (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        name VARCHAR(200) NOT NULL,
        site VARCHAR(200) NOT NULL,
        address VARCHAR(500) NOT NULL,
        gs1_company_prefix VARCHAR(12) NULL,
        created_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (id)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE IF EXISTS organisation');
  }
}
