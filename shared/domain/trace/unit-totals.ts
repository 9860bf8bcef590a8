/** What the totals need of each affected lot. */
export interface LotUnits {
  id: number;
  /** Units the lot started with (null: not started). */
  made: number | null;
  released: number;
  shipped: number;
  onHand: number;
}

export interface UnitTotals {
  made: number;
  released: number;
  shipped: number;
  onHand: number;
}

/**
 * Units made, released, shipped and on hand over a set of affected lots. A unit is made once: what
 * a lot passed on to lots split or merged from it (`passedOn`, by lot id) counts in those lots, not
 * again in the lot it came from. A merged lot's units all count, also those from a parent outside
 * the set: they are mixed with affected units.
 */
export function unitTotals(lots: readonly LotUnits[], passedOn: ReadonlyMap<number, number>): UnitTotals {
  return lots.reduce(
    (sum, lot) => ({
      made: sum.made + Math.max(0, (lot.made ?? 0) - (passedOn.get(lot.id) ?? 0)),
      released: sum.released + lot.released,
      shipped: sum.shipped + lot.shipped,
      onHand: sum.onHand + lot.onHand,
    }),
    { made: 0, released: 0, shipped: 0, onHand: 0 },
  );
}
