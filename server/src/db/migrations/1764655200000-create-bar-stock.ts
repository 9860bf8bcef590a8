import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Bar pieces received against a heat; a cut turns one piece into child pieces with their own tags. */
export class CreateBarStock1764655200000 implements MigrationInterface {
  name = 'CreateBarStock1764655200000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE IF NOT EXISTS bar_piece (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        tag VARCHAR(40) NOT NULL,
        heat_id INT UNSIGNED NOT NULL,
        parent_id INT UNSIGNED NULL,
        diameter_mm DECIMAL(9,3) NOT NULL,
        length_mm DECIMAL(10,2) NOT NULL,
        mass_kg DECIMAL(10,3) NULL,
        location VARCHAR(100) NOT NULL,
        status ENUM('in-stock', 'cut') NOT NULL DEFAULT 'in-stock',
        created_by INT UNSIGNED NOT NULL,
        created_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (id),
        UNIQUE KEY bar_piece_tag (tag),
        KEY bar_piece_heat (heat_id),
        KEY bar_piece_parent (parent_id),
        CONSTRAINT bar_piece_heat FOREIGN KEY (heat_id) REFERENCES heat (id),
        CONSTRAINT bar_piece_parent FOREIGN KEY (parent_id) REFERENCES bar_piece (id),
        CONSTRAINT bar_piece_created_by FOREIGN KEY (created_by) REFERENCES person (id)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE IF EXISTS bar_piece');
  }
}
