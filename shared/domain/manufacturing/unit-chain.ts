/**
 * Unit counts along a lot's routing. Every step must account for what entered it (in = good +
 * scrap), and what enters a step must be what the previous step passed as good, less the units
 * split or merged away in between. Common practice for device history records, no published
 * source for the arithmetic itself.
 */
export interface RecordedStep {
  stepNo: number;
  name: string;
  qtyIn: number;
  qtyGood: number;
  qtyScrap: number;
}

/** Units leaving the lot to another lot (a split or a merge) after a given step. */
export interface Outflow {
  afterStep: number;
  qty: number;
  toLot: string;
}

export interface ChainItem {
  stepNo: number;
  name: string;
  expectedIn: number | null;
  qtyIn: number;
  verdict: 'consistent' | 'discrepancy';
  why: string | null;
}

export interface UnitChain {
  consistent: boolean;
  /** Units the lot started with (its first recorded step's input, or what a split or merge gave it). */
  started: number | null;
  scrapped: number;
  movedOut: number;
  /** Units still in the lot after its last recorded step and outflows. */
  onHand: number;
  items: ChainItem[];
}

export function unitChain(
  start: { qty: number | null; afterStep: number },
  steps: RecordedStep[],
  outflows: Outflow[],
): UnitChain {
  const ordered = [...steps].sort((a, b) => a.stepNo - b.stepNo);
  const items: ChainItem[] = [];
  let available: number | null = start.qty;
  let previousStep = start.afterStep;
  const outBetween = (from: number, to: number) =>
    outflows.filter((flow) => flow.afterStep >= from && flow.afterStep < to).reduce((sum, flow) => sum + flow.qty, 0);
  for (const step of ordered) {
    const expected = available === null ? null : available - outBetween(previousStep, step.stepNo);
    const reasons: string[] = [];
    if (step.qtyIn !== step.qtyGood + step.qtyScrap)
      reasons.push(
        `${step.qtyIn} in but ${step.qtyGood} good + ${step.qtyScrap} scrap = ${step.qtyGood + step.qtyScrap}`,
      );
    if (expected !== null && step.qtyIn !== expected) {
      const moved = outBetween(previousStep, step.stepNo);
      reasons.push(
        `${step.qtyIn} entered but ${expected} were passed on${moved ? ` (after ${moved} moved to other lots)` : ''}`,
      );
    }
    items.push({
      stepNo: step.stepNo,
      name: step.name,
      expectedIn: expected,
      qtyIn: step.qtyIn,
      verdict: reasons.length ? 'discrepancy' : 'consistent',
      why: reasons.length ? reasons.join('; ') : null,
    });
    available = step.qtyGood;
    previousStep = step.stepNo;
  }
  const started = start.qty ?? ordered[0]?.qtyIn ?? null;
  const movedOut = outflows.reduce((sum, flow) => sum + flow.qty, 0);
  const scrapped = ordered.reduce((sum, step) => sum + step.qtyScrap, 0);
  const onHand = (available ?? 0) - outBetween(previousStep, Number.MAX_SAFE_INTEGER);
  return {
    consistent: items.every((item) => item.verdict === 'consistent') && onHand >= 0,
    started,
    scrapped,
    movedOut,
    onHand,
    items,
  };
}

/** Why a split of `available` units into the given quantities is not possible, or null. */
export function splitProblem(available: number, quantities: number[]): string | null {
  if (quantities.length < 1) return 'Name at least one quantity to split off';
  if (quantities.some((qty) => !Number.isInteger(qty) || qty < 1))
    return 'Each split quantity is a whole number of at least 1';
  const total = quantities.reduce((sum, qty) => sum + qty, 0);
  if (total > available) return `The lot holds ${available} units; ${total} cannot be split off`;
  return null;
}

export interface MergeCandidate {
  lotNumber: string;
  partId: number;
  lastStep: number;
  onHand: number;
  blocked: string | null;
}

/** Why these lots cannot be merged into one, or null: same part, same point in the routing, units on hand. */
export function mergeProblem(lots: MergeCandidate[]): string | null {
  if (lots.length < 2) return 'A merge joins at least two lots';
  if (new Set(lots.map((lot) => lot.lotNumber)).size !== lots.length) return 'Name each lot once';
  const blocked = lots.find((lot) => lot.blocked);
  if (blocked) return `Lot ${blocked.lotNumber} cannot be merged: ${blocked.blocked}`;
  if (new Set(lots.map((lot) => lot.partId)).size > 1) return 'Only lots of the same part can be merged';
  if (new Set(lots.map((lot) => lot.lastStep)).size > 1)
    return 'Lots can be merged only at the same step of the routing';
  const empty = lots.find((lot) => lot.onHand < 1);
  if (empty) return `Lot ${empty.lotNumber} has no units left`;
  return null;
}
