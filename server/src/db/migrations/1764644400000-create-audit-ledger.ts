import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The audit ledger: append-only and hash-chained. Triggers refuse UPDATE and DELETE for every
 * account; the app account is also granted only SELECT and INSERT (table-privileges.ts). Writers
 * serialise on the single chain-head row (SELECT … FOR UPDATE), which also holds on Galera.
 */
export class CreateAuditLedger1764644400000 implements MigrationInterface {
  name = 'CreateAuditLedger1764644400000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE IF NOT EXISTS audit_event (
        seq BIGINT UNSIGNED NOT NULL,
        occurred_at DATETIME(6) NOT NULL,
        actor_id INT UNSIGNED NULL,
        actor_name VARCHAR(200) NULL,
        actor_role VARCHAR(40) NULL,
        action VARCHAR(60) NOT NULL,
        entity_type VARCHAR(60) NOT NULL,
        entity_id VARCHAR(100) NULL,
        before_json LONGTEXT NULL,
        after_json LONGTEXT NULL,
        reason VARCHAR(1000) NULL,
        request_id VARCHAR(128) NULL,
        client_address VARCHAR(64) NULL,
        previous_hash CHAR(64) CHARACTER SET ascii NOT NULL,
        hash CHAR(64) CHARACTER SET ascii NOT NULL,
        PRIMARY KEY (seq),
        KEY audit_event_time (occurred_at),
        KEY audit_event_entity (entity_type, entity_id),
        KEY audit_event_actor (actor_id),
        KEY audit_event_action (action)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await queryRunner.query(`
      CREATE TABLE IF NOT EXISTS audit_chain_head (
        id TINYINT UNSIGNED NOT NULL,
        seq BIGINT UNSIGNED NOT NULL,
        hash CHAR(64) CHARACTER SET ascii NOT NULL,
        PRIMARY KEY (id)
      ) ENGINE=InnoDB`);
    await queryRunner.query(`INSERT IGNORE INTO audit_chain_head (id, seq, hash) VALUES (1, 0, REPEAT('0', 64))`);
    await queryRunner.query('DROP TRIGGER IF EXISTS audit_event_refuse_update');
    await queryRunner.query(`
      CREATE TRIGGER audit_event_refuse_update BEFORE UPDATE ON audit_event FOR EACH ROW
        SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'audit_event is append-only: rows cannot be changed'`);
    await queryRunner.query('DROP TRIGGER IF EXISTS audit_event_refuse_delete');
    await queryRunner.query(`
      CREATE TRIGGER audit_event_refuse_delete BEFORE DELETE ON audit_event FOR EACH ROW
        SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'audit_event is append-only: rows cannot be deleted'`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TRIGGER IF EXISTS audit_event_refuse_delete');
    await queryRunner.query('DROP TRIGGER IF EXISTS audit_event_refuse_update');
    await queryRunner.query('DROP TABLE IF EXISTS audit_chain_head');
    await queryRunner.query('DROP TABLE IF EXISTS audit_event');
  }
}
