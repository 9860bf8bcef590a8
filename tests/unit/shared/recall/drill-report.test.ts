// The drill assessment on a hand-built scenario (invented for this test; the counts are worked by
// hand below). What a complete scope means is common practice, no source: every shipped unit with
// a named consignee, units that balance, a genealogy back to accepted heats with certificates, and
// a scope closed under splits and merges.
import { describe, expect, it } from 'vitest';
import { assessDrill, durationText, type DrillFacts, type DrillLotFacts } from '@shared/domain/recall/drill-report';

const heat = { heatNumber: 'H-1', status: 'accepted', certificates: 1 };
const lot = (lotNumber: string, values: Partial<DrillLotFacts>): DrillLotFacts => ({
  lotNumber,
  status: 'released',
  origin: 'bar',
  parents: [],
  made: 0,
  passedOn: 0,
  released: 0,
  shipped: 0,
  onHand: 0,
  shippedNow: 0,
  sourceHeats: [heat],
  childrenOutsideScope: [],
  ...values,
});

// Lot A (40 started) was split into B (15) and C (25). B released 15 and shipped 10: 6 to
// Clinic North, 4 to Distributor East. C released 24 of 25 (one scrapped) and shipped 24: 20 to
// Distributor East, 4 to Clinic North. D, from the same heat, is still open with 30 started.
// Made: 15 + 25 + 30 = 70 (A passed all its 40 on to B and C: counted there, not twice). Released 39, shipped 34,
// on hand 5. Consignees: Clinic North 6 + 4 = 10, Distributor East 4 + 20 = 24; 10 + 24 = 34.
const scenario = (): DrillFacts => ({
  openedAt: '2026-11-30T09:00:00.000Z',
  closedAt: '2026-11-30T10:47:30.000Z',
  asOf: '2026-12-01T08:00:00.000Z',
  openingTakenAt: '2026-11-30T09:00:00.420Z',
  tracedInMs: 380,
  reruns: 1,
  lotsAddedSinceOpening: [],
  lotsRemovedSinceOpening: [],
  lots: [
    lot('A', { status: 'consumed', made: 40, passedOn: 40 }),
    lot('B', { origin: 'split', parents: ['A'], made: 15, released: 15, shipped: 10, onHand: 5, shippedNow: 10 }),
    lot('C', { origin: 'split', parents: ['A'], made: 25, released: 24, shipped: 24, onHand: 0, shippedNow: 24 }),
    lot('D', { status: 'open', made: 30 }),
  ],
  consignees: [
    { name: 'Clinic North', units: 10 },
    { name: 'Distributor East', units: 24 },
  ],
});

