import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The device maker's own check analysis of heats: sampling rules (each change a new row, the
 * latest per scope in force; null supplier or specification means "any") and the check results
 * entered with their evaluation against the widened limits. Both are kept as entered.
 */
export class CreateCheckAnalysis1764691200000 implements MigrationInterface {
  name = 'CreateCheckAnalysis1764691200000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE IF NOT EXISTS check_analysis_rule (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        supplier_id INT UNSIGNED NULL,
        spec_id VARCHAR(40) NULL,
        every_nth_heat SMALLINT UNSIGNED NULL,
        every_heat_when_conditional TINYINT(1) NOT NULL,
        reason VARCHAR(1000) NOT NULL,
        set_by INT UNSIGNED NOT NULL,
        set_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (id),
        KEY check_analysis_rule_scope (supplier_id, spec_id, id),
        CONSTRAINT check_analysis_rule_supplier FOREIGN KEY (supplier_id) REFERENCES supplier (id),
        CONSTRAINT check_analysis_rule_person FOREIGN KEY (set_by) REFERENCES person (id)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`,
    );
    await queryRunner.query(
      `CREATE TABLE IF NOT EXISTS check_analysis (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        heat_id INT UNSIGNED NOT NULL,
        laboratory VARCHAR(160) NOT NULL,
        report_reference VARCHAR(80) NOT NULL,
        results_json TEXT NOT NULL,
        evaluation_json TEXT NOT NULL,
        verdict VARCHAR(20) CHARACTER SET ascii NOT NULL,
        recorded_by INT UNSIGNED NOT NULL,
        recorded_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (id),
        KEY check_analysis_heat (heat_id, id),
        CONSTRAINT check_analysis_heat FOREIGN KEY (heat_id) REFERENCES heat (id),
        CONSTRAINT check_analysis_person FOREIGN KEY (recorded_by) REFERENCES person (id)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`,
    );
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE IF EXISTS check_analysis');
    await queryRunner.query('DROP TABLE IF EXISTS check_analysis_rule');
  }
}
