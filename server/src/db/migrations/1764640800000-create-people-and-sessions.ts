import type { MigrationInterface, QueryRunner } from 'typeorm';

/** People provisioned from the identity provider, their roles, HTTP sessions and SAML caches. */
export class CreatePeopleAndSessions1764640800000 implements MigrationInterface {
  name = 'CreatePeopleAndSessions1764640800000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE IF NOT EXISTS person (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        subject VARCHAR(255) NOT NULL,
        name VARCHAR(200) NOT NULL,
        email VARCHAR(320) NOT NULL,
        active TINYINT(1) NOT NULL DEFAULT 1,
        created_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        last_sign_in_at DATETIME(6) NULL,
        PRIMARY KEY (id),
        UNIQUE KEY person_subject (subject),
        KEY person_name (name)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await queryRunner.query(`
      CREATE TABLE IF NOT EXISTS person_role (
        person_id INT UNSIGNED NOT NULL,
        role VARCHAR(40) NOT NULL,
        source ENUM('identity-provider', 'administrator') NOT NULL,
        PRIMARY KEY (person_id, role, source),
        CONSTRAINT person_role_person FOREIGN KEY (person_id) REFERENCES person (id)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await queryRunner.query(`
      CREATE TABLE IF NOT EXISTS person_role_withdrawal (
        person_id INT UNSIGNED NOT NULL,
        role VARCHAR(40) NOT NULL,
        PRIMARY KEY (person_id, role),
        CONSTRAINT person_role_withdrawal_person FOREIGN KEY (person_id) REFERENCES person (id)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
    await queryRunner.query(`
      CREATE TABLE IF NOT EXISTS http_session (
        session_id VARCHAR(128) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
        expires INT UNSIGNED NOT NULL,
        data MEDIUMTEXT COLLATE utf8mb4_bin,
        PRIMARY KEY (session_id),
        KEY http_session_expires (expires)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4`);
    await queryRunner.query(`
      CREATE TABLE IF NOT EXISTS saml_request (
        id VARCHAR(255) CHARACTER SET ascii NOT NULL,
        value TEXT NOT NULL,
        created_at DATETIME(6) NOT NULL,
        PRIMARY KEY (id),
        KEY saml_request_created (created_at)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4`);
    await queryRunner.query(`
      CREATE TABLE IF NOT EXISTS saml_assertion_used (
        assertion_id VARCHAR(255) CHARACTER SET ascii NOT NULL,
        used_at DATETIME(6) NOT NULL,
        expires_at DATETIME(6) NOT NULL,
        PRIMARY KEY (assertion_id),
        KEY saml_assertion_used_expires (expires_at)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4`);
    await queryRunner.query(`
      CREATE TABLE IF NOT EXISTS reauthentication (
        id CHAR(32) CHARACTER SET ascii NOT NULL,
        person_id INT UNSIGNED NOT NULL,
        purpose VARCHAR(300) NOT NULL,
        binding_hash CHAR(64) CHARACTER SET ascii NOT NULL,
        return_to VARCHAR(500) NOT NULL,
        started_at DATETIME(6) NOT NULL,
        confirmed_at DATETIME(6) NULL,
        authn_instant DATETIME(6) NULL,
        refused_reason VARCHAR(300) NULL,
        used_at DATETIME(6) NULL,
        PRIMARY KEY (id),
        KEY reauthentication_person (person_id),
        CONSTRAINT reauthentication_person FOREIGN KEY (person_id) REFERENCES person (id)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const table of ['reauthentication', 'saml_assertion_used', 'saml_request', 'http_session', 'person_role_withdrawal', 'person_role', 'person']) {
      await queryRunner.query(`DROP TABLE IF EXISTS ${table}`);
    }
  }
}
