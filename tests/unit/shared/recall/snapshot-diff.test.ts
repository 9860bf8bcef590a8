import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { diffAffectedSets, needsHold, type AffectedSet, type SnapshotLot } from '@shared/domain/recall/snapshot-diff';

const lot = (id: number, overrides: Partial<SnapshotLot> = {}): SnapshotLot => ({
  id,
  lotNumber: `L${id}`,
  status: 'open',
  made: 20,
  released: 0,
  shipped: 0,
  onHand: 0,
  ...overrides,
});

describe('the difference between a frozen affected set and a re-run', () => {
  it('when nothing changed, then it says so', () => {
    const set: AffectedSet = { lots: [lot(1), lot(2)], consignees: [{ id: 1, name: 'A', units: 5, lots: 1 }] };
    expect(diffAffectedSets(set, structuredClone(set)).unchanged).toBe(true);
  });

  it('when a lot joins, one leaves and one ships, then each is named with what moved', () => {
    const before: AffectedSet = {
      lots: [lot(1), lot(2, { status: 'released', released: 20, onHand: 20 })],
      consignees: [],
    };
    const after: AffectedSet = {
      lots: [lot(2, { status: 'released', released: 20, shipped: 8, onHand: 12 }), lot(3)],
      consignees: [{ id: 9, name: 'Clinic', units: 8, lots: 1 }],
    };
    const diff = diffAffectedSets(before, after);
    expect(diff.unchanged).toBe(false);
    expect(diff.lotsAdded.map((entry) => entry.id)).toEqual([3]);
    expect(diff.lotsRemoved.map((entry) => entry.id)).toEqual([1]);
    expect(diff.lotsChanged).toEqual([
      {
        lot: after.lots[0],
        changes: [
          { field: 'shipped', before: 0, after: 8 },
          { field: 'onHand', before: 20, after: 12 },
        ],
      },
    ]);
    expect(diff.consigneesAdded.map((entry) => entry.name)).toEqual(['Clinic']);
  });

  // Property (common practice, no source): applying the difference to the earlier set rebuilds the later one exactly.
  it('for any two sets, then removing, adding and changing as the difference says gives the later set', () => {
    const lotArb = fc.record({
      status: fc.constantFrom('open', 'submitted', 'released', 'consumed'),
      made: fc.option(fc.nat(500), { nil: null }),
      released: fc.nat(500),
      shipped: fc.nat(500),
      onHand: fc.nat(500),
    });
    const setArb: fc.Arbitrary<SnapshotLot[]> = fc
      .dictionary(fc.integer({ min: 1, max: 30 }).map(String), lotArb, { maxKeys: 20 })
      .map((lots) => Object.entries(lots).map(([id, fields]) => ({ id: Number(id), lotNumber: `L${id}`, ...fields })));
    fc.assert(
      fc.property(setArb, setArb, (earlier, later) => {
        const diff = diffAffectedSets({ lots: earlier, consignees: [] }, { lots: later, consignees: [] });
        const rebuilt = new Map(earlier.map((entry) => [entry.id, { ...entry }]));
        for (const removed of diff.lotsRemoved) rebuilt.delete(removed.id);
        for (const added of diff.lotsAdded) rebuilt.set(added.id, added);
        for (const { lot: changed, changes } of diff.lotsChanged)
          for (const change of changes)
            (rebuilt.get(changed.id) as unknown as Record<string, unknown>)[change.field] = change.after;
        const sort = (lots: SnapshotLot[]) => [...lots].sort((a, b) => a.id - b.id);
        expect(sort([...rebuilt.values()])).toEqual(sort(later));
        expect(diff.unchanged).toBe(JSON.stringify(sort(earlier)) === JSON.stringify(sort(later)));
      }),
    );
  });
});

describe('which affected lots a recall holds', () => {
  it('holds every lot with units still in the building, and none whose units all left or went on to other lots', () => {
    expect(needsHold({ status: 'open', onHand: 0 })).toBe(true);
    expect(needsHold({ status: 'submitted', onHand: 0 })).toBe(true);
    expect(needsHold({ status: 'released', onHand: 3 })).toBe(true);
    expect(needsHold({ status: 'released', onHand: 0 })).toBe(false);
    expect(needsHold({ status: 'consumed', onHand: 0 })).toBe(false);
    expect(needsHold({ status: 'rejected', onHand: 0 })).toBe(true);
  });
});
