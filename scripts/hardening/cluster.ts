// npm run test:cluster: the app on a three-node MariaDB Galera cluster behind HAProxy, losing a
// node at a time. Two app instances (two ports, one signed-in session) take writes of quality
// records (a supplier approval with its ledger event per write) and reads, while one node and
// later another are killed with SIGKILL and restarted. Afterwards every acknowledged write
// must be on every node, every node must hold the same ledger, which must verify, and every
// restarted node must have rejoined and caught up. Reported: the longest stall, the writes
// refused, the conflicts the cluster resolved, how long each node took to rejoin.
// --writes-through=all-nodes spreads the connections over every node instead of one, so that
// writes collide in certification and the app has to repeat them.
import type { ChildProcess } from 'node:child_process';
import { readFileSync, rmSync } from 'node:fs';
import { parseArgs } from 'node:util';
import type { Express } from 'express';
import { loadConfig, loadDotEnv, testProfileEnvironment } from '../../server/src/config/env';
import { createDataSource } from '../../server/src/db/connection-options';
import { verifyLedger } from '../../server/src/modules/ledger/ledger-verification';
import { csrfTokenOf, SamlTestDriver } from '../../tests/helpers/saml-round-trip';
import { bootstrapDatabase } from '../lib/bootstrap-database';
import { type ClusterLayout, GaleraCluster, type GaleraNode } from '../lib/galera';
import { fail, log } from '../lib/run';
import { seedIfEmpty } from '../seed/seed-if-empty';
import { reportChecks, startAppProcess, untilHealthy } from './app-process';

const WRITES = Number(process.env.CLUSTER_WRITES ?? 1500);
const WRITERS = 4;
const { values: options } = parseArgs({ options: { 'writes-through': { type: 'string', default: 'one-node' } } });
const writesThrough = options['writes-through'];
if (writesThrough !== 'one-node' && writesThrough !== 'all-nodes') {
  process.stderr.write('[ingotrace] test:cluster: --writes-through takes one-node (the default) or all-nodes\n');
  process.exit(2);
}
const layout: ClusterLayout = { baseDir: '.data/cluster-test', portBase: 3350, nodes: 3, writesThrough };

loadDotEnv();
Object.assign(process.env, testProfileEnvironment(), {
  DATA_DIR: `${layout.baseDir}/app`,
  DB_SERVER: 'external',
  DB_PORT: String(layout.portBase),
  DB_NAME: 'ingotrace_cluster',
  PORT: '8096',
  LOG_LEVEL: 'error',
  SMTP_PORT: '1031',
  MAIL_WEB_PORT: '1084',
  IDP_PORT: '7015',
});
const config = loadConfig();
const bases = [`http://127.0.0.1:${config.PORT}`, `http://127.0.0.1:${config.PORT + 1}`];
const sleep = (ms: number) => new Promise((done) => setTimeout(done, ms));

interface Failover {
  node: string;
  killedAt: number;
  rejoinMs?: number;
}

