import type { MigrationInterface, QueryRunner } from 'typeorm';

/** The plant's time zone (an IANA name): every date and time people read is on its clock. */
export class AddPlantTimeZone1764712800000 implements MigrationInterface {
  name = 'AddPlantTimeZone1764712800000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query("ALTER TABLE organisation ADD COLUMN time_zone VARCHAR(64) CHARACTER SET ascii NOT NULL DEFAULT 'UTC'");
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE organisation DROP COLUMN time_zone');
  }
}
