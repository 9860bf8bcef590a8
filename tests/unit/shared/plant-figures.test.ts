import { describe, expect, it } from 'vitest';
import { firstPassYield, median, nonconformanceCounts, releaseLeadTimes } from '@shared/domain/home/plant-figures';

// Median as NIST/SEMATECH e-Handbook of Statistical Methods §1.3.5.1 defines it (middle value; the
// mean of the two middle values for an even count). The rest is arithmetic worked by hand here.
describe('plant figures', () => {
  it(
    'when a median is taken, then an odd count gives the middle value and an even count the mean of the two ' +
      'middle ones',
    () => {
      expect(median([3, 1, 2])).toBe(2);
      expect(median([4, 1, 3, 2])).toBe(2.5);
      expect(median([])).toBeNull();
    },
  );

  it(
    'when lots are released, then the lead time is grouped by the plant month of release, with the median in ' + 'days',
    () => {
      const rows = [
        { submittedAt: '2026-10-01T08:00:00Z', releasedAt: '2026-10-02T08:00:00Z' }, // 1 day
        { submittedAt: '2026-10-10T08:00:00Z', releasedAt: '2026-10-13T20:00:00Z' }, // 3.5 days
        { submittedAt: '2026-10-20T08:00:00Z', releasedAt: '2026-10-22T08:00:00Z' }, // 2 days
        // Released 23:30 UTC on 31 October is 31 October in London (GMT from 25 October) but 1 November in Berlin.
        { submittedAt: '2026-10-30T23:30:00Z', releasedAt: '2026-10-31T23:30:00Z' }, // 1 day
        // Released before it was submitted: left out.
        { submittedAt: '2026-11-03T08:00:00Z', releasedAt: '2026-11-02T08:00:00Z' },
      ];
      expect(releaseLeadTimes(rows, 'Europe/London')).toEqual([{ month: '2026-10', lots: 4, medianDays: 1.5 }]);
      expect(releaseLeadTimes(rows, 'Europe/Berlin')).toEqual([
        { month: '2026-10', lots: 3, medianDays: 2 },
        { month: '2026-11', lots: 1, medianDays: 1 },
      ]);
    },
  );

  it(
    'when nonconformances are counted, then material ones ' + 'go to their mill and the rest to the plant, by cause',
    () => {
      const counted = nonconformanceCounts([
        { subjectType: 'heat', supplier: 'Nordvik Titanium Mill' },
        { subjectType: 'bar-piece', supplier: 'Nordvik Titanium Mill' },
        { subjectType: 'heat', supplier: 'Oriel Bar & Wire' },
        { subjectType: 'process-run', supplier: null },
        { subjectType: 'lot', supplier: null },
        { subjectType: 'lot', source: 'run-window', supplier: null },
      ]);
      expect(counted.bySupplier).toEqual([
        { name: 'In the plant', count: 3 },
        { name: 'Nordvik Titanium Mill', count: 2 },
        { name: 'Oriel Bar & Wire', count: 1 },
      ]);
      expect(counted.byCause).toEqual([
        { name: 'Material (heat or bar)', count: 3 },
        { name: 'Passivation or cleaning run', count: 2 },
        { name: 'Inspection or work on the lot', count: 1 },
      ]);
    },
  );

  it('when lots finish, then first-pass yield by part is good out of the last step over units started', () => {
    // Part A: (38 + 40) / (40 + 40) = 97.5 %; part B: 27 / 30 = 90 %; a lot never started is left out.
    expect(
      firstPassYield([
        { part: 'A', started: 40, good: 38 },
        { part: 'A', started: 40, good: 40 },
        { part: 'B', started: 30, good: 27 },
        { part: 'B', started: 0, good: 0 },
      ]),
    ).toEqual([
      { part: 'A', lots: 2, started: 80, good: 78, percent: 97.5 },
      { part: 'B', lots: 1, started: 30, good: 27, percent: 90 },
    ]);
  });
});
