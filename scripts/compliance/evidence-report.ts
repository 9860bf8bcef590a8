// The validation evidence report: what was tested, where, when, and what each requirement's tests
// showed, as HTML and as PDF (pdfmake with the shipped Noto Sans), with the SHA-256 of its content.
import { createHash } from 'node:crypto';
import { PNG } from 'pngjs';
import type { Content, TDocumentDefinitions } from 'pdfmake/interfaces';
import { canonicalJson } from '../../shared/domain/ledger-hash';
import { cautionBox, documentStyles, heading, pageFooter, table } from '../../server/src/documents/pdf-blocks';
import { renderPdf } from '../../server/src/documents/pdf-printer';
import type { JudgedRequirement } from './matrix';

const functionList = (functions: string[]) =>
  functions.length ? `<ul>${functions.map((fn) => `<li>${escape(fn)}</li>`).join('')}</ul>` : '';
const evidenceLine = (entry: { id: string; outcome: string }) =>
  `<div class="test ${entry.outcome.replace(' ', '-')}">` +
  `<code>${escape(entry.id)}</code> ${escape(entry.outcome)}</div>`;
const runnerRow = (runner: { name: string; passed: number; failed: number }) =>
  `<tr><th>${escape(runner.name)}</th><td>${runner.passed} passed, ${runner.failed} failed</td></tr>`;
const screenshotFigure = (shot: { name: string; png: string; sha256: string }) =>
  `<figure><img alt="${escape(shot.name)}" src="data:image/png;base64,${shot.png}">` +
  `<figcaption>${escape(shot.name)} · SHA-256 <span class="hash">${shot.sha256}</span></figcaption></figure>`;

export const evidenceCaution =
  'This report gives objective evidence from Ingotrace’s automated tests. Validation for the intended use and ' +
  'regulated use rest with the firm: it does not validate the firm’s installation, procedures or people.';

export interface EvidenceData {
  product: { name: string; version: string; commit: string; uncommittedChanges: boolean };
  environment: Array<{ name: string; value: string }>;
  madeAt: string;
  run: {
    command: string;
    exitCode: number;
    seconds: number;
    runners: Array<{ name: string; passed: number; failed: number }>;
  };
  requirements: JudgedRequirement[];
  screenshots: Array<{ name: string; sha256: string; png: string }>;
}

export interface EvidenceCounts {
  requirements: number;
  shown: number;
  notShown: number;
  procedural: number;
  testsCited: number;
  testsPassed: number;
}

export function countsOf(data: Pick<EvidenceData, 'requirements'>): EvidenceCounts {
  const cited = new Map<string, string>();
  for (const requirement of data.requirements)
    for (const entry of requirement.evidence) cited.set(entry.id, entry.outcome);
  return {
    requirements: data.requirements.length,
    shown: data.requirements.filter((requirement) => requirement.status === 'shown').length,
    notShown: data.requirements.filter((requirement) => requirement.status === 'not-shown').length,
    procedural: data.requirements.filter((requirement) => requirement.status === 'procedural').length,
    testsCited: cited.size,
    testsPassed: [...cited.values()].filter((outcome) => outcome === 'passed').length,
  };
}

/** SHA-256 of the RFC 8785 canonical JSON of everything the report states (screenshots by their hashes). */
export function contentHash(data: EvidenceData): string {
  const stated = { ...data, screenshots: data.screenshots.map(({ name, sha256 }) => ({ name, sha256 })) };
  return createHash('sha256').update(canonicalJson(stated)).digest('hex');
}

/** "  vitest (unit, client, API)   437 passed    0 failed  (154.5 s)" → { name, passed, failed }. */
export function runnerLines(output: string): Array<{ name: string; passed: number; failed: number }> {
  const summary = output.slice(output.lastIndexOf('\nSummary\n'));
  return [...summary.matchAll(/^ {2}(.+?)\s+(\d+) passed\s+(\d+) failed/gm)].map((match) => ({
    name: match[1]!.trim(),
    passed: Number(match[2]),
    failed: Number(match[3]),
  }));
}

/**
 * A full-page screenshot cut into page-shaped slices (at most `most`), so that the PDF shows it
 * readable rather than shrunk to a strip; the HTML report keeps the whole image.
 */
export function screenshotSlices(pngBase64: string, most = 3): { slices: string[]; total: number } {
  const image = PNG.sync.read(Buffer.from(pngBase64, 'base64'));
  const height = Math.round(image.width * 1.25);
  const total = Math.ceil(image.height / height);
  const slices: string[] = [];
  for (let index = 0; index < Math.min(total, most); index++) {
    const top = index * height;
    const slice = new PNG({ width: image.width, height: Math.min(height, image.height - top) });
    image.data.copy(slice.data, 0, top * image.width * 4, (top + slice.height) * image.width * 4);
    slices.push(PNG.sync.write(slice).toString('base64'));
  }
  return { slices, total };
}

