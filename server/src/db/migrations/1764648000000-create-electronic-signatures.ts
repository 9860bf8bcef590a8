import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Electronic signatures: append-only like the ledger. Each row binds the signer, the meaning and
 * the moment to the SHA-256 of the canonical JSON of exactly what was shown, with the evidence
 * of the re-authentication. Withdrawing a signature is a new row that names the one withdrawn.
 */
export class CreateElectronicSignatures1764648000000 implements MigrationInterface {
  name = 'CreateElectronicSignatures1764648000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE IF NOT EXISTS electronic_signature (
        id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT,
        record_type VARCHAR(60) NOT NULL,
        record_id VARCHAR(100) NOT NULL,
        meaning VARCHAR(40) NOT NULL,
        reason VARCHAR(1000) NULL,
        signer_id INT UNSIGNED NOT NULL,
        signer_name VARCHAR(200) NOT NULL,
        signer_role VARCHAR(40) NOT NULL,
        signed_at DATETIME(6) NOT NULL,
        signed_at_text VARCHAR(80) NOT NULL,
        content_hash CHAR(64) CHARACTER SET ascii NOT NULL,
        content_json LONGTEXT NOT NULL,
        reauthentication_id CHAR(32) CHARACTER SET ascii NOT NULL,
        authn_instant DATETIME(6) NOT NULL,
        withdraws_signature_id BIGINT UNSIGNED NULL,
        ledger_seq BIGINT UNSIGNED NOT NULL,
        PRIMARY KEY (id),
        UNIQUE KEY electronic_signature_reauthentication (reauthentication_id),
        KEY electronic_signature_record (record_type, record_id),
        KEY electronic_signature_signer (signer_id)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await queryRunner.query('DROP TRIGGER IF EXISTS electronic_signature_refuse_update');
    await queryRunner.query(`
      CREATE TRIGGER electronic_signature_refuse_update BEFORE UPDATE ON electronic_signature FOR EACH ROW
        SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'electronic_signature is append-only: a signature is never changed; withdraw it with a new one'`);
    await queryRunner.query('DROP TRIGGER IF EXISTS electronic_signature_refuse_delete');
    await queryRunner.query(`
      CREATE TRIGGER electronic_signature_refuse_delete BEFORE DELETE ON electronic_signature FOR EACH ROW
        SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'electronic_signature is append-only: a signature is never deleted'`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TRIGGER IF EXISTS electronic_signature_refuse_delete');
    await queryRunner.query('DROP TRIGGER IF EXISTS electronic_signature_refuse_update');
    await queryRunner.query('DROP TABLE IF EXISTS electronic_signature');
  }
}
