import type { MigrationInterface, QueryRunner } from 'typeorm';

const table = 'ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci';

/**
 * A recall's field action: the strategy the firm chose (effectiveness check level, notice
 * template, reminders), one notice per consignee with its reply link, the consignees' replies
 * (each kept as given; a correction is a new reply) and the returned goods received against it.
 * A mail can now carry one attachment (the notice as a PDF).
 */
export class CreateFieldAction1764723600000 implements MigrationInterface {
  name = 'CreateFieldAction1764723600000';

  async up(queryRunner: QueryRunner): Promise<void> {
    const statements = [
      `CREATE TABLE IF NOT EXISTS recall_field_action (
        recall_id INT UNSIGNED NOT NULL,
        effectiveness_level ENUM('A', 'B', 'C', 'D', 'E') NOT NULL,
        level_b_percent TINYINT UNSIGNED NULL,
        action_asked VARCHAR(1000) NOT NULL,
        notice_template TEXT NOT NULL,
        reminder_every_days TINYINT UNSIGNED NOT NULL,
        escalate_after_reminders TINYINT UNSIGNED NOT NULL,
        set_by INT UNSIGNED NOT NULL,
        set_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (recall_id),
        CONSTRAINT recall_field_action_recall FOREIGN KEY (recall_id) REFERENCES recall_investigation (id),
        CONSTRAINT recall_field_action_set_by FOREIGN KEY (set_by) REFERENCES person (id)
      ) ${table}`,
      `CREATE TABLE IF NOT EXISTS recall_notice (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        recall_id INT UNSIGNED NOT NULL,
        consignee_id INT UNSIGNED NOT NULL,
        reply_token CHAR(43) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
        recipient VARCHAR(200) NULL,
        content LONGTEXT NOT NULL,
        sha256 CHAR(64) CHARACTER SET ascii NOT NULL,
        prepared_by INT UNSIGNED NOT NULL,
        prepared_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        issued_at DATETIME(6) NULL,
        reminders_sent TINYINT UNSIGNED NOT NULL DEFAULT 0,
        last_reminder_at DATETIME(6) NULL,
        escalated_at DATETIME(6) NULL,
        PRIMARY KEY (id),
        UNIQUE KEY recall_notice_consignee (recall_id, consignee_id),
        UNIQUE KEY recall_notice_token (reply_token),
        KEY recall_notice_of_consignee (consignee_id),
        CONSTRAINT recall_notice_recall FOREIGN KEY (recall_id) REFERENCES recall_investigation (id),
        CONSTRAINT recall_notice_consignee_ref FOREIGN KEY (consignee_id) REFERENCES consignee (id),
        CONSTRAINT recall_notice_prepared_by FOREIGN KEY (prepared_by) REFERENCES person (id)
      ) ${table}`,
      `CREATE TABLE IF NOT EXISTS notice_reply (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        notice_id INT UNSIGNED NOT NULL,
        contact_name VARCHAR(200) NOT NULL,
        replied_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        client_address VARCHAR(64) NULL,
        PRIMARY KEY (id),
        KEY notice_reply_of_notice (notice_id, id),
        CONSTRAINT notice_reply_notice FOREIGN KEY (notice_id) REFERENCES recall_notice (id)
      ) ${table}`,
      `CREATE TABLE IF NOT EXISTS notice_reply_lot (
        reply_id INT UNSIGNED NOT NULL,
        lot_id INT UNSIGNED NOT NULL,
        on_hand INT UNSIGNED NOT NULL,
        returned INT UNSIGNED NOT NULL,
        destroyed INT UNSIGNED NOT NULL,
        used INT UNSIGNED NOT NULL,
        PRIMARY KEY (reply_id, lot_id),
        KEY notice_reply_lot_of_lot (lot_id),
        CONSTRAINT notice_reply_lot_reply FOREIGN KEY (reply_id) REFERENCES notice_reply (id),
        CONSTRAINT notice_reply_lot_lot FOREIGN KEY (lot_id) REFERENCES production_lot (id)
      ) ${table}`,
      `CREATE TABLE IF NOT EXISTS returned_goods_receipt (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        recall_id INT UNSIGNED NOT NULL,
        consignee_id INT UNSIGNED NOT NULL,
        lot_id INT UNSIGNED NOT NULL,
        units INT UNSIGNED NOT NULL,
        note VARCHAR(500) NULL,
        received_by INT UNSIGNED NOT NULL,
        received_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (id),
        KEY returned_goods_of_recall (recall_id, consignee_id, lot_id),
        KEY returned_goods_of_consignee (consignee_id),
        KEY returned_goods_of_lot (lot_id),
        CONSTRAINT returned_goods_recall FOREIGN KEY (recall_id) REFERENCES recall_investigation (id),
        CONSTRAINT returned_goods_consignee FOREIGN KEY (consignee_id) REFERENCES consignee (id),
        CONSTRAINT returned_goods_lot FOREIGN KEY (lot_id) REFERENCES production_lot (id),
        CONSTRAINT returned_goods_received_by FOREIGN KEY (received_by) REFERENCES person (id)
      ) ${table}`,
      `ALTER TABLE mail_outbox
        ADD COLUMN IF NOT EXISTS attachment_name VARCHAR(200) NULL,
        ADD COLUMN IF NOT EXISTS attachment_type VARCHAR(100) NULL,
        ADD COLUMN IF NOT EXISTS attachment LONGBLOB NULL`,
    ];
    for (const statement of statements) await queryRunner.query(statement);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      'ALTER TABLE mail_outbox DROP COLUMN IF EXISTS attachment, DROP COLUMN IF EXISTS attachment_type, ' +
        'DROP COLUMN IF EXISTS attachment_name',
    );
    for (const name of ['returned_goods_receipt', 'notice_reply_lot', 'notice_reply', 'recall_notice'])
      await queryRunner.query(`DROP TABLE IF EXISTS ${name}`);
    await queryRunner.query('DROP TABLE IF EXISTS recall_field_action');
  }
}
