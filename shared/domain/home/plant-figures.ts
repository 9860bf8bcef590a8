import { plantDate } from '../plant-time';

/**
 * The plant's few figures people would rather see as charts. Pure: rows in, figures out.
 * Definitions are common practice, no published source; each states its arithmetic.
 */

/** Median of a list (the mean of the two middle values for an even count); null when empty. */
export function median(values: readonly number[]): number | null {
  if (!values.length) return null;
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[middle]! : (sorted[middle - 1]! + sorted[middle]!) / 2;
}

/**
 * Release lead time: from a lot's first submission for release to its approval for release, in
 * days, grouped by the plant's calendar month of the approval; the median of each month, to one
 * decimal (half away from zero).
 */
export function releaseLeadTimes(
  rows: ReadonlyArray<{ submittedAt: string; releasedAt: string }>,
  timeZone: string,
): Array<{ month: string; lots: number; medianDays: number }> {
  const byMonth = new Map<string, number[]>();
  for (const row of rows) {
    const days = (Date.parse(row.releasedAt) - Date.parse(row.submittedAt)) / 86_400_000;
    if (!Number.isFinite(days) || days < 0) continue;
    const month = plantDate(row.releasedAt, timeZone).slice(0, 7);
    byMonth.set(month, [...(byMonth.get(month) ?? []), days]);
  }
  return [...byMonth.entries()]
    .sort(([a], [b]) => a.localeCompare(b))
    .map(([month, days]) => ({ month, lots: days.length, medianDays: Math.round(median(days)! * 10) / 10 }));
}

export type NonconformanceCause = 'material' | 'process-run' | 'inspection-or-work';
export const nonconformanceCauseWords: Record<NonconformanceCause, string> = {
  material: 'Material (heat or bar)',
  'process-run': 'Passivation or cleaning run',
  'inspection-or-work': 'Inspection or work on the lot',
};

/**
 * Nonconformances by supplier (those on a heat or a bar name its mill; the rest are the plant's own)
 * and by cause (what it is about; one raised on a lot because its run left the window is the run's).
 */
export function nonconformanceCounts(
  rows: ReadonlyArray<{
    subjectType: 'heat' | 'bar-piece' | 'lot' | 'process-run';
    source?: 'raised' | 'run-window';
    supplier: string | null;
  }>,
) {
  const bySupplier = new Map<string, number>();
  const byCause = new Map<NonconformanceCause, number>();
  for (const row of rows) {
    const cause: NonconformanceCause =
      row.subjectType === 'heat' || row.subjectType === 'bar-piece'
        ? 'material'
        : row.subjectType === 'process-run' || row.source === 'run-window'
          ? 'process-run'
          : 'inspection-or-work';
    byCause.set(cause, (byCause.get(cause) ?? 0) + 1);
    const supplier = cause === 'material' && row.supplier ? row.supplier : 'In the plant';
    bySupplier.set(supplier, (bySupplier.get(supplier) ?? 0) + 1);
  }
  const sorted = <K extends string>(map: Map<K, number>) =>
    [...map.entries()].sort(([a, x], [b, y]) => y - x || a.localeCompare(b)).map(([name, count]) => ({ name, count }));
  return {
    bySupplier: sorted(bySupplier),
    byCause: sorted(byCause).map((entry) => ({
      ...entry,
      name: nonconformanceCauseWords[entry.name as NonconformanceCause],
    })),
  };
}

/**
 * First-pass yield by part: over lots that finished their routing, good units out of the last step
 * divided by units started, as a percentage to one decimal. Units scrapped at any step fall out;
 * the product records no rework loop, so a reworked unit counts as good.
 */
export function firstPassYield(
  rows: ReadonlyArray<{ part: string; started: number; good: number }>,
): Array<{ part: string; lots: number; started: number; good: number; percent: number }> {
  const byPart = new Map<string, { lots: number; started: number; good: number }>();
  for (const row of rows) {
    if (row.started <= 0) continue;
    const entry = byPart.get(row.part) ?? { lots: 0, started: 0, good: 0 };
    byPart.set(row.part, { lots: entry.lots + 1, started: entry.started + row.started, good: entry.good + row.good });
  }
  return [...byPart.entries()]
    .sort(([a], [b]) => a.localeCompare(b))
    .map(([part, entry]) => ({ part, ...entry, percent: Math.round((entry.good / entry.started) * 1000) / 10 }));
}