describe('assessing a recall drill', () => {
  it(
    'counts the hand-built scenario: 4 lots, 70 made, 39 released, 34 shipped, 5 on hand, 2 consignees; every ' +
      'check passes',
    () => {
      const assessment = assessDrill(scenario());
      expect(assessment.totals).toEqual({ lots: 4, made: 70, released: 39, shipped: 34, onHand: 5, consignees: 2 });
      expect(assessment.checks.map((check) => [check.id, check.passed])).toEqual([
        ['shipped-units', true],
        ['unit-balance', true],
        ['genealogy', true],
        ['scope-closed', true],
        ['scope-current', true],
      ]);
      expect(assessment.checks[0]!.detail).toBe(
        '34 units shipped, all to named consignees; no lot shipped more than it released',
      );
      expect(assessment.complete).toBe(true);
    },
  );

  it('times the drill: 420 ms to the first scope, 1 h 47 min 30 s to the confirmed scope', () => {
    const { timing } = assessDrill(scenario());
    expect(timing).toEqual({
      toFirstScopeMs: 420,
      tracedInMs: 380,
      toConfirmedScopeMs: 6_450_000,
      elapsedMs: 6_450_000,
      reruns: 1,
      scopeChanged: false,
    });
    expect(durationText(timing.toConfirmedScopeMs!)).toBe('1 h 47 min');
    const open = assessDrill({ ...scenario(), closedAt: null });
    expect(open.timing.toConfirmedScopeMs).toBeNull();
    expect(open.timing.elapsedMs).toBe(23 * 3_600_000);
  });

  it('finds units the consignees do not account for, and a lot that shipped more than it released', () => {
    const facts = scenario();
    facts.consignees[1]!.units = 20;
    facts.lots[2] = { ...facts.lots[2]!, shipped: 26, shippedNow: 26, onHand: -2 };
    const shipped = assessDrill(facts).checks.find((check) => check.id === 'shipped-units')!;
    expect(shipped.passed).toBe(false);
    expect(shipped.offenders).toEqual([
      'C: shipped 26 of 24 released',
      'consignees received 30 units; the lots shipped 36',
    ]);
    expect(assessDrill(facts).checks.find((check) => check.id === 'unit-balance')!.passed).toBe(false);
    expect(assessDrill(facts).complete).toBe(false);
  });

  it(
    'when an open lot holds work in progress, then its units in plant balance; a released lot must hold ' +
      'released − shipped',
    () => {
      const facts = scenario();
      // D is open with 30 started and 28 good after its last step: 28 in plant (WORDS: work in progress counts).
      facts.lots[3] = { ...facts.lots[3]!, onHand: 28 };
      expect(assessDrill(facts).checks.find((check) => check.id === 'unit-balance')!.passed).toBe(true);
      expect(assessDrill(facts).totals.onHand).toBe(33);
      facts.lots[1] = { ...facts.lots[1]!, onHand: 6 };
      expect(assessDrill(facts).checks.find((check) => check.id === 'unit-balance')!.offenders).toEqual([
        'B: 6 in plant ≠ 15 released − 10 shipped',
      ]);
    },
  );

  it(
    'counts a lot that split part of its units off by what it kept, and finds one that released more than it ' + 'kept',
    () => {
      const facts = scenario();
      // D started 30 and split 10 off into E (in the scope): 20 + 10, not 30 + 10.
      facts.lots[3] = { ...facts.lots[3]!, passedOn: 10 };
      facts.lots.push(lot('E', { status: 'open', origin: 'split', parents: ['D'], made: 10 }));
      expect(assessDrill(facts).totals.made).toBe(70);
      facts.lots[3] = { ...facts.lots[3]!, status: 'released', released: 25, onHand: 25 };
      expect(assessDrill(facts).checks.find((check) => check.id === 'unit-balance')!.offenders).toEqual([
        'D: released 25 of 30 started less 10 passed on',
      ]);
    },
  );

  it(
    'finds gaps in the genealogy: a lot without heat, a heat not accepted or without certificate, a split lot ' +
      'without parent',
    () => {
      const facts = scenario();
      facts.lots[3] = { ...facts.lots[3]!, sourceHeats: [] };
      facts.lots[1] = {
        ...facts.lots[1]!,
        parents: [],
        sourceHeats: [{ heatNumber: 'H-2', status: 'quarantined', certificates: 0 }],
      };
      expect(assessDrill(facts).checks.find((check) => check.id === 'genealogy')!.offenders).toEqual([
        'B: heat H-2 is quarantined, not accepted',
        'B: heat H-2 has no certificate',
        'B: split lot with no parent lot',
        'D: no heat of bar recorded',
      ]);
    },
  );

  it('finds lots made from affected lots but missing from the scope, and shipments recorded after the trace', () => {
    const facts = scenario();
    facts.lots[1] = { ...facts.lots[1]!, childrenOutsideScope: ['E'], shippedNow: 13 };
    facts.lotsAddedSinceOpening = ['C'];
    const assessment = assessDrill(facts);
    expect(assessment.checks.find((check) => check.id === 'scope-closed')).toMatchObject({
      passed: false,
      offenders: ['E (from B)'],
      detail: '1 lot made from affected lots but missing from the scope',
    });
    expect(assessment.checks.find((check) => check.id === 'scope-current')!.offenders).toEqual([
      'B: 10 shipped when traced, 13 now',
    ]);
    expect(assessment.timing.scopeChanged).toBe(true);
  });

  it('writes durations as a person reads them', () => {
    expect([850, 20_000, 200_000, 7_500_000, 200_000_000].map(durationText)).toEqual([
      '850 ms',
      '20 s',
      '3 min 20 s',
      '2 h 05 min',
      '2 d 7 h',
    ]);
  });
});
