import { describe, expect, it } from 'vitest';
import {
  assessEffectiveness,
  levelPercent,
  reminderDue,
  repliesNeeded,
  replyProblems,
  type NoticeFacts,
} from '../../../../shared/domain/recall/effectiveness';

// Levels: 21 CFR 7.42(b)(3) — A 100 %, B above 10 % and below 100 % set case by case, C 10 %,
// D 2 %, E none (as given in the regulation's paragraph; not re-read against the eCFR here).
describe('effectiveness check levels (21 CFR 7.42(b)(3))', () => {
  it('gives each level its published share', () => {
    expect(levelPercent('A', null)).toBe(100);
    expect(levelPercent('C', null)).toBe(10);
    expect(levelPercent('D', null)).toBe(2);
    expect(levelPercent('E', null)).toBe(0);
    expect(levelPercent('B', 50)).toBe(50);
  });

  it('refuses a level B share of 10 % or 100 % (the regulation says more than 10 and less than 100)', () => {
    expect(() => levelPercent('B', 10)).toThrow(/above 10/);
    expect(() => levelPercent('B', 100)).toThrow(/above 10/);
    expect(() => levelPercent('B', null)).toThrow(/above 10/);
    expect(levelPercent('B', 11)).toBe(11);
    expect(levelPercent('B', 99)).toBe(99);
  });

  // Rounding up to a whole consignee: common practice, no source.
  it('rounds the share up to whole consignees, at least one, and exactly at whole shares', () => {
    expect(repliesNeeded(10, 10)).toBe(1);
    expect(repliesNeeded(11, 10)).toBe(2);
    expect(repliesNeeded(30, 10)).toBe(3); // 30 × 0.1 in floating point is 3.0000000000000004
    expect(repliesNeeded(3, 2)).toBe(1);
    expect(repliesNeeded(50, 2)).toBe(1);
    expect(repliesNeeded(51, 2)).toBe(2);
    expect(repliesNeeded(7, 100)).toBe(7);
    expect(repliesNeeded(7, 0)).toBe(0);
    expect(repliesNeeded(0, 100)).toBe(0);
  });
});

const notice = (
  consigneeId: number,
  issued: boolean,
  lots: NoticeFacts['lots'],
  replies: NoticeFacts['replies'] = [],
) =>
  ({
    consigneeId,
    consignee: `Consignee ${consigneeId}`,
    issuedAt: issued ? '2026-11-01T09:00:00.000Z' : null,
    lots,
    replies,
  }) satisfies NoticeFacts;