async function main(): Promise<void> {
  const cluster = new GaleraCluster(layout);
  await cluster.stop();
  rmSync(layout.baseDir, { recursive: true, force: true });
  await cluster.start();
  const node1 = cluster.nodes[0]!;
  const admin = createDataSource(config, 'migration');
  const apps: ChildProcess[] = [];
  try {
    await bootstrapDatabase(config, { server: node1.server });
    await seedIfEmpty(config);
    const saml = await SamlTestDriver.create(config);
    apps.push(
      startAppProcess({}, `${layout.baseDir}/app-1.log`),
      startAppProcess({ PORT: String(config.PORT + 1) }, `${layout.baseDir}/app-2.log`),
    );
    log(`the apps' error logs: ${layout.baseDir}/app-1.log, app-2.log`);
    for (const base of bases) log(`app at ${base} healthy after ${await untilHealthy(base)} ms`);

    // One signed-in session, used on both instances: sessions live in the database.
    const approver = await saml.signIn(bases[0] as unknown as Express, 'kiw-0301');
    const csrf = await csrfTokenOf(approver.agent);
    const headers = { cookie: approver.cookie, 'x-csrf-token': csrf, 'content-type': 'application/json' };

    const acknowledged: string[] = [];
    const ackTimes: number[] = [];
    // Outcomes other than success, by kind; a write whose COMMIT was cut off is answered 503 (it
    // may or may not have been saved), which is the one refusal a killed node may cause.
    const refusals = new Map<string, number>();
    const refuse = (what: string) => refusals.set(what, (refusals.get(what) ?? 0) + 1);
    let slowestWriteMs = 0;
    let next = 0;
    const writer = async (index: number) => {
      const base = bases[index % bases.length]!;
      while (acknowledged.length < WRITES) {
        const name = `Cluster writer ${next++}`;
        const started = Date.now();
        try {
          const response = await fetch(`${base}/api/suppliers`, {
            method: 'POST',
            headers,
            body: JSON.stringify({
              name,
              country: 'Nowhere',
              approval: 'approved',
              reason: 'written while cluster nodes fail',
            }),
            signal: AbortSignal.timeout(30_000),
          });
          if (response.status === 201) {
            acknowledged.push(name);
            ackTimes.push(Date.now());
            slowestWriteMs = Math.max(slowestWriteMs, Date.now() - started);
          } else {
            refuse(`write answered ${response.status}`);
            await sleep(20);
          }
        } catch (error) {
          refuse(`write failed: ${error instanceof Error ? error.message : String(error)}`);
          await sleep(50);
        }
      }
    };
    let reads = 0;
    const reader = async () => {
      while (acknowledged.length < WRITES) {
        try {
          const response = await fetch(`${bases[reads % 2]}/api/heats?page=1&pageSize=25`, {
            headers: { cookie: approver.cookie },
            signal: AbortSignal.timeout(30_000),
          });
          if (response.status !== 200) refuse(`read answered ${response.status}`);
          reads += 1;
        } catch (error) {
          refuse(`read failed: ${error instanceof Error ? error.message : String(error)}`);
        }
      }
    };
    const started = Date.now();
    const working = Promise.all([...Array.from({ length: WRITERS }, (_unused, index) => writer(index)), reader()]);
    const reached = async (share: number) => {
      while (acknowledged.length < Math.floor(WRITES * share)) await sleep(10);
    };

    const failovers: Failover[] = [];
    for (const [killShare, restartShare] of [
      [0.2, 0.4],
      [0.6, 0.8],
    ] as const) {
      await reached(killShare);
      // Kill the node that HAProxy sends the app to, the one taking every write.
      const victim = await activeNode(cluster.nodes);
      await victim.kill();
      const failover: Failover = { node: victim.name, killedAt: Date.now() };
      failovers.push(failover);
      log(`  ${victim.name} killed with SIGKILL after ${acknowledged.length} acknowledged writes`);
      await reached(restartShare);
      const restarting = Date.now();
      await victim.restartAfterCrash();
      await victim.waitSynced(3);
      failover.rejoinMs = Date.now() - restarting;
      log(`  ${victim.name} restarted, caught up and Synced after ${failover.rejoinMs} ms`);
    }
    await working;
    const elapsedS = (Date.now() - started) / 1000;
    const stalls = failovers.map((failover) => longestGapAfter(ackTimes, failover.killedAt));
    for (const failover of failovers) {
      const firstAfter = ackTimes.find((time) => time > failover.killedAt + 50);
      log(
        `  after ${failover.node} was killed: first acknowledgement ` +
          `${firstAfter ? firstAfter - failover.killedAt : '—'} ms later`,
      );
    }
    log(
      `writes: ${acknowledged.length} acknowledged in ${elapsedS.toFixed(1)} s; reads: ${reads}; slowest ` +
        `acknowledged write ${slowestWriteMs} ms`,
    );
    for (const [what, count] of refusals) log(`  refused or failed: ${count} × ${what}`);

    // The checks, on every node directly (not through HAProxy).
    for (const node of cluster.nodes) await node.waitSynced(3);
    const perNode = await Promise.all(cluster.nodes.map((node) => nodeContents(node)));
    const acknowledgedSet = new Set(acknowledged);
    const missingPerNode = perNode.map((contents) => acknowledged.filter((name) => !contents.writers.has(name)).length);
    const sameEverywhere = perNode.every((contents) => contents.fingerprint === perNode[0]!.fingerprint);
    const unacknowledgedStored = [...perNode[0]!.writers].filter((name) => !acknowledgedSet.has(name)).length;
    await admin.initialize();
    const withoutEvent = await admin.query(
      'SELECT s.id FROM supplier s WHERE NOT EXISTS (SELECT 1 FROM audit_event e WHERE e.action = ' +
        "'supplier.created' AND e.entity_type = 'supplier' AND e.entity_id = CAST(s.id AS CHAR))",
    );
    const ledger = await verifyLedger(admin.manager);
    const statuses = await Promise.all(cluster.nodes.map((node) => node.status()));
    const conflicts = statuses.reduce((sum, status) => sum + status.certificationFailures, 0);
    const tablesCleared = ['app-1.log', 'app-2.log']
      .map((file) => readFileSync(`${layout.baseDir}/${file}`, 'utf8').split('DatabaseNodeWarning').length - 1)
      .reduce((sum, count) => sum + count, 0);
    const refusedTotal = [...refusals.values()].reduce((sum, count) => sum + count, 0);
    const commitsCut = refusals.get('write answered 503') ?? 0;
    const otherFailures = refusedTotal - commitsCut;
    reportChecks([
      [
        `acknowledged writes on every node: ` +
          perNode
            .map(
              (_contents, i) =>
                `${cluster.nodes[i]!.name} ${acknowledged.length - missingPerNode[i]!}/${acknowledged.length}`,
            )
            .join(', '),
        missingPerNode.every((missing) => missing === 0),
      ],
      [
        `every node holds the same suppliers and ledger (chain head ` +
          `${perNode.map((contents) => contents.chainHead).join(' | ')}); stored but never acknowledged: ` +
          `${unacknowledgedStored}`,
        sameEverywhere,
      ],
      [`suppliers without their ledger event: ${withoutEvent.length}`, withoutEvent.length === 0],
      [ledger.summary, ledger.ok],
      [
        `longest stall in acknowledged writes after each kill: ` +
          `${stalls.map((ms, i) => `${failovers[i]!.node} ${ms} ms`).join(', ')} (limit 10,000 ms)`,
        stalls.every((ms) => ms < 10_000),
      ],
      [
        `requests that failed while nodes failed: ${otherFailures} (of ${acknowledged.length + refusedTotal} ` +
          `writes and ${reads} reads); writes answered 503 because their COMMIT was cut off: ${commitsCut} (at ` +
          `most one per writer per kill); certification conflicts: ${conflicts}; tables cleared after a ` +
          `conflict left their triggers unreadable: ${tablesCleared}`,
        otherFailures === 0 && commitsCut <= WRITERS * failovers.length,
      ],
      [
        `restarted nodes rejoined and caught up: ` +
          `${failovers.map((failover) => `${failover.node} in ${failover.rejoinMs} ms`).join(', ')}; ` +
          `cluster size ${statuses.map((status) => status.clusterSize).join('/')}`,
        statuses.every((status) => status.clusterSize === 3 && status.state === 'Synced'),
      ],
    ]);
  } finally {
    for (const app of apps) if (app.exitCode === null) app.kill('SIGKILL');
    if (admin.isInitialized) await admin.destroy();
    await cluster.stop();
  }
}

