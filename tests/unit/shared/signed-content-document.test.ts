import { describe, expect, it } from 'vitest';
import { fieldName, signedContentDocument } from '@shared/domain/signed-content-document';

// The words are the product's own (WORDS.md); the process-parameter labels and units are those the
// method library states (ASTM A967 / F86 via the library's sources); times follow the plant's zone
// (Europe/London is UTC+0 in December, IANA tz database).
describe('signed content as a document', () => {
  const content = {
    lot: 'T260001',
    gtin: '09521230000024',
    quantity: 40,
    heats: [{ heat: 'NV-25-0214', disposition: 'accepted', evaluation: 'conforms', certificates: ['a'.repeat(64)] }],
    operations: [{ step: '10 Turn', ended: '2026-12-04T16:05:00.000Z' }],
    runs: [
      {
        run: 'PV-2026-0001',
        method: 'F86-NITRIC',
        inWindow: false,
        parameters: { temperature: '52', immersionTime: '30' },
      },
    ],
    nonconformances: [{ nonconformance: 'NC-2026-0003', status: 'dispositioned', disposition: 'use-as-is' }],
    labels: { printed: 42, voided: 2 },
    genealogy: ['split from T260000 (10 units after step 10)'],
  };
  const sections = signedContentDocument(content, 'Europe/London');
  const section = (key: string) => sections.find((entry) => entry.key === key)!;
  const tableRows = (key: string) => {
    const found = section(key);
    if (found.kind !== 'table') throw new Error(`${key} is not a table`);
    return found.rows;
  };

  it('when content is signed, then its own fields read as facts with acronyms and words, not keys', () => {
    expect(section('content')).toEqual({
      kind: 'facts',
      key: 'content',
      title: null,
      rows: [
        ['Lot', { text: 'T260001' }],
        ['GTIN', { text: '09521230000024' }],
        ['Quantity', { text: '40' }],
      ],
    });
  });

  it(
    'when a list of records is signed, then it is a table whose states, dispositions and verdicts are words and ' +
      'whose times are on the plant clock',
    () => {
      expect(section('heats')).toMatchObject({
        kind: 'table',
        title: 'Material certificates and their evaluation',
        columns: ['Heat', 'Disposition', 'Evaluation', 'Certificate SHA-256'],
      });
      expect(tableRows('heats')).toEqual([
        [{ text: 'NV-25-0214' }, { text: 'Accepted' }, { text: 'Conforms' }, { text: 'a'.repeat(64), kind: 'hash' }],
      ]);
      expect(tableRows('operations')[0]![1]).toEqual({ text: '2026-12-04 16:05' });
      expect(tableRows('nonconformances')[0]!.slice(1)).toEqual([
        { text: 'Disposition signed' },
        { text: 'Use as is' },
      ]);
    },
  );

  it(
    "when a run's parameters are signed, then they carry the method's labels and units and the window reads in " +
      'words',
    () => {
      expect(tableRows('runs')[0]!.slice(2)).toEqual([
        { text: 'Outside window' },
        { text: 'Bath temperature 52 °C; Immersion time 30 min' },
      ]);
    },
  );

  it('when a group or a list of text is signed, then each reads as its own section; keys never show as code', () => {
    expect(section('labels')).toEqual({
      kind: 'facts',
      key: 'labels',
      title: 'Labels',
      rows: [
        ['Printed', { text: '42' }],
        ['Voided', { text: '2' }],
      ],
    });
    expect(section('genealogy')).toEqual({
      kind: 'list',
      key: 'genealogy',
      title: 'Came from',
      items: [{ text: 'split from T260000 (10 units after step 10)' }],
    });
    expect(fieldName('dispositionNote')).toBe('Note on the disposition');
    expect(fieldName('reduction_of_area')).toBe('Reduction of area');
    expect(JSON.stringify(sections)).not.toMatch(/use-as-is|inWindow|dispositioned"/);
  });
});
