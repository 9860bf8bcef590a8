// The evidence report states each requirement's status honestly and carries a hash of what it
// states. The hash is SHA-256 over RFC 8785 canonical JSON (checked against node:crypto and the
// canonicalize package from the registry); the counts are worked by hand below.
import { createHash } from 'node:crypto';
import canonicalize from 'canonicalize';
import { describe, expect, it } from 'vitest';
import { PNG } from 'pngjs';
import {
  contentHash,
  countsOf,
  evidenceHtml,
  evidencePdf,
  runnerLines,
  screenshotSlices,
  type EvidenceData,
} from '../../../scripts/compliance/evidence-report';
import { judge, type Requirement, type TestResult } from '../../../scripts/compliance/matrix';
import { readPdf } from '../../helpers/document-readers';

const requirement = (id: string, tests: string[], firm?: string): Requirement => ({
  id,
  regulation: '21 CFR Part 11',
  clause: `§${id}`,
  requirement: `Requirement ${id} stated for this test.`,
  functions: ['A function <b>named</b> here'],
  tests,
  ...(firm ? { firm } : {}),
});
const results: TestResult[] = [
  { id: 'A-ONE', title: '[A-ONE] a', file: 'tests/a.test.ts', runner: 'vitest', outcome: 'passed' },
  { id: 'B-TWO', title: '[B-TWO] b', file: 'tests/b.test.ts', runner: 'vitest', outcome: 'failed' },
];

// Three requirements: P1 cites A-ONE (passed) → shown; P2 cites A-ONE and B-TWO (failed) → not
// shown; P3 has no tests → procedure. Cited tests: A-ONE, B-TWO; one passed.
function data(): EvidenceData {
  return {
    product: { name: 'Ingotrace', version: '0.1.0', commit: 'f'.repeat(40), uncommittedChanges: false },
    environment: [{ name: 'Node.js', value: 'v20.20.2' }],
    madeAt: '2026-12-02T14:00:00.000Z',
    run: { command: 'npm test', exitCode: 1, seconds: 420, runners: [{ name: 'vitest', passed: 1, failed: 1 }] },
    requirements: [
      judge(requirement('P1', ['A-ONE']), results),
      judge(requirement('P2', ['A-ONE', 'B-TWO']), results),
      judge(requirement('P3', [], 'Train the users'), results),
    ],
    screenshots: [
      { name: 'shot.png', sha256: 'a'.repeat(64), png: Buffer.from('not really a png').toString('base64') },
    ],
  };
}

describe('the validation evidence report', () => {
  it('counts requirements shown, not shown and procedural, and the cited tests that passed', () => {
    expect(countsOf(data())).toEqual({
      requirements: 3,
      shown: 1,
      notShown: 1,
      procedural: 1,
      testsCited: 2,
      testsPassed: 1,
    });
  });

  it('hashes the canonical JSON of what it states, with screenshots by their hashes', () => {
    const report = data();
    const stated = { ...report, screenshots: [{ name: 'shot.png', sha256: 'a'.repeat(64) }] };
    expect(contentHash(report)).toBe(createHash('sha256').update(canonicalize(stated)!).digest('hex'));
    const changed = data();
    changed.requirements[0]!.status = 'not-shown';
    expect(contentHash(changed)).not.toBe(contentHash(report));
  });

  it('reads the runners’ summary lines printed by npm test', () => {
    const output =
      'noise\n  7 passed in a log line\n\nSummary\n  type-check (client, vue-tsc)         1 passed    0 ' +
      'failed  (10.3 s)\n  vitest (unit, client, API)         437 passed    2 failed  (154.5 s)\n439 passed, ' +
      '2 failed\n';
    expect(runnerLines(output)).toEqual([
      { name: 'type-check (client, vue-tsc)', passed: 1, failed: 0 },
      { name: 'vitest (unit, client, API)', passed: 437, failed: 2 },
    ]);
  });

  it('writes HTML that escapes what it quotes and marks the failed test and the requirement not shown', () => {
    const html = evidenceHtml(data(), 'c'.repeat(64));
    expect(html).toContain('A function &lt;b&gt;named&lt;/b&gt; here');
    expect(html).not.toContain('<b>named</b>');
    expect(html).toContain('<tr class="not-shown">');
    expect(html).toContain('<code>B-TWO</code> failed');
    expect(html).toContain(
      "3 requirements: 1 shown by passing tests, 1 not shown, 1 met by the firm's procedures alone",
    );
    expect(html).toContain('c'.repeat(64));
  });

  it('cuts a tall screenshot into page-shaped slices (width × 1.25) without losing or moving a row', () => {
    // 10 px wide, 30 rows, each row's red value is its row number: slices of 13, 13 and 4 rows.
    const image = new PNG({ width: 10, height: 30 });
    for (let y = 0; y < 30; y++) for (let x = 0; x < 10; x++) image.data.set([y, 0, 0, 255], (y * 10 + x) * 4);
    const { slices, total } = screenshotSlices(PNG.sync.write(image).toString('base64'));
    expect(total).toBe(3);
    const read = slices.map((slice) => PNG.sync.read(Buffer.from(slice, 'base64')));
    expect(read.map((slice) => slice.height)).toEqual([13, 13, 4]);
    expect(read.map((slice) => slice.data[0])).toEqual([0, 13, 26]);
    expect(read[2]!.data[(3 * 10 + 9) * 4]).toBe(29);
    expect(screenshotSlices(PNG.sync.write(image).toString('base64'), 2)).toMatchObject({
      total: 3,
      slices: [expect.any(String), expect.any(String)],
    });
  });

  it('renders a PDF that says NOT SHOWN where a test failed and carries the content hash', async () => {
    const report = data();
    report.screenshots = [];
    const { text } = readPdf(await evidencePdf(report, 'd'.repeat(64)));
    expect(text).toContain('NOT SHOWN');
    expect(text).toContain('B-TWO: failed');
    expect(text).toContain('PROCEDURE');
    expect(text).toContain('d'.repeat(64));
    expect(text).toContain('rest with the firm');
  }, 60_000);
});
