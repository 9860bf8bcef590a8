import { describe, expect, it } from 'vitest';
import { releaseReadiness, type ReadinessFacts } from '@shared/domain/release/readiness';

// The checklist is the product's own rule set (common practice for device history record review, no published source).
const ready: ReadinessFacts = {
  lot: { id: 7, lotNumber: 'CS260001', onHand: 40 },
  heats: [{ id: 3, heatNumber: 'NV-25-0214', status: 'accepted' }],
  routing: [
    { stepNo: 10, name: 'Turn', kind: 'machining', recordedOn: 'CS260001' },
    { stepNo: 20, name: 'Inspect', kind: 'inspection', recordedOn: 'CS260001' },
  ],
  runs: [{ id: 4, runNumber: 'PV-2026-0001', inWindow: true, openNonconformances: 0 }],
  inspections: [{ stepNo: 20, name: 'Inspect', verdict: 'accept' }],
  unitsConsistent: true,
  unitProblems: [],
  material: [{ lotId: 7, lotNumber: 'CS260001', verdict: 'reconciled', why: '…' }],
  openNonconformances: [],
  holds: [],
  heldMaterial: [],
  labels: { printed: 42, voided: 2 },
};
const failing = (facts: Partial<ReadinessFacts>) =>
  releaseReadiness({ ...ready, ...facts })
    .items.filter((item) => item.verdict === 'fail')
    .map((item) => [item.key, item.why]);

describe('release readiness', () => {
  it('when every item holds, then the lot is ready and each item says why', () => {
    const result = releaseReadiness(ready);
    expect(result.ready).toBe(true);
    expect(result.items.map((item) => item.key)).toEqual([
      'heats',
      'routing',
      'runs',
      'inspections',
      'units',
      'material',
      'held-material',
      'nonconformances',
      'holds',
      'labels',
    ]);
    expect(result.items.find((item) => item.key === 'labels')?.why).toBe('40 labels for 40 units');
  });
  it('when exactly one item fails, then only that item fails, with its reason', () => {
    expect(failing({ heats: [{ id: 3, heatNumber: 'NV-25-0214', status: 'quarantined' }] })).toEqual([
      ['heats', 'heat NV-25-0214 is quarantined'],
    ]);
    expect(failing({ routing: [ready.routing[0]!, { ...ready.routing[1]!, recordedOn: null }] })).toEqual([
      ['routing', 'step 20 Inspect is not recorded'],
    ]);
    expect(failing({ runs: [{ id: 4, runNumber: 'PV-2026-0001', inWindow: false, openNonconformances: 1 }] })).toEqual([
      ['runs', 'run PV-2026-0001 was outside its window and its nonconformance is not closed'],
    ]);
    expect(failing({ inspections: [{ stepNo: 20, name: 'Inspect', verdict: 'reject' }] })).toEqual([
      ['inspections', 'step 20 Inspect: reject'],
    ]);
    expect(failing({ unitsConsistent: false, unitProblems: ['step 20: 38 entered but 40 were passed on'] })).toEqual([
      ['units', 'step 20: 38 entered but 40 were passed on'],
    ]);
    expect(
      failing({ material: [{ lotId: 7, lotNumber: 'CS260001', verdict: 'discrepancy', why: '200 mm unaccounted' }] }),
    ).toEqual([['material', 'lot CS260001: 200 mm unaccounted']]);
    expect(failing({ openNonconformances: [{ id: 9, ncNumber: 'NC-2026-0009', status: 'dispositioned' }] })).toEqual([
      ['nonconformances', 'NC-2026-0009 is dispositioned'],
    ]);
    expect(
      failing({
        heldMaterial: [
          {
            tag: 'NV-0214-03',
            reasons: [
              'nonconformance NC-2026-0011 on the bar piece is open',
              'recall investigation RC-2026-002 is open (heat NV-25-0214)',
            ],
          },
        ],
      }),
    ).toEqual([
      [
        'held-material',
        'bar NV-0214-03: nonconformance NC-2026-0011 on the bar piece is open; bar NV-0214-03: recall ' +
          'investigation RC-2026-002 is open (heat NV-25-0214)',
      ],
    ]);
    expect(failing({ holds: [{ id: 1, reference: 'recall RC-2026-001' }] })).toEqual([
      ['holds', 'on hold by recall RC-2026-001'],
    ]);
    expect(failing({ labels: { printed: 40, voided: 1 } })).toEqual([
      ['labels', '39 labels printed (net of voided) for 40 units'],
    ]);
  });
  it('when a run left its window but its nonconformance is closed, then the run item passes and says so', () => {
    const result = releaseReadiness({
      ...ready,
      runs: [{ id: 4, runNumber: 'PV-2026-0001', inWindow: false, openNonconformances: 0 }],
    });
    expect(result.items.find((item) => item.key === 'runs')).toMatchObject({
      verdict: 'pass',
      why: '1 run(s) in window, except PV-2026-0001, whose nonconformances are closed',
    });
  });
});
