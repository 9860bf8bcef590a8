// npm run evidence: runs every test suite (the npm test bootstrap and runners), then writes the
// validation evidence report as PDF and HTML (and its facts as JSON) into .data/evidence/<time>/
// with SHA256SUMS beside it.
// The report records failures as they are; the command exits non-zero when any runner failed or
// any requirement is not shown, after writing the report.
import { execFileSync, spawn } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { cpus, totalmem } from 'node:os';
import { join, resolve } from 'node:path';
import { loadConfig, loadDotEnv, testProfileEnvironment } from '../server/src/config/env';
import { judge, readMatrix, resultsOf } from './compliance/matrix';
import {
  contentHash,
  countsOf,
  evidenceHtml,
  evidencePdf,
  runnerLines,
  type EvidenceData,
} from './compliance/evidence-report';
import { fail, log } from './lib/run';

const sha256 = (bytes: Buffer | string) => createHash('sha256').update(bytes).digest('hex');

function versionOf(command: string, args: string[]): string {
  try {
    return execFileSync(command, args, { encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'] })
      .trim()
      .split('\n')[0]!;
  } catch {
    return 'not found';
  }
}

function readJson<T>(path: string): T | null {
  try {
    return JSON.parse(readFileSync(path, 'utf8')) as T;
  } catch {
    return null;
  }
}

/** Runs npm test's runner, showing its output and keeping it for the summary lines. */
function runTests(): Promise<{ exitCode: number; output: string }> {
  return new Promise((done) => {
    const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/test.ts'], {
      env: process.env,
      stdio: ['ignore', 'pipe', 'inherit'],
    });
    let output = '';
    child.stdout.on('data', (chunk: Buffer) => {
      process.stdout.write(chunk);
      output += chunk.toString('utf8');
    });
    child.on('close', (code) => done({ exitCode: code ?? 1, output }));
  });
}

function gitState(): { commit: string; uncommittedChanges: boolean } {
  try {
    const commit = execFileSync('git', ['rev-parse', 'HEAD'], { encoding: 'utf8' }).trim();
    const status = execFileSync('git', ['status', '--porcelain', '--untracked-files=no'], { encoding: 'utf8' }).trim();
    return { commit, uncommittedChanges: status.length > 0 };
  } catch {
    return { commit: 'unknown (not a git checkout)', uncommittedChanges: false };
  }
}

function operatingSystem(): string {
  try {
    return /^PRETTY_NAME="?(.+?)"?$/m.exec(readFileSync('/etc/os-release', 'utf8'))?.[1] ?? 'unknown';
  } catch {
    return 'unknown';
  }
}

async function main(): Promise<void> {
  loadDotEnv();
  const testProfile = testProfileEnvironment();
  const reportDir = `${loadConfig({ ...process.env, ...testProfile }).DATA_DIR}/reports`;
  const started = Date.now();
  log('running every test suite for the evidence report…');
  const run = await runTests();
  const seconds = (Date.now() - started) / 1000;

  const root = resolve('.');
  const results = resultsOf(
    readJson(join(reportDir, 'vitest.json')),
    readJson(join(reportDir, 'playwright.json')),
    root,
  );
  const requirements = readMatrix().requirements.map((requirement) => judge(requirement, results));
  const screenshotDir = 'test-results';
  const screenshots = existsSync(screenshotDir)
    ? readdirSync(screenshotDir)
        .filter((name) => name.endsWith('.png') && statSync(join(screenshotDir, name)).mtimeMs >= started)
        .sort()
        .map((name) => {
          const bytes = readFileSync(join(screenshotDir, name));
          return { name, sha256: sha256(bytes), png: bytes.toString('base64') };
        })
    : [];
  const packageJson = JSON.parse(readFileSync('package.json', 'utf8')) as { name: string; version: string };
  const madeAt = new Date().toISOString();
  const data: EvidenceData = {
    product: { name: 'Ingotrace', version: packageJson.version, ...gitState() },
    environment: [
      { name: 'Node.js', value: process.version },
      { name: 'MariaDB', value: versionOf('/usr/sbin/mariadbd', ['--version']) },
      { name: 'Chromium', value: versionOf('chromium', ['--version']) },
      { name: 'Operating system', value: operatingSystem() },
      { name: 'Machine', value: `${cpus().length} cores, ${(totalmem() / 2 ** 30).toFixed(0)} GiB` },
    ],
    madeAt,
    run: {
      command: 'npm test (types, lint, vitest, e2e)',
      exitCode: run.exitCode,
      seconds,
      runners: runnerLines(run.output),
    },
    requirements,
    screenshots,
  };
  const hash = contentHash(data);
  const folder = join('.data', 'evidence', madeAt.replace(/[:.]/g, '-'));
  mkdirSync(folder, { recursive: true });
  const html = Buffer.from(evidenceHtml(data, hash), 'utf8');
  const pdf = await evidencePdf(data, hash);
  writeFileSync(join(folder, 'evidence.html'), html);
  writeFileSync(join(folder, 'evidence.pdf'), pdf);
  // What the report states, for machines: the same facts the content hash covers.
  const json = Buffer.from(
    JSON.stringify(
      {
        ...data,
        screenshots: data.screenshots.map(({ name, sha256: hash }) => ({ name, sha256: hash })),
        contentSha256: hash,
      },
      null,
      2,
    ) + '\n',
    'utf8',
  );
  writeFileSync(join(folder, 'evidence.json'), json);
  writeFileSync(
    join(folder, 'SHA256SUMS'),
    `${sha256(pdf)}  evidence.pdf\n${sha256(html)}  evidence.html\n${sha256(json)}  evidence.json\n`,
  );

  const counts = countsOf(data);
  log(`evidence report written to ${folder}/ (evidence.pdf, evidence.html, evidence.json, SHA256SUMS)`);
  log(`content SHA-256 ${hash}`);
  log(
    `${counts.requirements} requirements: ${counts.shown} shown by passing tests, ${counts.notShown} not ` +
      `shown, ${counts.procedural} by the firm's procedures alone; ${counts.testsPassed} of ` +
      `${counts.testsCited} cited tests passed; ${screenshots.length} screenshots`,
  );
  for (const requirement of requirements.filter((entry) => entry.status === 'not-shown')) {
    log(
      `NOT SHOWN ${requirement.id}: ${requirement.evidence
        .filter((entry) => entry.outcome !== 'passed')
        .map((entry) => `${entry.id} ${entry.outcome}`)
        .join(', ')}`,
    );
  }
  process.exit(run.exitCode !== 0 || counts.notShown > 0 ? 1 : 0);
}

main().catch(fail('evidence'));
