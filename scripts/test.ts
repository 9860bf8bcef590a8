// npm test: the same bootstrap as npm start on a separate test database, then every runner:
// type-checks, lint, vitest (unit, client and API tests against the real MariaDB) and Playwright
// in Debian's Chromium. Ends with one line "N passed, N failed" summing every runner.
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { spawn } from 'node:child_process';
import { parseArgs } from 'node:util';
import { loadConfig, loadDotEnv, testProfileEnvironment } from '../server/src/config/env';
import { buildClientIfStale } from './lib/client-build';
import { ensureDebianPackages, fail, log } from './lib/run';
import { onShutdownSignal, startSupportingServices } from './lib/stack';

const steps = ['types', 'lint', 'vitest', 'e2e'] as const;
type Step = (typeof steps)[number];

interface StepResult {
  name: string;
  passed: number;
  failed: number;
  seconds: number;
}

function runInherited(command: string, args: string[]): Promise<number> {
  return new Promise((resolve) => {
    const child = spawn(command, args, { stdio: 'inherit', env: process.env });
    child.on('error', () => resolve(127));
    child.on('close', (code) => resolve(code ?? 1));
  });
}

const bin = (name: string) => `node_modules/.bin/${name}`;

function readJson<T>(path: string): T | null {
  try {
    return JSON.parse(readFileSync(path, 'utf8')) as T;
  } catch {
    return null;
  }
}

async function main(): Promise<void> {
  const { values, positionals } = parseArgs({
    options: { only: { type: 'string', multiple: true } },
    allowPositionals: true,
  });
  const chosen = new Set<Step>((values.only as Step[] | undefined) ?? steps);
  for (const step of chosen)
    if (!steps.includes(step)) throw new Error(`unknown step "${step}"; choose from ${steps.join(', ')}`);

  loadDotEnv();
  Object.assign(process.env, testProfileEnvironment());
  const config = loadConfig();
  const reportDir = `${config.DATA_DIR}/reports`;
  rmSync(reportDir, { recursive: true, force: true });
  mkdirSync(reportDir, { recursive: true });

  const needsServices = chosen.has('vitest') || chosen.has('e2e');
  const stack = needsServices ? await startSupportingServices(config, { reset: true, relaxedDurability: true }) : null;
  onShutdownSignal(async () => stack?.stop());
  const results: StepResult[] = [];
  const timed = async (name: string, run: () => Promise<{ passed: number; failed: number }>) => {
    const started = Date.now();
    log(`── ${name} ──`);
    let outcome: { passed: number; failed: number };
    try {
      outcome = await run();
    } catch (error) {
      log(`${name} could not run: ${error instanceof Error ? error.message : String(error)}`);
      outcome = { passed: 0, failed: 1 };
    }
    results.push({ name, ...outcome, seconds: (Date.now() - started) / 1000 });
  };
  const exitCheck = async (command: string, args: string[]) =>
    (await runInherited(command, args)) === 0 ? { passed: 1, failed: 0 } : { passed: 0, failed: 1 };

  try {
    if (chosen.has('types')) {
      await timed('type-check (client, vue-tsc)', () =>
        exitCheck(bin('vue-tsc'), ['--noEmit', '-p', 'tsconfig.client.json']),
      );
      await timed('type-check (server, tsc)', () => exitCheck(bin('tsc'), ['--noEmit', '-p', 'tsconfig.json']));
    }
    if (chosen.has('lint')) await timed('lint (eslint)', () => exitCheck(bin('eslint'), ['--max-warnings=0', '.']));
    if (chosen.has('vitest')) {
      await timed('vitest (unit, client, API)', async () => {
        // Independent readers of the documents the product renders: text, page images, QR and DataMatrix decoders.
        await ensureDebianPackages('pdftotext', ['poppler-utils']);
        await ensureDebianPackages('zbarimg', ['zbar-tools']);
        await ensureDebianPackages('dmtxread', ['dmtx-utils']);
        const output = `${reportDir}/vitest.json`;
        const code = await runInherited(bin('vitest'), [
          'run',
          '--reporter=default',
          '--reporter=json',
          `--outputFile.json=${output}`,
          ...positionals,
        ]);
        const report = readJson<{ numPassedTests: number; numFailedTests: number }>(output);
        if (!report) return { passed: 0, failed: 1 };
        return {
          passed: report.numPassedTests,
          failed: report.numFailedTests + (code !== 0 && report.numFailedTests === 0 ? 1 : 0),
        };
      });
    }
    if (chosen.has('e2e')) {
      await timed('e2e (Playwright, Chromium)', async () => {
        await ensureDebianPackages('chromium', ['chromium']);
        await buildClientIfStale();
        const output = `${reportDir}/playwright.json`;
        process.env.PLAYWRIGHT_JSON_OUTPUT_NAME = output;
        // File filters apply to Playwright only when it is the one runner chosen (`--only=e2e <files>`).
        const code = await runInherited(bin('playwright'), [
          'test',
          '--reporter=list,json',
          ...(chosen.size === 1 ? positionals : []),
        ]);
        const report = readJson<{ stats: { expected: number; unexpected: number; flaky: number } }>(output);
        if (!report) return { passed: 0, failed: 1 };
        const { expected, unexpected, flaky } = report.stats;
        return { passed: expected + flaky, failed: unexpected + (code !== 0 && unexpected === 0 ? 1 : 0) };
      });
    }
  } finally {
    await stack?.stop();
  }

  process.stdout.write('\nSummary\n');
  for (const result of results) {
    process.stdout.write(
      `  ${result.name.padEnd(32)} ${String(result.passed).padStart(5)} passed ` +
        `${String(result.failed).padStart(4)} failed  (${result.seconds.toFixed(1)} s)\n`,
    );
  }
  const passed = results.reduce((sum, result) => sum + result.passed, 0);
  const failed = results.reduce((sum, result) => sum + result.failed, 0);
  process.stdout.write(`${passed} passed, ${failed} failed\n`);
  process.exit(failed > 0 || results.length === 0 ? 1 : 0);
}

if (!existsSync('package.json')) fail('test')(new Error('run npm test from the repository root'));
main().catch(fail('test'));
