// The requirement matrix stays honest: every test id it cites exists, and every requirement is met
// by tests or by a stated procedure of the firm. The judging rules are ours (common practice in
// computer-system validation, no source): a requirement counts as shown only when all its tests ran
// and passed.
import { describe, expect, it } from 'vitest';
import {
  judge,
  matrixProblems,
  readMatrix,
  resultsOf,
  testIdOf,
  testIdsInSource,
  testIdsUnder,
  type Requirement,
  type TestResult,
} from '../../../scripts/compliance/matrix';

const requirement = (tests: string[], firm?: string): Requirement => ({
  id: 'P11-TEST',
  regulation: '21 CFR Part 11',
  clause: '§11.10(x)',
  requirement: 'A requirement stated for this test only.',
  functions: [],
  tests,
  ...(firm ? { firm } : {}),
});
const result = (id: string, outcome: TestResult['outcome']): TestResult => ({
  id,
  title: `[${id}] a test`,
  file: 'tests/x.test.ts',
  runner: 'vitest',
  outcome,
});

describe('the requirement matrix', () => {
  it(
    '[MATRIX-COMPLETE] cites only test ids that exist, and gives every requirement tests or a procedure of the ' +
      'firm',
    () => {
      const matrix = readMatrix();
      const declared = testIdsUnder('tests');
      expect(matrixProblems(matrix, declared)).toEqual([]);
      expect(matrix.requirements.length).toBeGreaterThanOrEqual(30);
      for (const clause of [
        '§11.10(a)',
        '§11.10(k)',
        '§11.50',
        '§11.70',
        '§11.100(a)',
        '§11.200(a)(1)',
        '§11.300(a)–(e)',
        '§7.5.9.1',
        '§830.20',
      ]) {
        expect(matrix.requirements.map((entry) => entry.clause)).toContain(clause);
      }
    },
  );

  it('names each kind of problem', () => {
    const declared = new Map([
      ['A-ONE', ['tests/a.test.ts']],
      ['B-TWO', ['tests/b.test.ts', 'tests/c.test.ts']],
    ]);
    const matrix = { requirements: [requirement(['A-ONE', 'C-THREE']), requirement([])] };
    expect(matrixProblems(matrix, declared)).toEqual([
      'P11-TEST: cites C-THREE, which no test declares',
      'P11-TEST: the requirement id is used twice',
      'P11-TEST: no test and no procedural control stated',
      'B-TWO: declared by 2 tests (tests/b.test.ts, tests/c.test.ts)',
    ]);
  });

  it('reads ids from test titles and sources, and not from other strings', () => {
    expect(testIdOf('[LEDGER-NO-FORK] when 20 connections write')).toBe('LEDGER-NO-FORK');
    expect(testIdOf('when [LEDGER-NO-FORK] is inside')).toBeNull();
    expect(testIdOf('[lower-case] no')).toBeNull();
    // Built from pieces, so that this file does not itself declare the ids it reads.
    const source = [
      `it('[A`,
      `-ONE] x', () => {});\n  test(\`[E2E`,
      "-TWO] y ${z}\`, async () => {});\nconst s = '[NOT-A-TEST] z';",
    ].join('');
    expect(testIdsInSource(source)).toEqual(['A-ONE', 'E2E-TWO']);
  });
});

describe('judging a requirement against a test run', () => {
  it('is shown only when every cited test ran and passed', () => {
    expect(judge(requirement(['A-ONE', 'B-TWO']), [result('A-ONE', 'passed'), result('B-TWO', 'passed')]).status).toBe(
      'shown',
    );
    expect(judge(requirement(['A-ONE', 'B-TWO']), [result('A-ONE', 'passed'), result('B-TWO', 'failed')]).status).toBe(
      'not-shown',
    );
    expect(judge(requirement(['A-ONE', 'B-TWO']), [result('A-ONE', 'passed')]).evidence[1]).toEqual({
      id: 'B-TWO',
      outcome: 'not run',
      titles: [],
    });
    expect(judge(requirement(['A-ONE']), [result('A-ONE', 'skipped')]).status).toBe('not-shown');
  });

  it('needs every case of a test generated for several cases to pass', () => {
    expect(
      judge(requirement(['A-ONE']), [result('A-ONE', 'passed'), result('A-ONE', 'failed'), result('A-ONE', 'passed')])
        .status,
    ).toBe('not-shown');
  });

  it('rests a requirement without tests on the firm’s procedures', () => {
    expect(judge(requirement([], 'Train users'), []).status).toBe('procedural');
  });

  it('collects outcomes from the vitest and Playwright JSON reports', () => {
    const vitest = {
      testResults: [
        {
          name: '/repo/tests/api/a.test.ts',
          assertionResults: [
            { title: '[A-ONE] a', status: 'passed' },
            { title: 'no id', status: 'failed' },
            { title: '[B-TWO] b', status: 'pending' },
          ],
        },
      ],
    };
    const playwright = {
      suites: [
        {
          file: 'x.spec.ts',
          specs: [
            {
              title: '[E2E-X] x',
              file: 'x.spec.ts',
              tests: [{ status: 'flaky', results: [{ status: 'failed' }, { status: 'passed' }] }],
            },
            {
              title: '[E2E-Y] y',
              file: 'x.spec.ts',
              tests: [{ status: 'unexpected', results: [{ status: 'failed' }] }],
            },
          ],
        },
      ],
    };
    expect(resultsOf(vitest, playwright, '/repo').map((entry) => [entry.id, entry.file, entry.outcome])).toEqual([
      ['A-ONE', 'tests/api/a.test.ts', 'passed'],
      ['B-TWO', 'tests/api/a.test.ts', 'skipped'],
      ['E2E-X', 'tests/e2e/x.spec.ts', 'passed'],
      ['E2E-Y', 'tests/e2e/x.spec.ts', 'failed'],
    ]);
    expect(resultsOf(null, null)).toEqual([]);
  });
});
