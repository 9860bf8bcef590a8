import 'reflect-metadata';
import { Column, DataSource, Entity, PrimaryGeneratedColumn } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadConfig } from '../../server/src/config/env';
import { createDataSource } from '../../server/src/db/connection-options';
import { entities } from '../../server/src/db/entities';

// The migrations are the schema's source; the entities must describe exactly what they built.
// TypeORM's own schema builder compares the two; its log() says what synchronize would run.

/** The organisation table as an entity with one column drawn wrong (name is varchar(200)). */
@Entity({ name: 'organisation' })
class OrganisationDrawnWrong {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id: number;

  @Column({ type: 'varchar', length: 150 })
  name: string;
}

async function pendingSchemaChanges(dataSource: DataSource): Promise<string[]> {
  const sql = await dataSource.driver.createSchemaBuilder().log();
  return sql.upQueries.map((query) => query.query);
}

describe('entities and migrations', () => {
  const config = loadConfig();
  const dataSource = createDataSource(config, 'migration');
  beforeAll(() => dataSource.initialize());
  afterAll(() => dataSource.destroy());

  it(
    '[ENTITY-DRIFT] when TypeORM compares every entity with ' + 'the migrated database, then it would change nothing',
    async () => {
      expect(await pendingSchemaChanges(dataSource)).toEqual([]);
    },
  );

  it('[ENTITY-TABLES] every table the migrations create has exactly one entity, and every entity a table', async () => {
    const rows: Array<{ name: string }> = await dataSource.query(
      `SELECT table_name AS name FROM information_schema.tables
        WHERE table_schema = DATABASE() AND table_type = 'BASE TABLE' AND table_name <> 'migrations'`,
    );
    const tables = rows.map((row) => row.name).sort();
    const entityTables = dataSource.entityMetadatas.map((metadata) => metadata.tableName).sort();
    expect(entityTables).toEqual(tables);
    expect(new Set(entityTables).size).toBe(entities.length);
  });

  it(
    '[ENTITY-KEY-INDEXES] an index named like its foreign ' + 'key (which the comparison skips) serves only that key',
    async () => {
      const rows: Array<{ tableName: string; name: string; columnName: string; nonUnique: number | string }> =
        await dataSource.query(
          `SELECT s.table_name AS tableName, s.index_name AS name, s.column_name AS columnName,
                s.non_unique AS nonUnique
           FROM information_schema.statistics s
           JOIN information_schema.referential_constraints r
             ON r.constraint_schema = s.table_schema AND r.table_name = s.table_name AND
               r.constraint_name = s.index_name
          WHERE s.table_schema = DATABASE()
          ORDER BY s.table_name, s.index_name, s.seq_in_index`,
        );
      const inDatabase = new Map<string, { columns: string[]; unique: boolean }>();
      for (const row of rows) {
        const key = `${row.tableName}.${row.name}`;
        const index = inDatabase.get(key) ?? { columns: [], unique: Number(row.nonUnique) === 0 };
        index.columns.push(row.columnName);
        inDatabase.set(key, index);
      }
      expect(inDatabase.size).toBeGreaterThan(30);
      const keys = new Map<string, { columns: string[]; unique: boolean }>();
      for (const metadata of dataSource.entityMetadatas)
        for (const foreignKey of metadata.foreignKeys)
          keys.set(`${metadata.tableName}.${foreignKey.name}`, { columns: foreignKey.columnNames, unique: false });
      // A wider or unique index under a key's name would escape the comparison above: it needs its own name.
      for (const [key, index] of inDatabase) expect(index, key).toEqual(keys.get(key));
    },
  );

  it(
    '[ENTITY-DRIFT-SEEN] when an entity draws a column differently from its migration, then the comparison ' +
      'names the change',
    async () => {
      const wrong = new DataSource({ ...dataSource.options, entities: [OrganisationDrawnWrong], migrations: [] });
      await wrong.initialize();
      try {
        const changes = await pendingSchemaChanges(wrong);
        expect(changes.join('\n')).toMatch(/ALTER TABLE `organisation`.*`name` varchar\(150\)/);
        // Columns the entity leaves out would be dropped: the comparison sees them too.
        expect(changes.join('\n')).toMatch(/DROP COLUMN `time_zone`/);
      } finally {
        await wrong.destroy();
      }
    },
  );
});
