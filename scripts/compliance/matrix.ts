// The requirement matrix (compliance/requirement-matrix.yaml): reading it, checking it against the
// test ids that exist, and judging each requirement against the results of a test run.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parse } from 'yaml';
import { z } from 'zod';

const testId = z.string().regex(/^[A-Z][A-Z0-9]*(-[A-Z0-9]+)+$/, 'A test id such as LEDGER-NO-FORK');

export const requirementSchema = z
  .object({
    id: z.string().regex(/^[A-Z0-9]+(-[A-Z0-9]+)*$/, 'A requirement id such as P11-10A'),
    regulation: z.string().min(3),
    clause: z.string().min(1),
    requirement: z.string().min(20, 'State the requirement in a sentence'),
    functions: z.array(z.string().min(10)),
    tests: z.array(testId),
    firm: z.string().min(10).optional(),
  })
  .strict();
export type Requirement = z.infer<typeof requirementSchema>;

export const matrixSchema = z.object({ requirements: z.array(requirementSchema).min(1) }).strict();
export type Matrix = z.infer<typeof matrixSchema>;

export const matrixPath = 'compliance/requirement-matrix.yaml';

export function readMatrix(path = matrixPath): Matrix {
  return matrixSchema.parse(parse(readFileSync(path, 'utf8')));
}

/** "[LEDGER-NO-FORK] when …" → "LEDGER-NO-FORK"; a title without an id → null. */
export function testIdOf(title: string): string | null {
  return /^\[([A-Z][A-Z0-9]*(?:-[A-Z0-9]+)+)\] /.exec(title)?.[1] ?? null;
}

/** Where each test id is declared: the first quoted title of an it(…) or test(…) call that starts with "[ID] ". */
export function testIdsInSource(text: string): string[] {
  return [...text.matchAll(/\b(?:it|test)\(\s*['"`]\[([A-Z][A-Z0-9]*(?:-[A-Z0-9]+)+)\] /g)].map((match) => match[1]!);
}

export function testIdsUnder(folder = 'tests'): Map<string, string[]> {
  const found = new Map<string, string[]>();
  const walk = (dir: string) => {
    for (const entry of readdirSync(dir, { withFileTypes: true })) {
      const path = join(dir, entry.name);
      if (entry.isDirectory()) walk(path);
      else if (/\.(test|spec)\.ts$/.test(entry.name))
        for (const id of testIdsInSource(readFileSync(path, 'utf8'))) found.set(id, [...(found.get(id) ?? []), path]);
    }
  };
  walk(folder);
  return found;
}

/**
 * What is wrong with the matrix: cited ids no test declares, ids declared twice, requirements with neither tests nor a
 * procedure.
 */
export function matrixProblems(matrix: Matrix, declared: Map<string, string[]>): string[] {
  const problems: string[] = [];
  const seen = new Set<string>();
  for (const requirement of matrix.requirements) {
    if (seen.has(requirement.id)) problems.push(`${requirement.id}: the requirement id is used twice`);
    seen.add(requirement.id);
    if (!requirement.tests.length && !requirement.firm)
      problems.push(`${requirement.id}: no test and no procedural control stated`);
    for (const id of requirement.tests)
      if (!declared.has(id)) problems.push(`${requirement.id}: cites ${id}, which no test declares`);
  }
  for (const [id, files] of declared)
    if (files.length > 1) problems.push(`${id}: declared by ${files.length} tests (${files.join(', ')})`);
  return problems;
}

export type TestOutcome = 'passed' | 'failed' | 'skipped';

export interface TestResult {
  id: string;
  title: string;
  file: string;
  runner: 'vitest' | 'playwright';
  outcome: TestOutcome;
}

interface VitestReport {
  testResults: Array<{ name: string; assertionResults: Array<{ title: string; status: string }> }>;
}

interface PlaywrightSuite {
  file?: string;
  specs?: Array<{ title: string; file: string; tests: Array<{ status: string; results: Array<{ status: string }> }> }>;
  suites?: PlaywrightSuite[];
}

const vitestOutcome = (status: string): TestOutcome =>
  status === 'passed' ? 'passed' : status === 'failed' ? 'failed' : 'skipped';

/** Every test that carries an id, with its outcome, from the runners' JSON reports (either may be missing). */
export function resultsOf(
  vitest: VitestReport | null,
  playwright: { suites: PlaywrightSuite[] } | null,
  root = '',
): TestResult[] {
  const results: TestResult[] = [];
  for (const file of vitest?.testResults ?? []) {
    for (const assertion of file.assertionResults) {
      const id = testIdOf(assertion.title);
      if (id)
        results.push({
          id,
          title: assertion.title,
          file: root && file.name.startsWith(root) ? file.name.slice(root.length + 1) : file.name,
          runner: 'vitest',
          outcome: vitestOutcome(assertion.status),
        });
    }
  }
  const walk = (suite: PlaywrightSuite) => {
    for (const spec of suite.specs ?? []) {
      const id = testIdOf(spec.title);
      if (!id) continue;
      // "expected" and "flaky" (passed on a retry) count as passed; "skipped" as not run.
      const statuses = spec.tests.map((test) => test.status);
      const outcome: TestOutcome = statuses.some((status) => status === 'unexpected')
        ? 'failed'
        : statuses.every((status) => status === 'skipped')
          ? 'skipped'
          : 'passed';
      results.push({ id, title: spec.title, file: `tests/e2e/${spec.file}`, runner: 'playwright', outcome });
    }
    for (const child of suite.suites ?? []) walk(child);
  };
  for (const suite of playwright?.suites ?? []) walk(suite);
  return results;
}

export type RequirementStatus = 'shown' | 'not-shown' | 'procedural';

export interface JudgedRequirement extends Requirement {
  status: RequirementStatus;
  evidence: Array<{ id: string; outcome: TestOutcome | 'not run'; titles: string[] }>;
}

/**
 * A requirement is shown only when every test it cites ran and passed (a test id generated for
 * several cases must pass in all of them). One failed, skipped or missing test leaves it not
 * shown. A requirement with no tests rests on the firm's procedures.
 */
export function judge(requirement: Requirement, results: TestResult[]): JudgedRequirement {
  const evidence = requirement.tests.map((id) => {
    const runs = results.filter((result) => result.id === id);
    const outcome: TestOutcome | 'not run' = !runs.length
      ? 'not run'
      : runs.some((run) => run.outcome === 'failed')
        ? 'failed'
        : runs.some((run) => run.outcome === 'skipped')
          ? 'skipped'
          : 'passed';
    return { id, outcome, titles: [...new Set(runs.map((run) => run.title))] };
  });
  const status: RequirementStatus = !requirement.tests.length
    ? 'procedural'
    : evidence.every((entry) => entry.outcome === 'passed')
      ? 'shown'
      : 'not-shown';
  return { ...requirement, status, evidence };
}
