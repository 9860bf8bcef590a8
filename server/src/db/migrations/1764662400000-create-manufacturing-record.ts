import type { MigrationInterface, QueryRunner } from 'typeorm';

const table = 'ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci';

/**
 * The manufacturing record: parts with their routings, production lots, bar issued to them,
 * operations and inspections, passivation and cleaning runs, nonconformances, lot splits and
 * merges, consignees and shipments.
 */
export class CreateManufacturingRecord1764662400000 implements MigrationInterface {
  name = 'CreateManufacturingRecord1764662400000';

  async up(queryRunner: QueryRunner): Promise<void> {
    const statements = [
      `CREATE TABLE IF NOT EXISTS part (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        part_number VARCHAR(40) NOT NULL,
        revision VARCHAR(10) NOT NULL,
        description VARCHAR(200) NOT NULL,
        gtin CHAR(14) CHARACTER SET ascii NOT NULL,
        unit_length_mm DECIMAL(10,2) NOT NULL,
        cutoff_allowance_mm DECIMAL(10,2) NOT NULL,
        unit_mass_g DECIMAL(10,3) NULL,
        reconciliation_tolerance_pct DECIMAL(5,2) NOT NULL,
        lot_pattern VARCHAR(60) NOT NULL,
        created_by INT UNSIGNED NOT NULL,
        created_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (id),
        UNIQUE KEY part_number_revision (part_number, revision),
        UNIQUE KEY part_gtin (gtin),
        CONSTRAINT part_created_by FOREIGN KEY (created_by) REFERENCES person (id)
      ) ${table}`,
      `CREATE TABLE IF NOT EXISTS part_specification (
        part_id INT UNSIGNED NOT NULL,
        spec_id VARCHAR(40) NOT NULL,
        grade VARCHAR(20) NOT NULL DEFAULT '',
        PRIMARY KEY (part_id, spec_id, grade),
        CONSTRAINT part_specification_part FOREIGN KEY (part_id) REFERENCES part (id)
      ) ${table}`,
      `CREATE TABLE IF NOT EXISTS routing_step (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        part_id INT UNSIGNED NOT NULL,
        step_no SMALLINT UNSIGNED NOT NULL,
        kind ENUM('machining', 'passivation', 'cleaning', 'inspection', 'packaging') NOT NULL,
        name VARCHAR(100) NOT NULL,
        process_method VARCHAR(40) NULL,
        sample_size INT UNSIGNED NULL,
        accept_number INT UNSIGNED NULL,
        reject_number INT UNSIGNED NULL,
        PRIMARY KEY (id),
        UNIQUE KEY routing_step_order (part_id, step_no),
        CONSTRAINT routing_step_part FOREIGN KEY (part_id) REFERENCES part (id)
      ) ${table}`,
      `CREATE TABLE IF NOT EXISTS production_lot (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        lot_number VARCHAR(20) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
        part_id INT UNSIGNED NOT NULL,
        planned_qty INT UNSIGNED NOT NULL,
        start_qty INT UNSIGNED NULL,
        origin ENUM('bar', 'split', 'merge') NOT NULL DEFAULT 'bar',
        resumes_after_step SMALLINT UNSIGNED NOT NULL DEFAULT 0,
        status VARCHAR(20) NOT NULL DEFAULT 'open',
        released_qty INT UNSIGNED NOT NULL DEFAULT 0,
        opened_by INT UNSIGNED NOT NULL,
        opened_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (id),
        UNIQUE KEY production_lot_number (lot_number),
        KEY production_lot_part (part_id, opened_at),
        KEY production_lot_status (status, opened_at),
        KEY production_lot_opened (opened_at),
        CONSTRAINT production_lot_part FOREIGN KEY (part_id) REFERENCES part (id),
        CONSTRAINT production_lot_opened_by FOREIGN KEY (opened_by) REFERENCES person (id)
      ) ${table}`,
      `CREATE TABLE IF NOT EXISTS material_movement (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        lot_id INT UNSIGNED NOT NULL,
        bar_piece_id INT UNSIGNED NOT NULL,
        kind ENUM('issue', 'return') NOT NULL,
        length_mm DECIMAL(10,2) NOT NULL,
        recorded_by INT UNSIGNED NOT NULL,
        recorded_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (id),
        KEY material_movement_lot (lot_id),
        KEY material_movement_piece (bar_piece_id),
        CONSTRAINT material_movement_lot FOREIGN KEY (lot_id) REFERENCES production_lot (id),
        CONSTRAINT material_movement_piece FOREIGN KEY (bar_piece_id) REFERENCES bar_piece (id),
        CONSTRAINT material_movement_recorded_by FOREIGN KEY (recorded_by) REFERENCES person (id)
      ) ${table}`,
      `CREATE TABLE IF NOT EXISTS lot_operation (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        lot_id INT UNSIGNED NOT NULL,
        routing_step_id INT UNSIGNED NOT NULL,
        operator_name VARCHAR(200) NOT NULL,
        work_centre VARCHAR(60) NOT NULL,
        program_revision VARCHAR(60) NULL,
        started_at DATETIME(6) NOT NULL,
        ended_at DATETIME(6) NOT NULL,
        qty_in INT UNSIGNED NOT NULL,
        qty_good INT UNSIGNED NOT NULL,
        qty_scrap INT UNSIGNED NOT NULL,
        scrap_reasons TEXT NOT NULL,
        sample_size INT UNSIGNED NULL,
        defects_found INT UNSIGNED NULL,
        verdict ENUM('accept', 'reject') NULL,
        process_run_id INT UNSIGNED NULL,
        notes TEXT NULL,
        recorded_by INT UNSIGNED NOT NULL,
        recorded_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (id),
        UNIQUE KEY lot_operation_step (lot_id, routing_step_id),
        KEY lot_operation_run (process_run_id),
        CONSTRAINT lot_operation_lot FOREIGN KEY (lot_id) REFERENCES production_lot (id),
        CONSTRAINT lot_operation_routing_step FOREIGN KEY (routing_step_id) REFERENCES routing_step (id),
        CONSTRAINT lot_operation_recorded_by FOREIGN KEY (recorded_by) REFERENCES person (id)
      ) ${table}`,
      `CREATE TABLE IF NOT EXISTS operation_file (
        operation_id INT UNSIGNED NOT NULL,
        document_id INT UNSIGNED NOT NULL,
        name VARCHAR(200) NOT NULL,
        attached_by INT UNSIGNED NOT NULL,
        attached_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (operation_id, document_id),
        CONSTRAINT operation_file_operation FOREIGN KEY (operation_id) REFERENCES lot_operation (id),
        CONSTRAINT operation_file_document FOREIGN KEY (document_id) REFERENCES certificate_document (id)
      ) ${table}`,
      `CREATE TABLE IF NOT EXISTS process_run (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        run_number VARCHAR(30) NOT NULL,
        kind ENUM('passivation', 'cleaning') NOT NULL,
        method_id VARCHAR(40) NOT NULL,
        equipment VARCHAR(60) NOT NULL,
        parameters_json TEXT NOT NULL,
        window_check_json TEXT NOT NULL,
        in_window TINYINT(1) NOT NULL,
        operator_name VARCHAR(200) NOT NULL,
        run_at DATETIME(6) NOT NULL,
        recorded_by INT UNSIGNED NOT NULL,
        recorded_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (id),
        UNIQUE KEY process_run_number (run_number),
        KEY process_run_at (run_at),
        CONSTRAINT process_run_recorded_by FOREIGN KEY (recorded_by) REFERENCES person (id)
      ) ${table}`,
      `CREATE TABLE IF NOT EXISTS nonconformance (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        nc_number VARCHAR(20) NOT NULL,
        subject_type ENUM('heat', 'bar-piece', 'lot', 'process-run') NOT NULL,
        subject_id INT UNSIGNED NOT NULL,
        lot_id INT UNSIGNED NULL,
        process_run_id INT UNSIGNED NULL,
        source ENUM('raised', 'run-window') NOT NULL DEFAULT 'raised',
        description TEXT NOT NULL,
        containment TEXT NOT NULL,
        status ENUM('open', 'dispositioned', 'closed') NOT NULL DEFAULT 'open',
        disposition ENUM('use-as-is', 'rework', 'scrap', 'return-to-supplier') NULL,
        disposition_note TEXT NULL,
        raised_by INT UNSIGNED NOT NULL,
        raised_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (id),
        UNIQUE KEY nonconformance_number (nc_number),
        KEY nonconformance_subject (subject_type, subject_id),
        KEY nonconformance_lot (lot_id),
        KEY nonconformance_status (status, raised_at),
        CONSTRAINT nonconformance_raised_by FOREIGN KEY (raised_by) REFERENCES person (id)
      ) ${table}`,
      `CREATE TABLE IF NOT EXISTS lot_link (
        parent_lot_id INT UNSIGNED NOT NULL,
        child_lot_id INT UNSIGNED NOT NULL,
        kind ENUM('split', 'merge') NOT NULL,
        qty INT UNSIGNED NOT NULL,
        after_step SMALLINT UNSIGNED NOT NULL,
        recorded_by INT UNSIGNED NOT NULL,
        recorded_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (parent_lot_id, child_lot_id),
        KEY lot_link_child (child_lot_id),
        CONSTRAINT lot_link_parent FOREIGN KEY (parent_lot_id) REFERENCES production_lot (id),
        CONSTRAINT lot_link_child FOREIGN KEY (child_lot_id) REFERENCES production_lot (id)
      ) ${table}`,
      `CREATE TABLE IF NOT EXISTS consignee (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        name VARCHAR(200) NOT NULL,
        kind ENUM('customer', 'distributor', 'hospital') NOT NULL,
        country VARCHAR(80) NOT NULL,
        contact_email VARCHAR(200) NULL,
        PRIMARY KEY (id),
        UNIQUE KEY consignee_name (name)
      ) ${table}`,
      `CREATE TABLE IF NOT EXISTS shipment (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        lot_id INT UNSIGNED NOT NULL,
        consignee_id INT UNSIGNED NOT NULL,
        qty INT UNSIGNED NOT NULL,
        shipped_on DATE NOT NULL,
        document_number VARCHAR(40) NOT NULL,
        recorded_by INT UNSIGNED NOT NULL,
        recorded_at DATETIME(6) NOT NULL DEFAULT CURRENT_TIMESTAMP(6),
        PRIMARY KEY (id),
        KEY shipment_lot (lot_id),
        KEY shipment_consignee (consignee_id, shipped_on),
        CONSTRAINT shipment_lot FOREIGN KEY (lot_id) REFERENCES production_lot (id),
        CONSTRAINT shipment_consignee FOREIGN KEY (consignee_id) REFERENCES consignee (id),
        CONSTRAINT shipment_recorded_by FOREIGN KEY (recorded_by) REFERENCES person (id)
      ) ${table}`,
    ];
    for (const statement of statements) await queryRunner.query(statement);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const name of ['shipment', 'consignee', 'lot_link', 'nonconformance', 'process_run', 'operation_file', 'lot_operation', 'material_movement', 'production_lot', 'routing_step', 'part_specification', 'part']) {
      await queryRunner.query(`DROP TABLE IF EXISTS ${name}`);
    }
  }
}
