import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Evaluations gain a third outcome, "cannot be evaluated" (stored evaluations keep the older
 * "incomplete", read as cannot be evaluated), and heat conditions become the controlled values:
 * free-text conditions that name one ("Annealed", "cold worked") are rewritten to it. A
 * signature's printed manifestation gets room for a long name with a long meaning.
 */
export class AddCannotBeEvaluated1764694800000 implements MigrationInterface {
  name = 'AddCannotBeEvaluated1764694800000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE heat_evaluation MODIFY verdict ENUM('conforms', 'does-not-conform', 'incomplete', 'cannot-be-evaluated') NOT NULL`);
    await queryRunner.query('ALTER TABLE electronic_signature MODIFY signed_at_text VARCHAR(200) NOT NULL');
    await queryRunner.query(
      `UPDATE heat SET heat_condition = LOWER(REPLACE(REPLACE(TRIM(heat_condition), ' ', '-'), '_', '-'))
       WHERE LOWER(REPLACE(REPLACE(TRIM(heat_condition), ' ', '-'), '_', '-')) IN ('annealed', 'cold-worked', 'hot-worked', 'warm-worked', 'extra-hard')
         AND heat_condition <> LOWER(REPLACE(REPLACE(TRIM(heat_condition), ' ', '-'), '_', '-'))`,
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE heat_evaluation MODIFY verdict ENUM('conforms', 'does-not-conform', 'incomplete') NOT NULL`);
  }
}
