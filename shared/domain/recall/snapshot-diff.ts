/**
 * What changed between the affected set frozen when a recall investigation was opened and the
 * same trace run again later: lots that joined or left the set, lots whose status or counts
 * moved, and consignees who received more (or are new).
 */
export interface SnapshotLot {
  id: number;
  lotNumber: string;
  status: string;
  made: number | null;
  released: number;
  shipped: number;
  onHand: number;
}

export interface SnapshotConsignee {
  id: number;
  name: string;
  units: number;
  lots: number;
}

export interface AffectedSet {
  lots: SnapshotLot[];
  consignees: SnapshotConsignee[];
}

export interface FieldChange {
  field: 'status' | 'made' | 'released' | 'shipped' | 'onHand' | 'units' | 'lots';
  before: string | number | null;
  after: string | number | null;
}

export interface SnapshotDiff {
  unchanged: boolean;
  lotsAdded: SnapshotLot[];
  lotsRemoved: SnapshotLot[];
  lotsChanged: Array<{ lot: SnapshotLot; changes: FieldChange[] }>;
  consigneesAdded: SnapshotConsignee[];
  consigneesRemoved: SnapshotConsignee[];
  consigneesChanged: Array<{ consignee: SnapshotConsignee; changes: FieldChange[] }>;
}

function changesOf<T>(before: T, after: T, fields: ReadonlyArray<keyof T & FieldChange['field']>): FieldChange[] {
  return fields
    .filter((field) => before[field] !== after[field])
    .map((field) => ({
      field,
      before: before[field] as FieldChange['before'],
      after: after[field] as FieldChange['after'],
    }));
}

function compare<T extends { id: number }>(
  before: T[],
  after: T[],
  fields: ReadonlyArray<keyof T & FieldChange['field']>,
) {
  const earlier = new Map(before.map((row) => [row.id, row]));
  const later = new Map(after.map((row) => [row.id, row]));
  return {
    added: after.filter((row) => !earlier.has(row.id)),
    removed: before.filter((row) => !later.has(row.id)),
    changed: after.flatMap((row) => {
      const then = earlier.get(row.id);
      if (!then) return [];
      const changes = changesOf(then, row, fields);
      return changes.length ? [{ row, changes }] : [];
    }),
  };
}

export function diffAffectedSets(before: AffectedSet, after: AffectedSet): SnapshotDiff {
  const lots = compare(before.lots, after.lots, ['status', 'made', 'released', 'shipped', 'onHand']);
  const consignees = compare(before.consignees, after.consignees, ['units', 'lots']);
  const diff = {
    lotsAdded: lots.added,
    lotsRemoved: lots.removed,
    lotsChanged: lots.changed.map(({ row, changes }) => ({ lot: row, changes })),
    consigneesAdded: consignees.added,
    consigneesRemoved: consignees.removed,
    consigneesChanged: consignees.changed.map(({ row, changes }) => ({ consignee: row, changes })),
  };
  return { unchanged: Object.values(diff).every((list) => list.length === 0), ...diff };
}

/**
 * Lots a recall holds: units that have not left the building. A lot split or merged away
 * ("consumed") holds nothing itself — its units live on in the lots it went to, which are in
 * the affected set too. A rejected lot is already blocked from release; it is held all the same
 * so that a re-disposition cannot release it without the recall in view.
 */
export function needsHold(lot: Pick<SnapshotLot, 'status' | 'onHand'>): boolean {
  if (lot.status === 'consumed') return false;
  if (lot.status === 'released') return lot.onHand > 0;
  return true;
}
