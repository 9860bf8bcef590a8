import type { MigrationInterface, QueryRunner } from 'typeorm';

/** A recall investigation may start from a part (every lot made as it), as a forward trace can. */
export class AddPartRecallTrigger1764709200000 implements MigrationInterface {
  name = 'AddPartRecallTrigger1764709200000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query("ALTER TABLE recall_investigation MODIFY trigger_kind ENUM('heat', 'piece', 'run', 'supplier', 'part') NOT NULL");
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query("ALTER TABLE recall_investigation MODIFY trigger_kind ENUM('heat', 'piece', 'run', 'supplier') NOT NULL");
  }
}