describe('assessing a field action', () => {
  const lotA = { lotId: 1, lotNumber: 'L-A', shipped: 10 };
  const lotB = { lotId: 2, lotNumber: 'L-B', shipped: 4 };

  it('is met at level A only when every consignee is notified and has replied', () => {
    const notices = [
      notice(
        1,
        true,
        [lotA],
        [
          {
            repliedAt: '2026-11-02T09:00:00.000Z',
            lots: [{ lotId: 1, onHand: 2, returned: 3, destroyed: 1, used: 4 }],
          },
        ],
      ),
      notice(2, true, [lotB]),
    ];
    const open = assessEffectiveness({ level: 'A', levelBPercent: null, notices, consigneesInScope: 2, received: [] });
    expect(open).toMatchObject({
      consignees: 2,
      notified: 2,
      replied: 1,
      needed: 2,
      met: false,
      unitsShipped: 14,
      unitsAccounted: 10,
    });
    expect(open.shortfalls.join()).toMatch(/1 of the 2 consignee replies/);
    const atC = assessEffectiveness({ level: 'C', levelBPercent: null, notices, consigneesInScope: 2, received: [] });
    expect(atC).toMatchObject({ needed: 1, met: true });
  });

  it('is not met while a consignee in scope has no notice issued, whatever the level', () => {
    const notices = [
      notice(
        1,
        true,
        [lotA],
        [
          {
            repliedAt: '2026-11-02T09:00:00.000Z',
            lots: [{ lotId: 1, onHand: 10, returned: 0, destroyed: 0, used: 0 }],
          },
        ],
      ),
      notice(2, false, [lotB]),
    ];
    const atE = assessEffectiveness({ level: 'E', levelBPercent: null, notices, consigneesInScope: 3, received: [] });
    expect(atE).toMatchObject({ consignees: 3, notified: 1, needed: 0, met: false });
    expect(atE.shortfalls).toEqual(['2 of 3 consignees not notified yet']);
  });

  it('does not count a reply to a notice that was never issued', () => {
    const notices = [
      notice(
        1,
        false,
        [lotA],
        [
          {
            repliedAt: '2026-11-02T09:00:00.000Z',
            lots: [{ lotId: 1, onHand: 10, returned: 0, destroyed: 0, used: 0 }],
          },
        ],
      ),
    ];
    expect(
      assessEffectiveness({ level: 'A', levelBPercent: null, notices, consigneesInScope: 1, received: [] }).replied,
    ).toBe(0);
  });

  it('checks the balance shipped = on hand + returned + destroyed + used and returns received against reported', () => {
    const notices = [
      notice(
        1,
        true,
        [lotA, lotB],
        [
          {
            repliedAt: '2026-11-02T09:00:00.000Z',
            lots: [
              { lotId: 1, onHand: 10, returned: 0, destroyed: 0, used: 0 },
              { lotId: 2, onHand: 0, returned: 0, destroyed: 0, used: 0 },
            ],
          },
          // The correction stands: 6 returned, 3 used, 1 missing on lot A; lot B balances.
          {
            repliedAt: '2026-11-03T09:00:00.000Z',
            lots: [
              { lotId: 1, onHand: 0, returned: 6, destroyed: 0, used: 3 },
              { lotId: 2, onHand: 0, returned: 0, destroyed: 4, used: 0 },
            ],
          },
        ],
      ),
    ];
    const result = assessEffectiveness({
      level: 'A',
      levelBPercent: null,
      notices,
      consigneesInScope: 1,
      received: [{ consigneeId: 1, lotId: 1, units: 5 }],
    });
    expect(result.lines.map((line) => [line.lotNumber, line.accounted, line.unaccounted, line.received])).toEqual([
      ['L-A', 9, 1, 5],
      ['L-B', 4, 0, 0],
    ]);
    expect(result.differences).toHaveLength(1);
    expect(result.differences[0]?.problem).toBe(
      '1 of 10 units shipped are not accounted for; 6 units reported returned, 5 received',
    );
    expect(result.unitsAccounted).toBe(13);
    // The chart follows each reply: the first accounted for 10 (lot A) + 0, the correction for 9 + 4.
    expect(result.series).toEqual([
      { at: '2026-11-02T09:00:00.000Z', accounted: 10 },
      { at: '2026-11-03T09:00:00.000Z', accounted: 13 },
    ]);
  });

  it('lists returns received from a consignee that has not replied', () => {
    const result = assessEffectiveness({
      level: 'A',
      levelBPercent: null,
      notices: [notice(1, true, [lotA])],
      consigneesInScope: 1,
      received: [{ consigneeId: 1, lotId: 1, units: 2 }],
    });
    expect(result.differences.map((line) => line.problem)).toEqual(['0 units reported returned, 2 received']);
  });
});

describe('a reply against its notice', () => {
  const lots = [
    { lotId: 1, lotNumber: 'L-A', shipped: 10 },
    { lotId: 2, lotNumber: 'L-B', shipped: 4 },
  ];
  const answer = (lotId: number, onHand: number) => ({ lotId, onHand, returned: 0, destroyed: 0, used: 0 });

  it('passes when every lot is answered within what was shipped', () => {
    expect(replyProblems(lots, [answer(1, 10), answer(2, 0)])).toEqual({});
  });

  it('refuses more units than were shipped, a lot not in the notice, a lot twice and a lot left out', () => {
    expect(replyProblems(lots, [answer(1, 11), answer(2, 0)])['lots.0.onHand']).toMatch(
      /add up to 11; 10 units of L-A/,
    );
    expect(replyProblems(lots, [answer(1, 1), answer(2, 0), answer(3, 0)])['lots.2.lotId']).toMatch(
      /not in your notice/,
    );
    expect(replyProblems(lots, [answer(1, 1), answer(1, 1), answer(2, 0)])['lots.1.lotId']).toMatch(/twice/);
    expect(replyProblems(lots, [answer(1, 1)]).lots).toMatch(/L-B is missing/);
  });
});

describe('reminders', () => {
  const issuedAt = new Date('2026-11-01T09:00:00Z');
  it('falls due a whole interval after the notice or the last reminder, not a minute before', () => {
    expect(reminderDue({ issuedAt, lastReminderAt: null, replied: false }, 3, new Date('2026-11-04T08:59:00Z'))).toBe(
      false,
    );
    expect(reminderDue({ issuedAt, lastReminderAt: null, replied: false }, 3, new Date('2026-11-04T09:00:00Z'))).toBe(
      true,
    );
    const lastReminderAt = new Date('2026-11-04T09:00:00Z');
    expect(reminderDue({ issuedAt, lastReminderAt, replied: false }, 3, new Date('2026-11-05T09:00:00Z'))).toBe(false);
  });
  it('never reminds a consignee that replied, nor one never notified', () => {
    expect(reminderDue({ issuedAt, lastReminderAt: null, replied: true }, 1, new Date('2027-01-01T00:00:00Z'))).toBe(
      false,
    );
    expect(
      reminderDue({ issuedAt: null, lastReminderAt: null, replied: false }, 1, new Date('2027-01-01T00:00:00Z')),
    ).toBe(false);
  });
});