const statusText = { shown: 'SHOWN', 'not-shown': 'NOT SHOWN', procedural: 'PROCEDURE' } as const;
const statusColour = { shown: '#1e6b3a', 'not-shown': '#a4262c', procedural: '#55606a' } as const;

function summaryLine(counts: EvidenceCounts): string {
  return (
    `${counts.requirements} requirements: ${counts.shown} shown by passing tests, ${counts.notShown} not shown, ` +
    `${counts.procedural} met by the firm's procedures alone. ${counts.testsPassed} of ${counts.testsCited} ` +
    `cited tests passed.`
  );
}

const escape = (text: string) =>
  text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

export function evidenceHtml(data: EvidenceData, hash: string): string {
  const counts = countsOf(data);
  const rows = data.requirements
    .map(
      (requirement) => `<tr class="${requirement.status}">
  <td><strong>${escape(requirement.id)}</strong><br>${escape(requirement.regulation)} ${escape(requirement.clause)}</td>
  <td>${escape(requirement.requirement)}${functionList(requirement.functions)}</td>
  <td>${requirement.evidence.map(evidenceLine).join('') || '—'}</td>
  <td>${escape(requirement.firm ?? '—')}</td>
  <td class="status">${statusText[requirement.status]}</td>
</tr>`,
    )
    .join('\n');
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8">
      <title>Ingotrace validation evidence ${escape(data.product.version)}
        ${escape(data.product.commit.slice(0, 12))}</title>
<style>
body{font-family:"Noto Sans",system-ui,sans-serif;margin:2rem;color:#1b2730;max-width:75rem}
h1{margin-bottom:.2rem}.caution{background:#fff6dd;color:#7a4b00;font-weight:600;padding:.6rem .8rem;border-radius:4px}
table{border-collapse:collapse;width:100%;font-size:.85rem}
      th,td{border-bottom:1px solid #d5dbe0;padding:.35rem .5rem;text-align:left;vertical-align:top}
tr.not-shown td.status{color:#a4262c;font-weight:700}tr.shown td.status{color:#1e6b3a;font-weight:700}
      tr.procedural td.status{color:#55606a}
.test.failed,.test.not-run,.test.skipped{color:#a4262c;font-weight:600}code{font-size:.8rem}
      ul{margin:.25rem 0;padding-left:1.1rem}
figure{margin:1rem 0}figure img{max-width:100%;border:1px solid #d5dbe0}
      .hash{font-family:monospace;word-break:break-all}
</style></head><body>
<p>Ingotrace · validation evidence report</p>
<h1>${escape(data.product.name)} ${escape(data.product.version)}</h1>
<p class="caution">${escape(evidenceCaution)}</p>
<h2>Summary</h2>
<p><strong>${escape(summaryLine(counts))}</strong></p>
<table><tbody>
<tr><th>Commit</th><td>${escape(data.product.commit)}
  ${data.product.uncommittedChanges ? ' (with uncommitted changes)' : ''}</td></tr>
<tr><th>Made (UTC)</th><td>${escape(data.madeAt)}</td></tr>
${data.environment.map((entry) => `<tr><th>${escape(entry.name)}</th><td>${escape(entry.value)}</td></tr>`).join('\n')}
<tr><th>Test run</th><td>${escape(data.run.command)}: exit code ${data.run.exitCode},
  ${data.run.seconds.toFixed(0)} s</td></tr>
${data.run.runners.map(runnerRow).join('\n')}
<tr><th>Content SHA-256</th><td class="hash">${hash}</td></tr>
</tbody></table>
<h2>Requirements</h2>
<table><thead><tr><th>Requirement</th><th>What it asks and how Ingotrace meets it</th><th>Tests and results</th>
      <th>The firm's part</th><th>Status</th></tr></thead><tbody>
${rows}
</tbody></table>
<h2>Screenshots from the browser journeys</h2>
${data.screenshots.map(screenshotFigure).join('\n')}
<p class="hash">Content SHA-256 ${hash}: the SHA-256 of the RFC 8785 canonical JSON of what this report states
(screenshots by their own hashes). SHA256SUMS beside this file holds the hashes of the report's files.</p>
</body></html>
`;
}

export async function evidencePdf(data: EvidenceData, hash: string): Promise<Buffer> {
  const counts = countsOf(data);
  const requirementBlocks: Content[] = data.requirements.map((requirement) => ({
    table: {
      widths: [70, '*', 62],
      body: [
        [
          {
            text: [
              { text: `${requirement.id}\n`, bold: true },
              { text: `${requirement.regulation}\n${requirement.clause}`, fontSize: 8 },
            ],
          },
          {
            stack: [
              { text: requirement.requirement },
              ...(requirement.functions.length
                ? [{ ul: requirement.functions, fontSize: 8, margin: [0, 2, 0, 0] } as Content]
                : []),
              {
                text: requirement.evidence.length
                  ? requirement.evidence.map((entry) => `${entry.id}: ${entry.outcome}`).join(' · ')
                  : 'No automated test: met by the firm’s procedures.',
                fontSize: 8,
                color: requirement.status === 'not-shown' ? '#a4262c' : '#33414c',
                margin: [0, 2, 0, 0],
              },
              ...(requirement.firm
                ? [
                    {
                      text: `The firm: ${requirement.firm}`,
                      fontSize: 8,
                      italics: true,
                      margin: [0, 2, 0, 0],
                    } as Content,
                  ]
                : []),
            ],
          },
          { text: statusText[requirement.status], bold: true, color: statusColour[requirement.status] },
        ],
      ],
    },
    layout: {
      hLineWidth: (index: number) => (index === 1 ? 0.5 : 0),
      vLineWidth: () => 0,
      hLineColor: () => '#d5dbe0',
    },
    margin: [0, 0, 0, 4],
  }));
  const definition: TDocumentDefinitions = {
    info: {
      title: `Ingotrace validation evidence ${data.product.version}`,
      author: 'Ingotrace',
      creator: 'Ingotrace',
      producer: 'Ingotrace',
      creationDate: new Date(data.madeAt),
    },
    pageSize: 'A4',
    pageMargins: [40, 50, 40, 50],
    footer: pageFooter(
      `Ingotrace ${data.product.version} · ${data.product.commit.slice(0, 12)} · content SHA-256 ${hash.slice(0, 16)}…`,
    ),
    styles: documentStyles,
    content: [
      { text: 'Ingotrace · validation evidence report', color: '#555' },
      { text: `${data.product.name} ${data.product.version}`, style: 'title' },
      cautionBox(evidenceCaution),
      {
        text: summaryLine(counts),
        bold: true,
        fontSize: 11,
        color: counts.notShown ? '#a4262c' : '#1e6b3a',
        margin: [0, 8, 0, 6],
      },
      {
        table: {
          widths: [120, '*'],
          body: [
            ['Commit', `${data.product.commit}${data.product.uncommittedChanges ? ' (with uncommitted changes)' : ''}`],
            ['Made (UTC)', data.madeAt],
            ...data.environment.map((entry): [string, string] => [entry.name, entry.value]),
            ['Test run', `${data.run.command}: exit code ${data.run.exitCode}, ${data.run.seconds.toFixed(0)} s`],
            ...data.run.runners.map((runner): [string, string] => [
              runner.name,
              `${runner.passed} passed, ${runner.failed} failed`,
            ]),
            ['Content SHA-256', { text: hash, fontSize: 8 }],
          ],
        },
        layout: 'noBorders',
      },
      heading('Requirements'),
      ...requirementBlocks,
      ...(data.screenshots.length
        ? [{ text: 'Screenshots from the browser journeys', style: 'heading', pageBreak: 'before' } as Content]
        : []),
      ...data.screenshots.flatMap((shot): Content[] => {
        const { slices, total } = screenshotSlices(shot.png);
        return slices.map((slice, index) => ({
          stack: [
            {
              text:
                shot.name +
                (total > 1
                  ? ` (part ${index + 1} of ${total}` +
                    (total > slices.length ? `; parts ${slices.length + 1}–${total} in the HTML report` : '') +
                    ')'
                  : '') +
                ' ' +
                `· SHA-256 ${shot.sha256.slice(0, 32)}…`,
              fontSize: 8,
              margin: [0, 6, 0, 2],
            },
            { image: `data:image/png;base64,${slice}`, fit: [515, 640] },
          ],
          unbreakable: true,
        }));
      }),
      table(['Content SHA-256'], [[hash]]),
      {
        text:
          'The SHA-256 of the RFC 8785 canonical JSON of what this report states (screenshots by their own ' +
          'hashes). SHA256SUMS beside this file holds the hashes of the report’s files.',
        fontSize: 8,
        color: '#555',
      },
    ],
  };
  return renderPdf(definition);
}
