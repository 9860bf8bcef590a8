declare module 'express-mysql-session' {
  import type session from 'express-session';

  interface MySQLStoreOptions {
    host?: string;
    port?: number;
    user?: string;
    password?: string;
    database?: string;
    connectionLimit?: number;
    clearExpired?: boolean;
    checkExpirationInterval?: number;
    expiration?: number;
    createDatabaseTable?: boolean;
    endConnectionOnClose?: boolean;
    disableTouch?: boolean;
    schema?: { tableName: string; columnNames: { session_id: string; expires: string; data: string } };
  }

  interface MySQLStoreClass {
    new (options: MySQLStoreOptions): session.Store & { close(): Promise<void> };
  }

  export default function createMySQLStore(expressSession: typeof session): MySQLStoreClass;
}
