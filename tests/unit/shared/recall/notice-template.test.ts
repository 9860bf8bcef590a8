import { describe, expect, it } from 'vitest';
import {
  defaultNoticeTemplate,
  lotLines,
  mergeNotice,
  templateProblems,
} from '../../../../shared/domain/recall/notice-template';

// The template language is the product's own (common practice for mail merge, no source).
const values = {
  firm: 'Firm',
  consignee: 'Clinic {{firm}}',
  recallNumber: 'RC-2026-0001',
  date: '2026-12-05',
  lots: '- Lot L1',
  actionAsked: 'Quarantine and return',
  replyLink: 'https://example.test/reply/abc',
};

describe('consignee notice templates', () => {
  it('accepts the shipped template and merges every field', () => {
    expect(templateProblems(defaultNoticeTemplate)).toEqual([]);
    const text = mergeNotice(defaultNoticeTemplate, values);
    expect(text).toContain('To: Clinic {{firm}}'); // a value is never merged again
    expect(text).toContain('https://example.test/reply/abc');
    expect(text).not.toMatch(/\{\{(?!firm)/);
  });

  it('refuses unknown fields and a template without the lots or the reply link', () => {
    expect(templateProblems('{{lots}} {{replyLink}} {{customer}}')[0]).toMatch(/Unknown field \{\{customer\}\}/);
    expect(templateProblems('{{lots}}')).toEqual([
      "The template must include {{replyLink}} (the consignee's own reply link)",
    ]);
    expect(() => mergeNotice('Hello {{consignee}}', values)).toThrow(/\{\{lots\}\}/);
  });

  it('allows spaces inside the braces', () => {
    expect(mergeNotice('{{ lots }} / {{replyLink }}', values)).toBe('- Lot L1 / https://example.test/reply/abc');
  });

  it('lists each lot with its units and UDI', () => {
    expect(
      lotLines([
        { lotNumber: 'L1', part: 'Bone screw', gtin: '09506000134352', shipped: 5, udi: '(01)09506000134352(10)L1' },
      ]),
    ).toBe('- Lot L1 (Bone screw): 5 units shipped to you; UDI (01)09506000134352(10)L1');
  });
});
