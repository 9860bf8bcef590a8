import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Indexes that shared their name with the foreign key they also serve, and the names they get. */
const renamed: Array<[table: string, from: string, to: string]> = [
  ['check_analysis', 'check_analysis_heat', 'check_analysis_heat_order'],
  ['lot_hold', 'lot_hold_lot', 'lot_hold_lot_lifted'],
  ['production_lot', 'production_lot_part', 'production_lot_part_opened'],
  ['recall_snapshot', 'recall_snapshot_recall', 'recall_snapshot_recall_order'],
  ['release_packet', 'release_packet_submission', 'release_packet_one_per_submission'],
  ['release_submission', 'release_submission_lot', 'release_submission_lot_submitted'],
  ['role_change_request', 'role_change_request_person', 'role_change_request_person_status'],
  ['shipment', 'shipment_consignee', 'shipment_consignee_shipped'],
];

/**
 * An index named like a foreign key is taken by TypeORM for the key's own index and left out of
 * the comparison between entities and schema; a unique one even makes the key unreadable. Each
 * index that does more than back its key (more columns, or unique) gets a name of its own; the
 * keys keep using them.
 */
export class NameKeyIndexesApart1764720000000 implements MigrationInterface {
  name = 'NameKeyIndexesApart1764720000000';

  async up(queryRunner: QueryRunner): Promise<void> {
    for (const [table, from, to] of renamed) await queryRunner.query(`ALTER TABLE ${table} RENAME INDEX ${from} TO ${to}`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    for (const [table, from, to] of renamed) await queryRunner.query(`ALTER TABLE ${table} RENAME INDEX ${to} TO ${from}`);
  }
}
