import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Granting or removing a signing role waits for a second administrator's signed confirmation:
 * each requested change is kept with the roles before and after and how it was decided. The
 * organisation states whether an administrator may also be a QA approver (no, unless changed).
 */
export class AddRoleChangeConfirmation1764702000000 implements MigrationInterface {
  name = 'AddRoleChangeConfirmation1764702000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE organisation ADD COLUMN administrators_may_approve TINYINT(1) NOT NULL DEFAULT 0');
    await queryRunner.query(
      `CREATE TABLE IF NOT EXISTS role_change_request (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        person_id INT UNSIGNED NOT NULL,
        roles_before VARCHAR(300) CHARACTER SET ascii NOT NULL,
        roles_after VARCHAR(300) CHARACTER SET ascii NOT NULL,
        reason VARCHAR(1000) NOT NULL,
        requested_by INT UNSIGNED NOT NULL,
        requested_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        status ENUM('pending', 'confirmed', 'refused') NOT NULL DEFAULT 'pending',
        decided_by INT UNSIGNED NULL,
        decided_at DATETIME(6) NULL,
        PRIMARY KEY (id),
        KEY role_change_request_person (person_id, status),
        CONSTRAINT role_change_request_person FOREIGN KEY (person_id) REFERENCES person (id),
        CONSTRAINT role_change_request_requester FOREIGN KEY (requested_by) REFERENCES person (id),
        CONSTRAINT role_change_request_decider FOREIGN KEY (decided_by) REFERENCES person (id)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`,
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE IF EXISTS role_change_request');
    await queryRunner.query('ALTER TABLE organisation DROP COLUMN administrators_may_approve');
  }
}
