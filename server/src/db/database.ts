import type { DataSource } from 'typeorm';
import { migrations } from './migrations';

/**
 * Holds the app's DataSource and (re)connects it on demand, so that the server can start, and
 * keep answering health checks, while the database is down, and recover by itself afterwards.
 */
export class Database {
  private connecting: Promise<DataSource> | null = null;

  constructor(readonly dataSource: DataSource) {}

  get isConnected(): boolean {
    return this.dataSource.isInitialized;
  }

  /** Resolves the initialised DataSource, connecting first if needed (concurrent callers share one attempt). */
  async connect(): Promise<DataSource> {
    if (this.dataSource.isInitialized) return this.dataSource;
    this.connecting ??= this.dataSource.initialize().finally(() => {
      this.connecting = null;
    });
    return this.connecting;
  }

  async close(): Promise<void> {
    if (this.dataSource.isInitialized) await this.dataSource.destroy();
  }

  /** The database server's own version string (connects first if needed). */
  async serverVersion(): Promise<string> {
    const dataSource = await this.connect();
    const rows: Array<{ version: string }> = await dataSource.query('SELECT VERSION() AS version');
    return rows[0]?.version ?? 'unknown';
  }

  /** Names of migrations shipped with this build that the database has not run yet. */
  async pendingMigrations(): Promise<string[]> {
    const dataSource = await this.connect();
    const rows: Array<{ name: string }> = await dataSource.query('SELECT name FROM migrations');
    const executed = new Set(rows.map((row) => row.name));
    return migrations.map((migration) => new migration().name ?? migration.name).filter((name) => !executed.has(name));
  }
}
