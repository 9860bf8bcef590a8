/**
 * Effectiveness checks of a field action. The levels are those a recall strategy names under
 * 21 CFR 7.42(b)(3) (US FDA, "Recall strategy"): the share of consignees to be contacted to
 * verify that the notice reached them and that they acted on it. Shipped as published in that
 * paragraph; not re-read against the eCFR text by us — the firm verifies it. The product records
 * the level the firm chose; it does not choose it.
 */
export const effectivenessLevels = ['A', 'B', 'C', 'D', 'E'] as const;
export type EffectivenessLevel = (typeof effectivenessLevels)[number];

export const effectivenessSource = '21 CFR 7.42(b)(3)';

export const levelDescriptions: Record<EffectivenessLevel, string> = {
  A: 'Level A: 100 % of consignees',
  B: 'Level B: a share above 10 % and below 100 %, set for this recall',
  C: 'Level C: 10 % of consignees',
  D: 'Level D: 2 % of consignees',
  E: 'Level E: no effectiveness checks',
};

/** The share (per cent) a level asks for; level B takes the share the firm set (above 10, below 100). */
export function levelPercent(level: EffectivenessLevel, levelBPercent: number | null): number {
  switch (level) {
    case 'A':
      return 100;
    case 'B':
      if (levelBPercent === null || !(levelBPercent > 10 && levelBPercent < 100))
        throw new RangeError('Level B needs a share above 10 % and below 100 %');
      return levelBPercent;
    case 'C':
      return 10;
    case 'D':
      return 2;
    case 'E':
      return 0;
  }
}

/**
 * How many consignees' replies the level needs: the share of all consignees, rounded up to a
 * whole consignee (a share of a consignee cannot be checked; rounding up is common practice, no
 * source), and at least one when the level asks for any checks and there is anyone to check.
 */
export function repliesNeeded(consignees: number, percent: number): number {
  if (percent <= 0 || consignees <= 0) return 0;
  // Integer arithmetic: 10 % of 30 is exactly 3, not 3.0000000000000004 rounded up to 4.
  return Math.max(1, Math.ceil((consignees * Math.round(percent * 100)) / 10_000));
}

export interface LotAnswer {
  lotId: number;
  onHand: number;
  returned: number;
  destroyed: number;
  used: number;
}

export interface NoticeFacts {
  consigneeId: number;
  consignee: string;
  issuedAt: string | null;
  lots: Array<{ lotId: number; lotNumber: string; shipped: number }>;
  /** Every reply in the order given; the last one stands, earlier ones are its history. */
  replies: Array<{ repliedAt: string; lots: LotAnswer[] }>;
}

export interface ReceivedReturn {
  consigneeId: number;
  lotId: number;
  units: number;
}

export interface BalanceLine {
  consigneeId: number;
  consignee: string;
  lotId: number;
  lotNumber: string;
  shipped: number;
  onHand: number;
  returned: number;
  destroyed: number;
  used: number;
  accounted: number;
  /** shipped − (on hand + returned + destroyed + used); 0 when the reply accounts for every unit. */
  unaccounted: number;
  /** Units received back at the plant against this consignee and lot. */
  received: number;
  answered: boolean;
}

export interface Effectiveness {
  level: EffectivenessLevel;
  percent: number;
  consignees: number;
  notified: number;
  replied: number;
  needed: number;
  met: boolean;
  /** Why it is not met, in words; empty when met. */
  shortfalls: string[];
  unitsShipped: number;
  unitsAccounted: number;
  lines: BalanceLine[];
  /** Lines whose balance does not close, or whose returns received differ from those reported. */
  differences: Array<BalanceLine & { problem: string }>;
  /** Units accounted for after each reply, in time order (the chart's points). */
  series: Array<{ at: string; accounted: number }>;
}

const sum = (answer: Omit<LotAnswer, 'lotId'>) => answer.onHand + answer.returned + answer.destroyed + answer.used;

/** Units a set of latest answers accounts for, capped per lot at what was shipped there. */
function accountedOf(notices: NoticeFacts[], latest: Map<number, LotAnswer[]>): number {
  let total = 0;
  for (const notice of notices) {
    const answers = latest.get(notice.consigneeId);
    if (!answers) continue;
    for (const lot of notice.lots) {
      const answer = answers.find((candidate) => candidate.lotId === lot.lotId);
      if (answer) total += Math.min(lot.shipped, sum(answer));
    }
  }
  return total;
}

/**
 * Where a field action stands: consignees notified and replied against the level's share; units
 * accounted for against units shipped, by consignee and lot; and the balance shipped = on hand +
 * returned + destroyed + used per consignee and lot, with the returns received beside the returns
 * reported. A consignee counts as checked when it has replied through its notice.
 */
