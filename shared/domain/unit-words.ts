/**
 * The names of a lot's unit counts, with the definition a tooltip or a document's note gives.
 * One set of words on every screen, PDF, CSV and e-mail (WORDS.md), with the same arithmetic.
 */
export const unitWords = {
  started: { name: 'Started', definition: 'units the lot started with at its first routing step' },
  good: {
    name: 'Good',
    definition: 'good units after the last recorded routing step, less those split off to other lots',
  },
  released: { name: 'Released', definition: 'units approved for release' },
  shipped: { name: 'Shipped', definition: 'released units shipped to consignees' },
  inPlant: {
    name: 'In plant',
    definition: 'units still in the plant: work in progress of an open lot, or released units not yet shipped',
  },
  onHold: { name: 'On hold', definition: 'units of lots held by a recall investigation or a nonconformance' },
} as const;

export type UnitWord = keyof typeof unitWords;

/**
 * Units of a lot still in the plant: released and not shipped for a released lot; the good units
 * it holds (work in progress) for a lot not yet released; none for a lot consumed into others or
 * rejected.
 */
export function unitsInPlant(lot: { status: string; released: number; shipped: number; good: number | null }): number {
  if (lot.status === 'released') return Math.max(0, lot.released - lot.shipped);
  if (lot.status === 'consumed' || lot.status === 'rejected') return 0;
  return lot.good ?? 0;
}
