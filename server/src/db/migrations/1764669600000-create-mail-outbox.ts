import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Outgoing e-mail, written in the same transaction as the change it reports, then delivered by
 * the mail worker with retries: a mail server that is down delays a notification, it never
 * loses one or blocks the change.
 */
export class CreateMailOutbox1764669600000 implements MigrationInterface {
  name = 'CreateMailOutbox1764669600000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE IF NOT EXISTS mail_outbox (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        recipients TEXT NOT NULL,
        subject VARCHAR(300) NOT NULL,
        body_text TEXT NOT NULL,
        event VARCHAR(60) NOT NULL,
        entity_type VARCHAR(60) NOT NULL,
        entity_id VARCHAR(100) NOT NULL,
        created_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        attempts INT UNSIGNED NOT NULL DEFAULT 0,
        next_attempt_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        sent_at DATETIME(6) NULL,
        last_error VARCHAR(1000) NULL,
        PRIMARY KEY (id),
        KEY mail_outbox_due (sent_at, next_attempt_at)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE IF EXISTS mail_outbox');
  }
}
