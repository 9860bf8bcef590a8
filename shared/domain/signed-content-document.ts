import { plantDateTime } from './plant-time';
import { statusWord } from './status-words';
import { verdictLabels, type OverallVerdict } from '../schemas/evaluation';
import { processMethod } from './manufacturing/process-methods';
import { wordsOfCode } from './words-of-code';

/**
 * What a person reads of signed content, as a small document: a section of facts for the
 * content's own fields, then one section per list or group. The signing dialog, the lot page and
 * the release packet all draw the same document from the same content, so what a person reads is
 * what the hash covers — in words, with units, and with times on the plant's clock.
 */
export type DocumentCell = { text: string; kind?: 'hash' | 'code' };
export type DocumentSection =
  | { kind: 'facts'; key: string; title: string | null; rows: Array<[string, DocumentCell]> }
  | { kind: 'table'; key: string; title: string; columns: string[]; rows: DocumentCell[][] }
  | { kind: 'list'; key: string; title: string; items: DocumentCell[] };

/** Names of fields that their words alone would not give (acronyms, units, the trade's terms). */
const fieldNames: Record<string, string> = {
  gtin: 'GTIN',
  udi: 'UDI',
  qty: 'Quantity',
  inWindow: 'Window',
  ncNumber: 'Nonconformance',
  sha256: 'SHA-256',
  contentHash: 'Content SHA-256',
  dossierHash: 'Release content SHA-256',
  heats: 'Material certificates and their evaluation',
  steps: 'Inspections (the verdict of each recorded step)',
  runs: 'Passivation and cleaning runs',
  readiness: 'Release checklist as evaluated',
  genealogy: 'Came from',
  certificates: 'Certificate SHA-256',
  files: 'File SHA-256',
  by: 'Operator, work centre',
  ended: 'Ended',
  dispositionNote: 'Note on the disposition',
  unitLengthMm: 'Unit length (mm)',
  lengthMm: 'Length (mm)',
  diameterMm: 'Diameter (mm)',
  noticeSha256: 'Notice SHA-256',
  openingSnapshotSha256: 'Opening snapshot SHA-256',
  effectivenessLevel: 'Effectiveness check level',
  effectiveness: 'Effectiveness of the field action',
};

/** Fields whose values are stored states: shown in words, never as codes. */
const stateFields = new Set(['status', 'disposition', 'verdict', 'subjectType', 'outcome']);
const isoInstant = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:\d{2})$/;
const sha256 = /^[0-9a-f]{64}$/;

export function fieldName(key: string): string {
  const known = fieldNames[key];
  if (known) return known;
  return wordsOfCode(key);
}

const isRecord = (value: unknown): value is Record<string, unknown> =>
  typeof value === 'object' && value !== null && !Array.isArray(value);

function cell(key: string, value: unknown, timeZone: string): DocumentCell {
  if (value === null || value === undefined || value === '') return { text: '—' };
  if (typeof value === 'boolean')
    return { text: key === 'inWindow' ? (value ? 'Within window' : 'Outside window') : value ? 'Yes' : 'No' };
  if (typeof value === 'number') return { text: String(value) };
  if (typeof value === 'string') {
    if (sha256.test(value)) return { text: value, kind: 'hash' };
    if (isoInstant.test(value)) return { text: plantDateTime(value, timeZone) };
    if (key === 'evaluation' && value in verdictLabels) return { text: verdictLabels[value as OverallVerdict] };
    if (stateFields.has(key)) return { text: statusWord(value) };
    return { text: value };
  }
  if (Array.isArray(value)) {
    if (value.every((item) => typeof item === 'string' && sha256.test(item)))
      return { text: value.length ? value.join('\n') : '—', kind: 'hash' };
    return { text: value.length ? value.map((item) => cell(key, item, timeZone).text).join(', ') : '—' };
  }
  if (isRecord(value)) {
    const parts = Object.entries(value).map(
      ([name, inner]) => `${fieldName(name)} ${cell(name, inner, timeZone).text}`,
    );
    return { text: parts.length ? parts.join('; ') : '—' };
  }
  return { text: String(value) };
}

/** A run's parameters with the labels and units its method states ("Bath temperature 52 °C"). */
function parametersText(methodId: unknown, parameters: unknown, timeZone: string): DocumentCell {
  const method = typeof methodId === 'string' ? processMethod(methodId) : undefined;
  if (!method || !isRecord(parameters)) return cell('parameters', parameters, timeZone);
  const parts = Object.entries(parameters).map(([key, value]) => {
    const known = method.parameters.find((parameter) => parameter.key === key);
    const unit = known?.unit ? ` ${known.unit}` : '';
    return `${known?.label ?? fieldName(key)} ${String(value)}${unit}`;
  });
  return { text: parts.join('; ') || '—' };
}

/** The document of any signed content; fields in the order the content states them. */
export function signedContentDocument(content: unknown, timeZone: string): DocumentSection[] {
  if (!isRecord(content))
    return [{ kind: 'facts', key: 'content', title: null, rows: [['Content', cell('content', content, timeZone)]] }];
  const facts: Array<[string, DocumentCell]> = [];
  const sections: DocumentSection[] = [];
  for (const [key, value] of Object.entries(content)) {
    if (Array.isArray(value) && value.length && value.every(isRecord)) {
      const columns = [...new Set(value.flatMap((row) => Object.keys(row)))];
      sections.push({
        kind: 'table',
        key,
        title: fieldName(key),
        columns: columns.map(fieldName),
        rows: value.map((row) =>
          columns.map((column) =>
            column === 'parameters'
              ? parametersText(row.method, row[column], timeZone)
              : cell(column, row[column], timeZone),
          ),
        ),
      });
    } else if (
      Array.isArray(value) &&
      (value.length === 0 || !value.every((item) => typeof item === 'string' && sha256.test(item)))
    ) {
      // A list with nothing in it is still a section that says so ("None"), as the record's other lists are.
      sections.push({
        kind: 'list',
        key,
        title: fieldName(key),
        items: value.map((item) => cell(key, item, timeZone)),
      });
    } else if (isRecord(value) && Object.keys(value).length > 1) {
      sections.push({
        kind: 'facts',
        key,
        title: fieldName(key),
        rows: Object.entries(value).map(([name, inner]) => [fieldName(name), cell(name, inner, timeZone)]),
      });
    } else {
      facts.push([fieldName(key), cell(key, value, timeZone)]);
    }
  }
  return facts.length ? [{ kind: 'facts', key: 'content', title: null, rows: facts }, ...sections] : sections;
}
