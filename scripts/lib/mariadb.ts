import { spawn } from 'node:child_process';
import { createConnection } from 'node:net';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { resolve } from 'node:path';
import { userInfo } from 'node:os';
import { ensureDebianPackages, findExecutable, log, processAlive, runCommand } from './run';

export interface MariadbServerOptions {
  /** Folder that holds data/, the socket, the pid file and the error log. */
  baseDir: string;
  port: number;
  host?: string;
  /** Test databases trade durability per commit for speed; production-like runs keep it. */
  relaxedDurability?: boolean;
  /** InnoDB buffer pool; large benchmark databases need their working set in memory. */
  bufferPoolMb?: number;
  /**
   * An option file read instead of none (a Galera node's state-transfer scripts ignore
   * --no-defaults and would read /etc/mysql otherwise).
   */
  defaultsFile?: string;
  /** Further server options (a Galera node's wsrep settings). */
  extraArgs?: string[];
}

const SOCKET_PATH_LIMIT = 100;

/**
 * A project-local MariaDB server: its own data folder, its own port on 127.0.0.1 and a socket
 * through which the OS administrator (root) manages it without a password.
 */
export class MariadbServer {
  readonly baseDir: string;
  readonly dataDir: string;
  readonly socket: string;
  readonly pidFile: string;
  readonly errorLog: string;
  private startedHere = false;

  constructor(private readonly options: MariadbServerOptions) {
    this.baseDir = resolve(options.baseDir);
    this.dataDir = `${this.baseDir}/data`;
    this.pidFile = `${this.baseDir}/mariadbd.pid`;
    this.errorLog = `${this.baseDir}/mariadbd.err`;
    const socket = `${this.baseDir}/mariadbd.sock`;
    this.socket =
      socket.length <= SOCKET_PATH_LIMIT
        ? socket
        : `/tmp/ingotrace-${createHash('sha256').update(socket).digest('hex').slice(0, 12)}.sock`;
  }

  get port(): number {
    return this.options.port;
  }

  /** Installs Debian's MariaDB when mariadbd is missing (root only). */
  static async ensureInstalled(): Promise<void> {
    await ensureDebianPackages('mariadbd', ['mariadb-server', 'mariadb-client']);
    await ensureDebianPackages('mariadb', ['mariadb-client']);
  }

  async isRunning(): Promise<boolean> {
    try {
      await runCommand(this.tool('mariadb-admin'), [
        '--no-defaults',
        `--socket=${this.socket}`,
        ...this.adminUser(),
        'ping',
      ]);
      return true;
    } catch {
      return false;
    }
  }

  /**
   * Initialises the data folder if needed and starts the server unless it already runs;
   * `runArgs` apply to this start only (e.g. --wsrep-new-cluster).
   */
  async start(runArgs: string[] = []): Promise<void> {
    await MariadbServer.ensureInstalled();
    mkdirSync(this.baseDir, { recursive: true });
    if (await this.isRunning()) {
      log(`MariaDB already running on port ${this.port} (data ${this.dataDir})`);
      return;
    }
    if (!existsSync(`${this.dataDir}/mysql`)) {
      log(`initialising a MariaDB data folder in ${this.dataDir}`);
      rmSync(this.dataDir, { recursive: true, force: true });
      await runCommand(this.tool('mariadb-install-db'), [
        '--no-defaults',
        `--datadir=${this.dataDir}`,
        `--user=${userInfo().username}`,
        '--auth-root-authentication-method=socket',
        '--skip-test-db',
        '--skip-name-resolve',
      ]);
    }
    if (await portInUse(this.options.host ?? '127.0.0.1', this.port)) {
      throw new Error(
        `Port ${this.port} is already in use by another program (another MariaDB, or a copy of Ingotrace ` +
          `started from another folder). Stop it, or choose another port in .env (DB_PORT, or TEST_DB_PORT for ` +
          `npm test).`,
      );
    }
    rmSync(this.pidFile, { force: true });
    const child = spawn(this.tool('mariadbd'), [...this.serverArgs(), ...runArgs], { detached: true, stdio: 'ignore' });
    child.unref();
    this.startedHere = true;
    await this.waitUntilReady(child.pid);
    log(`MariaDB started on 127.0.0.1:${this.port} (data ${this.dataDir})`);
  }

