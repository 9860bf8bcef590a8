import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The heat number read off a bar at receipt (typed or scanned) and found to match its
 * certificate; null for bar received before receipts were confirmed. A cut piece carries its
 * parent's.
 */
export class AddBarHeatMarking1764687600000 implements MigrationInterface {
  name = 'AddBarHeatMarking1764687600000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE bar_piece ADD COLUMN IF NOT EXISTS marked_heat_number VARCHAR(60) NULL AFTER heat_id');
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE bar_piece DROP COLUMN IF EXISTS marked_heat_number');
  }
}
