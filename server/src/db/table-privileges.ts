/**
 * What the running app's database user may do with each table. Tables not named here are
 * read-write (SELECT, INSERT, UPDATE, DELETE). Append-only tables (the audit ledger,
 * signatures) get SELECT and INSERT only, so that not even a bug in the app can rewrite them.
 */
export type TableAccess = 'read-write' | 'append-only' | 'read-only';

export const tableAccess: Record<string, TableAccess> = {
  migrations: 'read-only',
  audit_event: 'append-only',
  electronic_signature: 'append-only',
  // Certificates and evaluations are evidence: stored once, never changed.
  certificate_document: 'append-only',
  heat_evaluation: 'append-only',
  specification_revision: 'append-only',
  // Measurement files attached to an operation stay attached.
  operation_file: 'append-only',
  // Labels printed or voided are counted, never rewritten; a release packet is stored once.
  label_print: 'append-only',
  release_packet: 'append-only',
  // What a recall investigation knew when: each frozen affected set is stored once.
  recall_snapshot: 'append-only',
  // A heat a lot is made of stays a heat it is made of.
  lot_heat: 'append-only',
  // A reviewer's acknowledgement of a screening finding, with its reason, is kept as given.
  screening_acknowledgement: 'append-only',
  // Check analysis rules change by a new row; check results are kept as entered.
  check_analysis_rule: 'append-only',
  check_analysis: 'append-only',
  // A firm's validation of a method for a material is withdrawn by a new row, never rewritten.
  process_method_validation: 'append-only',
  // A consignee's reply is kept as given (a correction is a new reply); returned goods are counted once.
  notice_reply: 'append-only',
  notice_reply_lot: 'append-only',
  returned_goods_receipt: 'append-only',
};

const privilegesByAccess: Record<TableAccess, string> = {
  'read-write': 'SELECT, INSERT, UPDATE, DELETE',
  'append-only': 'SELECT, INSERT',
  'read-only': 'SELECT',
};

/** Quotes a value as an SQL string literal (backslash and quote escaped). */
export function sqlString(value: string): string {
  return `'${value.replace(/\\/g, '\\\\').replace(/'/g, "\\'")}'`;
}

function identifier(name: string): string {
  return `\`${name.replace(/`/g, '``')}\``;
}

export interface DatabaseAccounts {
  database: string;
  appUser: string;
  appPassword: string;
  migrationUser: string;
  migrationPassword: string;
  hosts: string[];
}

/** SQL that creates the database and both accounts (idempotent; passwords reset to the configured ones). */
export function accountsSql(accounts: DatabaseAccounts): string {
  const db = identifier(accounts.database);
  const statements = [`CREATE DATABASE IF NOT EXISTS ${db} CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;`];
  for (const host of accounts.hosts) {
    for (const [user, password] of [
      [accounts.migrationUser, accounts.migrationPassword],
      [accounts.appUser, accounts.appPassword],
    ] as const) {
      const account = `${sqlString(user)}@${sqlString(host)}`;
      statements.push(`CREATE USER IF NOT EXISTS ${account} IDENTIFIED BY ${sqlString(password)};`);
      statements.push(`ALTER USER ${account} IDENTIFIED BY ${sqlString(password)};`);
    }
    statements.push(`GRANT ALL PRIVILEGES ON ${db}.* TO ${sqlString(accounts.migrationUser)}@${sqlString(host)};`);
    // The app account holds no global privilege: a RELOAD it once held (to clear a cluster node's
    // table) also let it take a global read lock. Installations bootstrapped with it lose it here.
    statements.push(`REVOKE RELOAD ON *.* FROM ${sqlString(accounts.appUser)}@${sqlString(host)};`);
  }
  return statements.join('\n');
}

/**
 * SQL that gives the app user exactly its per-table privileges over the tables that exist now in
 * this database, first revoking what it held on them (other databases are left alone).
 */
export function appGrantsSql(
  accounts: DatabaseAccounts,
  tables: string[],
  previouslyGranted: Array<{ host: string; table: string }> = [],
): string {
  const db = identifier(accounts.database);
  const statements: string[] = [];
  for (const host of accounts.hosts) {
    const account = `${sqlString(accounts.appUser)}@${sqlString(host)}`;
    for (const grant of previouslyGranted.filter((candidate) => candidate.host === host)) {
      statements.push(`REVOKE ALL PRIVILEGES ON ${db}.${identifier(grant.table)} FROM ${account};`);
    }
    for (const table of [...tables].sort()) {
      const access = tableAccess[table] ?? 'read-write';
      statements.push(`GRANT ${privilegesByAccess[access]} ON ${db}.${identifier(table)} TO ${account};`);
    }
  }
  return statements.join('\n');
}