/** The node holding the app's connections (HAProxy sends every connection to one node). */
async function activeNode(nodes: GaleraNode[]): Promise<GaleraNode> {
  const counts = await Promise.all(
    nodes.map(async (node) => {
      if (!(await node.server.isRunning())) return 0;
      const output = await node.server.adminSql(
        `SELECT COUNT(*) FROM information_schema.PROCESSLIST WHERE USER = '${config.DB_USER}';`,
        ['-N', '-B'],
      );
      return Number(output.trim());
    }),
  );
  const busiest = counts.indexOf(Math.max(...counts));
  return nodes[busiest]!;
}

/** The longest time between two acknowledgements from `from` on (or until the last one). */
function longestGapAfter(ackTimes: number[], from: number): number {
  let previous = from;
  let longest = 0;
  for (const time of ackTimes) {
    if (time < from) continue;
    longest = Math.max(longest, time - previous);
    previous = time;
  }
  return longest;
}

/** What one node holds: the writers' supplier names, its ledger chain head and a fingerprint of both. */
async function nodeContents(
  node: GaleraNode,
): Promise<{ writers: Set<string>; chainHead: string; fingerprint: string }> {
  const database = config.DB_NAME;
  const names = await node.server.adminSql(
    `SELECT name FROM \`${database}\`.supplier WHERE name LIKE 'Cluster writer %' ORDER BY name;`,
    ['-N', '-B'],
  );
  const head = await node.server.adminSql(
    `SELECT CONCAT(seq, ' ', LEFT(hash, 12)) FROM \`${database}\`.audit_event ORDER BY seq DESC LIMIT 1;`,
    ['-N', '-B'],
  );
  const counts = await node.server.adminSql(
    `SELECT (SELECT COUNT(*) FROM \`${database}\`.supplier), (SELECT COUNT(*) FROM ` +
      `\`${database}\`.audit_event), (SELECT COUNT(*) FROM \`${database}\`.electronic_signature);`,
    ['-N', '-B'],
  );
  return {
    writers: new Set(names.split('\n').filter(Boolean)),
    chainHead: head.trim(),
    fingerprint: `${names}|${head}|${counts}`,
  };
}

main()
  .then(() => process.exit(process.exitCode ?? 0))
  .catch(fail('test:cluster'));
