// A three-node MariaDB Galera cluster on loopback with HAProxy in front, built from Debian's
// packages (mariadb-server with galera-4, mariadb-backup for state transfers, haproxy). The
// app connects to HAProxy's port as it would to one server; HAProxy sends each new connection
// to a node that is Synced, and cuts the sessions of a node that stops being so.
import { cpSync, existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { MariadbServer } from './mariadb';
import { ensureDebianPackages, log, processAlive, runCommand } from './run';

const GALERA_PROVIDER = '/usr/lib/galera/libgalera_smm.so';
const NODE_READY_CHECK = resolve('scripts/cluster/node-ready.sh');
/** An account with no privileges that the health check signs in as to read wsrep status. */
export const CHECK_ACCOUNT = 'ingotrace_check';

export interface ClusterLayout {
  /** Folder holding node1…nodeN and HAProxy's files. */
  baseDir: string;
  /** HAProxy listens here; node i listens on portBase + i; group, IST and SST ports follow. */
  portBase: number;
  nodes: number;
  /**
   * one-node (the default): HAProxy sends every connection to one node until it fails. all-nodes:
   * connections are spread over every node, so writes through different nodes collide in
   * certification (used to show that the app rides out such conflicts).
   */
  writesThrough?: 'one-node' | 'all-nodes';
}

export const defaultClusterLayout: ClusterLayout = { baseDir: '.data/cluster', portBase: 3330, nodes: 3 };

/** What one node reports about itself. */
export interface NodeStatus {
  state: string;
  clusterSize: number;
  ready: boolean;
  certificationFailures: number;
}

export class GaleraNode {
  readonly server: MariadbServer;
  readonly name: string;
  readonly baseDir: string;
  private readonly defaultsFile: string;

  constructor(
    readonly index: number,
    private readonly layout: ClusterLayout,
  ) {
    this.name = `node${index}`;
    this.baseDir = resolve(layout.baseDir, this.name);
    this.defaultsFile = `${this.baseDir}/node.cnf`;
    const groupAddresses = Array.from(
      { length: layout.nodes },
      (_unused, i) => `127.0.0.1:${groupPort(layout, i + 1)}`,
    );
    this.server = new MariadbServer({
      baseDir: this.baseDir,
      port: layout.portBase + index,
      defaultsFile: this.defaultsFile,
      extraArgs: [
        '--wsrep-on=ON',
        `--wsrep-provider=${GALERA_PROVIDER}`,
        '--wsrep-cluster-name=ingotrace',
        `--wsrep-cluster-address=gcomm://${groupAddresses.join(',')}`,
        `--wsrep-node-name=${this.name}`,
        '--wsrep-node-address=127.0.0.1',
        [
          '--wsrep-provider-options=',
          `gmcast.listen_addr=tcp://127.0.0.1:${groupPort(layout, index)};`,
          `ist.recv_addr=127.0.0.1:${layout.portBase + 1400 + index};`,
          // A failed node is suspected after 2 s and dropped after 4 s (defaults 5 s and 15 s).
          'evs.suspect_timeout=PT2S;evs.inactive_timeout=PT4S;evs.keepalive_period=PT0.5S;',
          'gcache.size=128M',
        ].join(''),
        `--wsrep-sst-receive-address=127.0.0.1:${layout.portBase + 1500 + index}`,
        '--wsrep-sst-method=mariabackup',
        '--wsrep-sst-auth=root:',
        // Reads wait until the node has applied what the cluster committed before them, so a
        // request reads what the previous request wrote through another node.
        '--wsrep-sync-wait=1',
        '--wsrep-mode=REQUIRED_PRIMARY_KEY',
        '--binlog-format=ROW',
        // The migration account (not SUPER) creates the ledger's triggers; with replication on,
        // MariaDB allows that only when trusted to (the triggers are deterministic).
        '--log-bin-trust-function-creators=1',
        '--innodb-autoinc-lock-mode=2',
      ],
    });
  }

  get sqlPort(): number {
    return this.server.port;
  }

  /** Starts the node (writing its option file first); `runArgs` e.g. --wsrep-new-cluster. */
  async start(runArgs: string[] = []): Promise<void> {
    mkdirSync(this.baseDir, { recursive: true });
    // The state-transfer scripts read [sst]; sst-syslog=-1 keeps their errors in the error log.
    writeFileSync(this.defaultsFile, '[mysqld]\ninnodb_buffer_pool_size=128M\n\n[sst]\nsst-syslog=-1\n');
    await this.server.start(runArgs);
  }

  async status(): Promise<NodeStatus> {
    const output = await this.server.adminSql(
      "SHOW GLOBAL STATUS WHERE Variable_name IN ('wsrep_local_state_comment', 'wsrep_cluster_size', " +
        "'wsrep_ready', 'wsrep_local_cert_failures');",
      ['-N', '-B'],
    );
    const values = new Map(
      output
        .trim()
        .split('\n')
        .map((line) => line.split('\t') as [string, string]),
    );
    return {
      state: values.get('wsrep_local_state_comment') ?? 'unknown',
      clusterSize: Number(values.get('wsrep_cluster_size') ?? 0),
      ready: values.get('wsrep_ready') === 'ON',
      certificationFailures: Number(values.get('wsrep_local_cert_failures') ?? 0),
    };
  }

  /** Resolves once the node is Synced with a cluster of `size`; returns the milliseconds waited. */
  async waitSynced(size: number, timeoutMs = 180_000): Promise<number> {
    const started = Date.now();
    let last = 'not answering';
    while (Date.now() - started < timeoutMs) {
      try {
        const status = await this.status();
        if (status.state === 'Synced' && status.ready && status.clusterSize === size) return Date.now() - started;
        last = `${status.state}, cluster size ${status.clusterSize}`;
      } catch (error) {
        last = error instanceof Error ? error.message : String(error);
      }
      await new Promise((done) => setTimeout(done, 200));
    }
    throw new Error(`${this.name} was not Synced in a cluster of ${size} within ${timeoutMs / 1000} s (last: ${last})`);
  }

  /** Kills the server process with SIGKILL, as a power cut would, and waits until it is gone. */
  async kill(): Promise<void> {
    const pid = this.server.pid();
    if (pid === null) throw new Error(`${this.name} has no pid file`);
    process.kill(pid, 'SIGKILL');
    while (processAlive(pid)) await new Promise((done) => setTimeout(done, 50));
  }

  /** The last committed position (cluster uuid:seqno) recorded by a stopped node, from --wsrep-recover. */
  async recoveredPosition(): Promise<string> {
    const logFile = `${this.baseDir}/recover.err`;
    rmSync(logFile, { force: true });
    const args = this.server
      .serverArgs()
      .map((arg) => (arg.startsWith('--log-error=') ? `--log-error=${logFile}` : arg));
    await runCommand(this.server.tool('mariadbd'), [...args, '--wsrep-recover']);
    const found = [...readFileSync(logFile, 'utf8').matchAll(/WSREP: Recovered position: (\S+:-?\d+)/g)].pop();
    if (!found?.[1]) throw new Error(`${this.name}: --wsrep-recover printed no position (see ${logFile})`);
    return found[1];
  }

  /** Starts a node that was killed: recovers its position first, then joins (catching up by IST). */
  async restartAfterCrash(): Promise<void> {
    const position = await this.recoveredPosition();
    await this.start([`--wsrep-start-position=${position}`]);
  }

  /** The grastate.dat fields of a stopped node. */
  savedState(): { seqno: number; safeToBootstrap: boolean } | null {
    const file = `${this.server.dataDir}/grastate.dat`;
    if (!existsSync(file)) return null;
    const text = readFileSync(file, 'utf8');
    return {
      seqno: Number(/^seqno:\s*(-?\d+)/m.exec(text)?.[1] ?? -1),
      safeToBootstrap: /^safe_to_bootstrap:\s*1/m.test(text),
    };
  }

  markSafeToBootstrap(): void {
    const file = `${this.server.dataDir}/grastate.dat`;
    writeFileSync(file, readFileSync(file, 'utf8').replace(/^safe_to_bootstrap:\s*0/m, 'safe_to_bootstrap: 1'));
  }
}

function groupPort(layout: ClusterLayout, index: number): number {
  return layout.portBase + 1300 + index;
}

export class GaleraCluster {
  readonly nodes: GaleraNode[];
  private readonly proxyDir: string;

  constructor(readonly layout: ClusterLayout = defaultClusterLayout) {
    this.nodes = Array.from({ length: layout.nodes }, (_unused, i) => new GaleraNode(i + 1, layout));
    this.proxyDir = resolve(layout.baseDir, 'haproxy');
  }

  /** The address the app connects to. */
  get proxyPort(): number {
    return this.layout.portBase;
  }

  static async ensureInstalled(): Promise<void> {
    await MariadbServer.ensureInstalled();
    await ensureDebianPackages('mariabackup', ['mariadb-backup', 'galera-4', 'socat']);
    await ensureDebianPackages('haproxy', ['haproxy']);
    if (!existsSync(GALERA_PROVIDER)) throw new Error(`${GALERA_PROVIDER} is missing; install Debian's galera-4`);
  }

  /**
   * Brings every node up and HAProxy in front of them. A new cluster is made from one
   * initialised node whose data folder the others copy, so that they join without a full
   * state transfer; a stopped cluster restarts from the node that holds the latest state.
   */
  async start(): Promise<void> {
    await GaleraCluster.ensureInstalled();
    const running = await Promise.all(this.nodes.map((node) => node.server.isRunning()));
    if (!running.some(Boolean)) {
      const [first] = this.nodes as [GaleraNode, ...GaleraNode[]];
      if (!existsSync(this.initialisedMarker)) await this.initialise(first);
      const bootstrapNode = this.latestNode();
      log(`starting the cluster from ${bootstrapNode.name}`);
      await bootstrapNode.start(['--wsrep-new-cluster']);
      running[this.nodes.indexOf(bootstrapNode)] = true;
    }
    for (const [i, node] of this.nodes.entries()) {
      if (running[i]) continue;
      log(`starting ${node.name}; it joins the cluster`);
      if (node.savedState()?.seqno === -1) await node.restartAfterCrash();
      else await node.start();
    }
    for (const node of this.nodes) await node.waitSynced(this.nodes.length);
    // The health check's account (no privileges); account statements replicate to every node.
    await this.nodes[0]!.server.adminSql(
      `CREATE USER IF NOT EXISTS '${CHECK_ACCOUNT}'@'127.0.0.1'; CREATE USER IF NOT EXISTS ` +
        `'${CHECK_ACCOUNT}'@'localhost';`,
    );
    await this.startProxy();
    log(`Galera cluster of ${this.nodes.length} nodes synced; HAProxy on 127.0.0.1:${this.proxyPort}`);
  }

  private async initialise(first: GaleraNode): Promise<void> {
    log('initialising a new cluster');
    for (const node of this.nodes) rmSync(node.baseDir, { recursive: true, force: true });
    await first.start(['--wsrep-new-cluster']);
    await first.server.stop(true);
    for (const node of this.nodes.slice(1)) {
      mkdirSync(node.baseDir, { recursive: true });
      cpSync(first.server.dataDir, node.server.dataDir, {
        recursive: true,
        filter: (source) => !source.endsWith('gvwstate.dat'),
      });
    }
    writeFileSync(this.initialisedMarker, `${new Date().toISOString()}\n`);
  }

  /** Written once the nodes' data folders exist; without it a half-made cluster is made anew. */
  private get initialisedMarker(): string {
    return resolve(this.layout.baseDir, 'initialised');
  }

  /** The stopped node to bootstrap from: the one marked safe, else the one with the highest position. */
  private latestNode(): GaleraNode {
    const safe = this.nodes.find((node) => node.savedState()?.safeToBootstrap);
    if (safe) return safe;
    const byPosition = this.nodes
      .map((node) => ({ node, seqno: node.savedState()?.seqno ?? -1 }))
      .sort((a, b) => b.seqno - a.seqno);
    const chosen = byPosition[0]!.node;
    chosen.markSafeToBootstrap();
    return chosen;
  }

  private proxyConfig(): string {
    return [
      'global',
      '  maxconn 4000',
      '  external-check',
      '  insecure-fork-wanted',
      `  pidfile ${this.proxyDir}/haproxy.pid`,
      '',
      'defaults',
      '  mode tcp',
      '  timeout connect 2s',
      '  timeout client 8h',
      '  timeout server 8h',
      '  retries 3',
      '  option redispatch',
      '',
      'listen galera',
      `  bind 127.0.0.1:${this.proxyPort}`,
      ...(this.layout.writesThrough === 'all-nodes'
        ? ['  balance leastconn']
        : // One node takes every connection: each write appends to the ledger's one chain head, so
          // writes through several nodes could only collide there (certification conflicts). The
          // stick table keeps the chosen node until it fails (no fail-back to a rejoined node).
          ['  balance first', '  stick-table type ip size 1 nopurge', '  stick on dst']),
      '  option external-check',
      `  external-check command ${NODE_READY_CHECK}`,
      '  external-check path "/usr/bin:/bin:/usr/sbin:/sbin"',
      '  default-server inter 500ms fastinter 250ms fall 2 rise 2 on-marked-down shutdown-sessions',
      ...this.nodes.map((node) => `  server ${node.name} 127.0.0.1:${node.sqlPort} check`),
      '',
    ].join('\n');
  }

  private proxyPid(): number | null {
    const file = `${this.proxyDir}/haproxy.pid`;
    if (!existsSync(file)) return null;
    const pid = Number(readFileSync(file, 'utf8').trim());
    return Number.isInteger(pid) && pid > 0 && processAlive(pid) ? pid : null;
  }

  async startProxy(): Promise<void> {
    if (this.proxyPid() !== null) return;
    mkdirSync(this.proxyDir, { recursive: true });
    const configFile = `${this.proxyDir}/haproxy.cfg`;
    writeFileSync(configFile, this.proxyConfig());
    await runCommand(this.haproxy(), ['-c', '-q', '-f', configFile]);
    await runCommand(this.haproxy(), ['-D', '-f', configFile]);
    // Until the first checks pass, HAProxy treats every node as up; give them a moment.
    await new Promise((done) => setTimeout(done, 1_500));
  }

  async stop(): Promise<void> {
    const pid = this.proxyPid();
    if (pid !== null) process.kill(pid, 'SIGTERM');
    // The last node to stop is marked safe to bootstrap from; stop the first node last.
    for (const node of [...this.nodes].reverse()) {
      if (await node.server.isRunning()) {
        await node.server.stop(true);
        log(`${node.name} stopped`);
      }
    }
  }

  private haproxy(): string {
    return this.nodes[0]!.server.tool('haproxy');
  }
}
