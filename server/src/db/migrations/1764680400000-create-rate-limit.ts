import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Hits per client and fixed time window for the rate limits, shared by every app instance. */
export class CreateRateLimit1764680400000 implements MigrationInterface {
  name = 'CreateRateLimit1764680400000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE IF NOT EXISTS rate_limit_window (
        bucket VARCHAR(200) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
        window_start BIGINT UNSIGNED NOT NULL,
        hits INT UNSIGNED NOT NULL,
        PRIMARY KEY (bucket, window_start),
        KEY rate_limit_window_start (window_start)
      ) ENGINE=InnoDB DEFAULT CHARSET=ascii`,
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE IF EXISTS rate_limit_window');
  }
}
