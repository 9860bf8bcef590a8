// Units over an affected set, on hand-built genealogies (invented for this test; each count is
// worked by hand in its comment). Counting a unit once across splits and merges is common
// practice, no source: a unit is in exactly one lot at a time.
import { describe, expect, it } from 'vitest';
import { unitTotals, type LotUnits } from '@shared/domain/trace/unit-totals';

const lot = (id: number, made: number | null, values: Partial<LotUnits> = {}): LotUnits => ({
  id,
  made,
  released: 0,
  shipped: 0,
  onHand: 0,
  ...values,
});

describe('units made, released, shipped and on hand over affected lots', () => {
  it('when a lot of 40 is split into 15 and 25, then 40 units were made, not 80', () => {
    // A started 40 and passed all of them on: 0 kept + 15 + 25 = 40.
    const lots = [
      lot(1, 40),
      lot(2, 15, { released: 15, shipped: 10, onHand: 5 }),
      lot(3, 25, { released: 25, shipped: 25 }),
    ];
    expect(unitTotals(lots, new Map([[1, 40]]))).toEqual({ made: 40, released: 40, shipped: 35, onHand: 5 });
  });

  it('when a lot of 10 passes 4 to a split and keeps 6, then 10 units were made', () => {
    // 6 kept + 4 = 10 (a part split after the first step).
    expect(unitTotals([lot(1, 10), lot(2, 4)], new Map([[1, 4]])).made).toBe(10);
  });

  it(
    'when two lots of 10 are merged into one of 20 and only one parent is affected, then the merged lot counts ' +
      'whole',
    () => {
      // Parent A (affected) 10 passed on; the merged lot's 20 mix A's units with B's: 0 + 20 = 20.
      expect(unitTotals([lot(1, 10), lot(3, 20)], new Map([[1, 10]])).made).toBe(20);
      // Both parents affected: 0 + 0 + 20 = 20, not 40.
      expect(
        unitTotals(
          [lot(1, 10), lot(2, 10), lot(3, 20)],
          new Map([
            [1, 10],
            [2, 10],
          ]),
        ).made,
      ).toBe(20);
    },
  );

  it('when a lot has not started, then it adds no units', () => {
    expect(unitTotals([lot(1, null), lot(2, 12)], new Map()).made).toBe(12);
  });
});
