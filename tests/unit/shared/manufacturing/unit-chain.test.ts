import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  mergeProblem,
  splitProblem,
  unitChain,
  type Outflow,
  type RecordedStep,
} from '@shared/domain/manufacturing/unit-chain';

// Unit bookkeeping along a routing (common practice for device history records, no published source).
describe('the unit chain of a lot', () => {
  const steps: RecordedStep[] = [
    { stepNo: 10, name: 'Turn', qtyIn: 40, qtyGood: 38, qtyScrap: 2 },
    { stepNo: 20, name: 'Mill', qtyIn: 28, qtyGood: 28, qtyScrap: 0 },
  ];
  it('when 10 units are split off after step 10, then 28 entering step 20 is consistent and 28 remain', () => {
    const chain = unitChain({ qty: null, afterStep: 0 }, steps, [{ afterStep: 10, qty: 10, toLot: 'L-A' }]);
    expect(chain).toMatchObject({ consistent: true, started: 40, scrapped: 2, movedOut: 10, onHand: 28 });
  });
  it('when units vanish between steps, then the step says how many were expected', () => {
    const chain = unitChain({ qty: null, afterStep: 0 }, steps, []);
    expect(chain.consistent).toBe(false);
    expect(chain.items[1]).toMatchObject({
      verdict: 'discrepancy',
      expectedIn: 38,
      why: '28 entered but 38 were passed on',
    });
  });
  it('when a step does not account for what entered it, then that is a discrepancy too', () => {
    const chain = unitChain(
      { qty: 40, afterStep: 0 },
      [{ stepNo: 10, name: 'Turn', qtyIn: 40, qtyGood: 37, qtyScrap: 2 }],
      [],
    );
    expect(chain.items[0]?.why).toBe('40 in but 37 good + 2 scrap = 39');
  });
  it('when a split or merge is asked for, then impossible quantities and mismatched lots are refused', () => {
    expect(splitProblem(10, [6, 5])).toBe('The lot holds 10 units; 11 cannot be split off');
    expect(splitProblem(10, [0])).toBe('Each split quantity is a whole number of at least 1');
    const lot = { lotNumber: 'A', partId: 1, lastStep: 20, onHand: 5, blocked: null };
    expect(mergeProblem([lot, { ...lot, lotNumber: 'B', lastStep: 30 }])).toBe(
      'Lots can be merged only at the same step of the routing',
    );
    expect(mergeProblem([lot, { ...lot, lotNumber: 'B', partId: 2 }])).toBe('Only lots of the same part can be merged');
    expect(mergeProblem([lot, { ...lot, lotNumber: 'B' }])).toBeNull();
  });
});

interface ModelLot {
  start: number | null;
  afterStep: number;
  steps: RecordedStep[];
  outflows: Outflow[];
}

const routing = [10, 20, 30, 40, 50, 60];
const operation = fc.oneof(
  fc.record({ kind: fc.constant('step' as const), lot: fc.nat(30), scrap: fc.nat(6) }),
  fc.record({
    kind: fc.constant('split' as const),
    lot: fc.nat(30),
    quantities: fc.array(fc.integer({ min: 0, max: 40 }), { minLength: 1, maxLength: 3 }),
  }),
  fc.record({ kind: fc.constant('merge' as const), a: fc.nat(30), b: fc.nat(30) }),
);

describe('conservation of units under random steps, scrap, splits and merges (property)', () => {
  it(
    'when any sequence is applied through the checks, then ' + 'units on hand + scrapped always equal units started',
    () => {
      fc.assert(
        fc.property(
          fc.array(fc.integer({ min: 1, max: 200 }), { minLength: 1, maxLength: 4 }),
          fc.array(operation, { maxLength: 60 }),
          (starts, operations) => {
            const lots: ModelLot[] = starts.map(() => ({ start: null, afterStep: 0, steps: [], outflows: [] }));
            const chainOf = (lot: ModelLot) =>
              unitChain({ qty: lot.start, afterStep: lot.afterStep }, lot.steps, lot.outflows);
            const lastStep = (lot: ModelLot) => Math.max(lot.afterStep, ...lot.steps.map((step) => step.stepNo));
            // Each bar lot starts with its first step's input.
            starts.forEach((qty, index) =>
              lots[index]!.steps.push({ stepNo: 10, name: 's10', qtyIn: qty, qtyGood: qty, qtyScrap: 0 }),
            );
            const total = starts.reduce((sum, qty) => sum + qty, 0);
            for (const op of operations) {
              if (op.kind === 'step') {
                const lot = lots[op.lot % lots.length]!;
                const next = routing.find((stepNo) => stepNo > lastStep(lot));
                const onHand = chainOf(lot).onHand;
                if (next === undefined || onHand === 0) continue;
                const scrap = Math.min(op.scrap, onHand);
                lot.steps.push({
                  stepNo: next,
                  name: `s${next}`,
                  qtyIn: onHand,
                  qtyGood: onHand - scrap,
                  qtyScrap: scrap,
                });
              } else if (op.kind === 'split') {
                const lot = lots[op.lot % lots.length]!;
                const onHand = chainOf(lot).onHand;
                const problem = splitProblem(onHand, op.quantities);
                const sum = op.quantities.reduce((total, qty) => total + qty, 0);
                expect(problem === null).toBe(sum <= onHand && op.quantities.every((qty) => qty >= 1));
                if (problem) continue;
                for (const qty of op.quantities) {
                  lot.outflows.push({ afterStep: lastStep(lot), qty, toLot: `child-${lots.length}` });
                  lots.push({ start: qty, afterStep: lastStep(lot), steps: [], outflows: [] });
                }
              } else {
                const a = lots[op.a % lots.length]!;
                const b = lots[op.b % lots.length]!;
                const candidates = [a, b].map((lot, index) => ({
                  lotNumber: a === b ? 'same' : `lot-${index}`,
                  partId: 1,
                  lastStep: lastStep(lot),
                  onHand: chainOf(lot).onHand,
                  blocked: null,
                }));
                if (mergeProblem(candidates)) continue;
                const merged: ModelLot = {
                  start: candidates[0]!.onHand + candidates[1]!.onHand,
                  afterStep: candidates[0]!.lastStep,
                  steps: [],
                  outflows: [],
                };
                a.outflows.push({ afterStep: candidates[0]!.lastStep, qty: candidates[0]!.onHand, toLot: 'merged' });
                b.outflows.push({ afterStep: candidates[1]!.lastStep, qty: candidates[1]!.onHand, toLot: 'merged' });
                lots.push(merged);
              }
            }
            const chains = lots.map(chainOf);
            for (const chain of chains) {
              expect(chain.consistent).toBe(true);
              expect(chain.onHand).toBeGreaterThanOrEqual(0);
            }
            const onHand = chains.reduce((sum, chain) => sum + chain.onHand, 0);
            const scrapped = chains.reduce((sum, chain) => sum + chain.scrapped, 0);
            expect(onHand + scrapped).toBe(total);
          },
        ),
        { numRuns: 500 },
      );
    },
  );
});
