import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A lot sent back from release is "returned" to engineering, not "rejected": rejection is the
 * terminal status of a lot scrapped through its nonconformance. The stored outcome says so.
 */
export class NameReturnedReleaseOutcome1764716400000 implements MigrationInterface {
  name = 'NameReturnedReleaseOutcome1764716400000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query("ALTER TABLE release_submission MODIFY outcome ENUM('pending', 'released', 'rejected', 'returned') NOT NULL DEFAULT 'pending'");
    await queryRunner.query("UPDATE release_submission SET outcome = 'returned' WHERE outcome = 'rejected'");
    await queryRunner.query("ALTER TABLE release_submission MODIFY outcome ENUM('pending', 'released', 'returned') NOT NULL DEFAULT 'pending'");
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query("ALTER TABLE release_submission MODIFY outcome ENUM('pending', 'released', 'rejected', 'returned') NOT NULL DEFAULT 'pending'");
    await queryRunner.query("UPDATE release_submission SET outcome = 'rejected' WHERE outcome = 'returned'");
    await queryRunner.query("ALTER TABLE release_submission MODIFY outcome ENUM('pending', 'released', 'rejected') NOT NULL DEFAULT 'pending'");
  }
}
