import { describe, expect, it } from 'vitest';
import { accountsSql, appGrantsSql, sqlString, tableAccess } from '../../../server/src/db/table-privileges';

const accounts = {
  database: 'ingotrace',
  appUser: 'app',
  appPassword: "it's \\ secret",
  migrationUser: 'owner',
  migrationPassword: 'pw',
  hosts: ['127.0.0.1'],
};

describe('table privileges', () => {
  it('when quoting a string, then quotes and backslashes are escaped', () => {
    expect(sqlString("it's \\ secret")).toBe("'it\\'s \\\\ secret'");
  });

  it(
    'when creating accounts, then the migration user owns the database and the app user gets no privilege yet, ' +
      'and loses a RELOAD it once held',
    () => {
      const sql = accountsSql(accounts);
      expect(sql).toContain("CREATE USER IF NOT EXISTS 'app'@'127.0.0.1' IDENTIFIED BY 'it\\'s \\\\ secret';");
      expect(sql).toContain("GRANT ALL PRIVILEGES ON `ingotrace`.* TO 'owner'@'127.0.0.1';");
      expect(sql).toContain("REVOKE RELOAD ON *.* FROM 'app'@'127.0.0.1';");
      expect(sql).not.toMatch(/GRANT [^;]* TO 'app'/);
    },
  );

  it('[DB-GRANTS] when granting the app user, then each table gets exactly its access level', () => {
    tableAccess.audit_event_example = 'append-only';
    try {
      const sql = appGrantsSql(
        accounts,
        ['organisation', 'migrations', 'audit_event_example'],
        [{ host: '127.0.0.1', table: 'dropped_table' }],
      );
      expect(sql.split('\n')).toEqual([
        "REVOKE ALL PRIVILEGES ON `ingotrace`.`dropped_table` FROM 'app'@'127.0.0.1';",
        "GRANT SELECT, INSERT ON `ingotrace`.`audit_event_example` TO 'app'@'127.0.0.1';",
        "GRANT SELECT ON `ingotrace`.`migrations` TO 'app'@'127.0.0.1';",
        "GRANT SELECT, INSERT, UPDATE, DELETE ON `ingotrace`.`organisation` TO 'app'@'127.0.0.1';",
      ]);
    } finally {
      delete tableAccess.audit_event_example;
    }
  });
});
