/**
 * A consignee notice is the firm's own text with the product's fields merged in: `{{name}}`
 * placeholders, each from the list below. Merging is plain text (the mail is plain text and the
 * PDF draws text), so nothing a template or a record holds can become markup.
 */
export const noticeFields = {
  firm: 'the firm sending the notice',
  consignee: "the consignee's name",
  recallNumber: "the recall's number",
  date: "the notice's date (the day it was prepared, plant time)",
  lots: 'the lots, units shipped and UDIs, one a line',
  actionAsked: 'the action asked of the consignee',
  replyLink: "the consignee's own reply link",
} as const;
export type NoticeField = keyof typeof noticeFields;

/** Fields a notice cannot do without: the consignee must see its lots and be able to reply. */
export const requiredNoticeFields: readonly NoticeField[] = ['lots', 'replyLink'];

export const defaultNoticeTemplate = [
  'URGENT: MEDICAL DEVICE RECALL {{recallNumber}}',
  '',
  'To: {{consignee}}',
  'From: {{firm}}',
  'Date: {{date}}',
  '',
  'Our records show that you received units of the lots listed below. They are subject to this recall.',
  '',
  '{{lots}}',
  '',
  'What we ask of you: {{actionAsked}}',
  '',
  'Please tell us, for each lot, how many units you still have, have returned, have destroyed or have ' +
    'already used, even if the answer is none, through your own reply page:',
  '{{replyLink}}',
  '',
  'The link is yours alone; you can correct your answer through it until the recall is closed.',
].join('\n');

const placeholder = /\{\{\s*([A-Za-z]+)\s*\}\}/g;

/** What is wrong with a template: unknown placeholders and required ones left out. */
export function templateProblems(template: string): string[] {
  const problems: string[] = [];
  const used = new Set<string>();
  for (const match of template.matchAll(placeholder)) used.add(match[1]!);
  const unknown = [...used].filter((name) => !(name in noticeFields));
  if (unknown.length)
    problems.push(
      `Unknown field${unknown.length > 1 ? 's' : ''} ${unknown.map((name) => `{{${name}}}`).join(', ')}; ` +
        `use ${Object.keys(noticeFields)
          .map((name) => `{{${name}}}`)
          .join(', ')}`,
    );
  for (const name of requiredNoticeFields)
    if (!used.has(name)) problems.push(`The template must include {{${name}}} (${noticeFields[name]})`);
  return problems;
}

export interface NoticeLot {
  lotNumber: string;
  part: string;
  gtin: string;
  shipped: number;
  /** The UDI's production identifier as an element string, (01)GTIN(10)lot. */
  udi: string;
}

/** The lots as the notice lists them. */
export function lotLines(lots: NoticeLot[]): string {
  return lots
    .map((lot) => `- Lot ${lot.lotNumber} (${lot.part}): ${lot.shipped} units shipped to you; UDI ${lot.udi}`)
    .join('\n');
}

/** The template with every field merged; throws when the template has problems. */
export function mergeNotice(template: string, values: Record<NoticeField, string>): string {
  const problems = templateProblems(template);
  if (problems.length) throw new Error(problems.join('; '));
  return template.replace(placeholder, (_whole, name: NoticeField) => values[name]);
}