export function assessEffectiveness(input: {
  level: EffectivenessLevel;
  levelBPercent: number | null;
  notices: NoticeFacts[];
  /** Consignees in the recall's scope (a consignee without a notice yet is not notified). */
  consigneesInScope: number;
  received: ReceivedReturn[];
}): Effectiveness {
  const percent = levelPercent(input.level, input.levelBPercent);
  const consignees = Math.max(input.consigneesInScope, input.notices.length);
  const notified = input.notices.filter((notice) => notice.issuedAt !== null).length;
  const replied = input.notices.filter((notice) => notice.issuedAt !== null && notice.replies.length > 0).length;
  const needed = repliesNeeded(consignees, percent);
  const receivedOf = (consigneeId: number, lotId: number) =>
    input.received
      .filter((entry) => entry.consigneeId === consigneeId && entry.lotId === lotId)
      .reduce((total, entry) => total + entry.units, 0);

  const lines: BalanceLine[] = input.notices.flatMap((notice) => {
    const last = notice.replies.at(-1);
    return notice.lots.map((lot) => {
      const answer = last?.lots.find((candidate) => candidate.lotId === lot.lotId);
      const counts = answer ?? { onHand: 0, returned: 0, destroyed: 0, used: 0 };
      const accounted = sum(counts);
      return {
        consigneeId: notice.consigneeId,
        consignee: notice.consignee,
        lotId: lot.lotId,
        lotNumber: lot.lotNumber,
        shipped: lot.shipped,
        onHand: counts.onHand,
        returned: counts.returned,
        destroyed: counts.destroyed,
        used: counts.used,
        accounted,
        unaccounted: lot.shipped - accounted,
        received: receivedOf(notice.consigneeId, lot.lotId),
        answered: answer !== undefined,
      };
    });
  });

  const differences = lines.flatMap((line) => {
    const problems: string[] = [];
    if (line.answered && line.unaccounted > 0)
      problems.push(`${line.unaccounted} of ${line.shipped} units shipped are not accounted for`);
    if (line.unaccounted < 0)
      problems.push(`${-line.unaccounted} units more than the ${line.shipped} shipped are reported`);
    if (line.received !== line.returned && (line.answered || line.received > 0))
      problems.push(`${line.returned} units reported returned, ${line.received} received`);
    return problems.length ? [{ ...line, problem: problems.join('; ') }] : [];
  });

  const events = input.notices
    .flatMap((notice) => notice.replies.map((reply) => ({ consigneeId: notice.consigneeId, ...reply })))
    .sort((a, b) => a.repliedAt.localeCompare(b.repliedAt));
  const latest = new Map<number, LotAnswer[]>();
  const series = events.map((event) => {
    latest.set(event.consigneeId, event.lots);
    return { at: event.repliedAt, accounted: accountedOf(input.notices, latest) };
  });

  const shortfalls: string[] = [];
  if (notified < consignees) shortfalls.push(`${consignees - notified} of ${consignees} consignees not notified yet`);
  if (replied < needed) shortfalls.push(`${replied} of the ${needed} consignee replies the level needs`);
  const unitsShipped = lines.reduce((total, line) => total + line.shipped, 0);
  return {
    level: input.level,
    percent,
    consignees,
    notified,
    replied,
    needed,
    met: shortfalls.length === 0,
    shortfalls,
    unitsShipped,
    unitsAccounted: lines.reduce((total, line) => total + Math.min(line.shipped, line.accounted), 0),
    lines,
    differences,
    series,
  };
}

/** A reply's lot counts against what was shipped there: the field messages a reply is refused with. */
export function replyProblems(
  lots: Array<{ lotId: number; lotNumber: string; shipped: number }>,
  answers: LotAnswer[],
): Record<string, string> {
  const problems: Record<string, string> = {};
  answers.forEach((answer, index) => {
    const lot = lots.find((candidate) => candidate.lotId === answer.lotId);
    if (!lot) {
      problems[`lots.${index}.lotId`] = 'This lot was not in your notice';
      return;
    }
    if (sum(answer) > lot.shipped)
      problems[`lots.${index}.onHand`] =
        `On hand, returned, destroyed and used add up to ${sum(answer)}; ${lot.shipped} units of ` +
        `${lot.lotNumber} were shipped to you`;
  });
  const seen = new Set<number>();
  answers.forEach((answer, index) => {
    if (seen.has(answer.lotId)) problems[`lots.${index}.lotId`] = 'This lot is answered twice';
    seen.add(answer.lotId);
  });
  lots.forEach((lot) => {
    if (!answers.some((answer) => answer.lotId === lot.lotId))
      problems.lots = `Answer for every lot in your notice (${lot.lotNumber} is missing)`;
  });
  return problems;
}

/** When a notice without a reply is next due a reminder, from the strategy's interval. */
export function reminderDue(
  notice: { issuedAt: Date | null; lastReminderAt: Date | null; replied: boolean },
  everyDays: number,
  now: Date,
): boolean {
  if (!notice.issuedAt || notice.replied) return false;
  const from = notice.lastReminderAt ?? notice.issuedAt;
  return now.getTime() - from.getTime() >= everyDays * 86_400_000;
}