  /** The options this server always runs with. */
  serverArgs(): string[] {
    return [
      this.options.defaultsFile ? `--defaults-file=${this.options.defaultsFile}` : '--no-defaults',
      `--user=${userInfo().username}`,
      `--datadir=${this.dataDir}`,
      `--bind-address=${this.options.host ?? '127.0.0.1'}`,
      `--port=${this.port}`,
      `--socket=${this.socket}`,
      `--pid-file=${this.pidFile}`,
      `--log-error=${this.errorLog}`,
      '--skip-name-resolve',
      '--character-set-server=utf8mb4',
      '--collation-server=utf8mb4_unicode_ci',
      '--innodb-log-file-size=16M',
      // mariabackup, which a Galera node runs for state transfers, is handed the command line and
      // rejects this option; such a node sets it in its defaults file.
      ...(this.options.defaultsFile ? [] : [`--innodb-buffer-pool-size=${this.options.bufferPoolMb ?? 256}M`]),
      '--tmp-table-size=64M',
      '--max-heap-table-size=64M',
      '--max-connections=500',
      ...(this.options.relaxedDurability ? ['--innodb-flush-log-at-trx-commit=2', '--sync-binlog=0'] : []),
      ...(this.options.extraArgs ?? []),
    ];
  }

  /** The server's process id from its pid file, or null. */
  pid(): number | null {
    if (!existsSync(this.pidFile)) return null;
    const pid = Number(readFileSync(this.pidFile, 'utf8').trim());
    return Number.isInteger(pid) && pid > 0 ? pid : null;
  }

  private async waitUntilReady(pid: number | undefined, timeoutMs = 180_000): Promise<void> {
    const deadline = Date.now() + timeoutMs;
    while (Date.now() < deadline) {
      if (await this.isRunning()) return;
      if (pid && !processAlive(pid)) break;
      await new Promise((done) => setTimeout(done, 200));
    }
    const tail = existsSync(this.errorLog) ? readFileSync(this.errorLog, 'utf8').split('\n').slice(-15).join('\n') : '';
    throw new Error(`MariaDB did not become ready on port ${this.port}. Last lines of ${this.errorLog}:\n${tail}`);
  }

  /** Stops the server if this process started it (or always, with force). */
  async stop(force = false): Promise<void> {
    if (!this.startedHere && !force) return;
    if (!(await this.isRunning())) return;
    await runCommand(this.tool('mariadb-admin'), [
      '--no-defaults',
      `--socket=${this.socket}`,
      ...this.adminUser(),
      'shutdown',
    ]);
    this.startedHere = false;
    log(`MariaDB on port ${this.port} stopped`);
  }

  /** Runs SQL as the administrator through the socket. */
  async adminSql(sql: string, extraArgs: string[] = []): Promise<string> {
    return runCommand(this.tool('mariadb'), this.clientArgs(extraArgs), { input: sql });
  }

  /** Arguments for the mariadb client as the administrator on this server. */
  clientArgs(extraArgs: string[] = []): string[] {
    return ['--no-defaults', `--socket=${this.socket}`, ...this.adminUser(), ...extraArgs];
  }

  tool(name: string): string {
    const found = findExecutable(name);
    if (!found) throw new Error(`${name} not found; is mariadb-server installed?`);
    return found;
  }

  private adminUser(): string[] {
    return ['-u', userInfo().username];
  }
}

function portInUse(host: string, port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = createConnection({ host, port });
    socket.once('connect', () => {
      socket.destroy();
      resolve(true);
    });
    socket.once('error', () => resolve(false));
  });
}
