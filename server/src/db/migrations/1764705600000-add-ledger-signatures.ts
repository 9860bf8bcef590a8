import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Every audit ledger event carries an Ed25519 signature by a key kept outside the database, so
 * that an event appended through the app's database account with a recomputed hash no longer
 * verifies. Events written before this carry none; the first signed event after them says so
 * (action ledger.signing-started) and covers them through the hash chain.
 */
export class AddLedgerSignatures1764705600000 implements MigrationInterface {
  name = 'AddLedgerSignatures1764705600000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE audit_event ADD COLUMN signature VARCHAR(100) CHARACTER SET ascii NULL, ADD COLUMN key_id CHAR(16) CHARACTER SET ascii NULL');
    await queryRunner.query('ALTER TABLE audit_chain_head ADD COLUMN signed TINYINT(1) NOT NULL DEFAULT 0');
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE audit_chain_head DROP COLUMN signed');
    await queryRunner.query('ALTER TABLE audit_event DROP COLUMN key_id, DROP COLUMN signature');
  }
}
