// Certificate screening on constructed supplier histories. The bunching statistic is a caliper
// test (Gerber & Malhotra, 2008): values at or one reporting step inside a limit against those
// in the next two steps, one-sided Binomial(n, ½), flagged below α = 0.001 — strict, so that a
// QA reviewer meets few false findings (with ~20 properties per supplier, ~2 % of honest
// suppliers; Bonferroni). Its false-alarm rate is measured below on simulated honest suppliers.
import { describe, expect, it } from 'vitest';
import {
  bunchingAtLimits,
  decimalsOf,
  matchingResults,
  precisionChanges,
  screenSupplierHistory,
  sharedDocuments,
  type ScreenedHeat,
} from '@shared/domain/materials/certificate-screening';

let serial = 0;
function heat(values: Record<string, string>, extra: Partial<ScreenedHeat> = {}): ScreenedHeat {
  serial += 1;
  return {
    heatId: serial,
    heatNumber: `H${serial}`,
    receivedAt: `2026-01-01T00:00:${String(serial % 60).padStart(2, '0')}Z`,
    values,
    documentHashes: [`doc-${serial}`],
    ...extra,
  };
}

/** Oxygen values (wt %, two decimals) with the given count at each value. */
function oxygenHistory(counts: Record<string, number>): ScreenedHeat[] {
  return Object.entries(counts).flatMap(([value, count]) => Array.from({ length: count }, () => heat({ O: value })));
}

describe('bunching just inside a limit', () => {
  const limits = { O: { max: '0.20' } };
  const honestBody = {
    '0.08': 4,
    '0.09': 7,
    '0.10': 9,
    '0.11': 10,
    '0.12': 8,
    '0.13': 6,
    '0.14': 4,
    '0.15': 2,
    '0.16': 1,
  };

  it(
    'when 16 heats sit at 0.19–0.20 and only 2 at 0.17–0.18 above a body centred at 0.11, then the supplier is ' +
      'flagged (p = 172/2^18 = 6.6e-4 < 0.001)',
    () => {
      const findings = bunchingAtLimits(
        oxygenHistory({ ...honestBody, '0.17': 1, '0.18': 1, '0.19': 7, '0.20': 9 }),
        limits,
      );
      expect(findings).toHaveLength(1);
      expect(findings[0]!.property).toBe('O');
      expect(findings[0]!.heatIds).toHaveLength(16);
      expect(findings[0]!.statistic!.value).toBeCloseTo(172 / 262_144, 10);
      expect(findings[0]!.explanation).toMatch(
        /16 of 69 heats report O at or one reporting step \(0\.01\) inside the max limit 0\.20/,
      );
    },
  );

  it(
    'when the same body has 15 near the limit and 2 in the next steps, then it stays below the evidence needed ' +
      '(p = 154/2^17 = 1.2e-3)',
    () => {
      expect(
        bunchingAtLimits(oxygenHistory({ ...honestBody, '0.17': 1, '0.18': 1, '0.19': 7, '0.20': 8 }), limits),
      ).toEqual([]);
    },
  );

  it('when a supplier’s values thin out toward the limit as a normal process does, then nothing is flagged', () => {
    expect(
      bunchingAtLimits(oxygenHistory({ ...honestBody, '0.17': 3, '0.18': 2, '0.19': 1, '0.20': 1 }), limits),
    ).toEqual([]);
  });

  it(
    'when the process itself runs close to the limit (the other values’ median within four steps), then ' +
      'bunching is not judged',
    () => {
      expect(
        bunchingAtLimits(
          oxygenHistory({ '0.15': 2, '0.16': 5, '0.17': 9, '0.18': 12, '0.19': 14, '0.20': 10 }),
          limits,
        ),
      ).toEqual([]);
    },
  );

  it('judges a minimum limit the same way (elongation bunched at 10–11 % against a minimum of 10 %)', () => {
    const history = [
      ...Array.from({ length: 9 }, () => heat({ elongationPct: '10' })),
      ...Array.from({ length: 8 }, () => heat({ elongationPct: '11' })),
      heat({ elongationPct: '13' }),
      ...['16', '17', '17', '18', '18', '18', '19', '19', '20', '21'].map((value) => heat({ elongationPct: value })),
    ];
    const findings = bunchingAtLimits(history, { elongationPct: { min: '10' } });
    expect(findings.map((finding) => finding.key)).toEqual(['bunched-at-limit:elongationPct:min']);
    // 17 in the near band, 1 in the next two steps: P(Bin(18, ½) ≥ 17) = (18 + 1) / 2^18.
    expect(findings[0]!.statistic!.value).toBeCloseTo(19 / 262_144, 12);
  });

  it(
    'raises false alarms on simulated honest suppliers at about the rate α promises (common practice: check a ' +
      'test’s size by simulation)',
    () => {
      // mulberry32 (a small, well-known 32-bit generator; unverified) and Box–Muller.
      let state = 0x1234abcd;
      const random = () => {
        state = (state + 0x6d2b79f5) | 0;
        let t = Math.imul(state ^ (state >>> 15), 1 | state);
        t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
        return ((t ^ (t >>> 14)) >>> 0) / 4_294_967_296;
      };
      const gaussian = () => Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
      let flagged = 0;
      const suppliers = 2_000;
      for (let supplier = 0; supplier < suppliers; supplier++) {
        // Mean 0.13, sd 0.025: a capable process; values above the limit are rejected, not reported.
        const values = Array.from({ length: 60 }, () => 0.13 + 0.025 * gaussian())
          .map((value) => Math.round(value * 100) / 100)
          .filter((value) => value > 0 && value <= 0.2);
        if (
          bunchingAtLimits(oxygenHistory(Object.fromEntries(countBy(values.map((value) => value.toFixed(2))))), limits)
            .length
        )
          flagged += 1;
      }
      expect(flagged / suppliers).toBeLessThanOrEqual(0.005);
    },
  );
});

function countBy(values: string[]): Map<string, number> {
  const counts = new Map<string, number>();
  for (const value of values) counts.set(value, (counts.get(value) ?? 0) + 1);
  return counts;
}

describe('identical and near-identical results', () => {
  const base = { C: '0.02', Fe: '0.18', H: '0.004', N: '0.01', O: '0.12', utsMPa: '950' };

  it('flags two heats equal in every shared property, and two that differ in exactly one', () => {
    const a = heat(base);
    const b = heat({ ...base });
    const c = heat({ ...base, O: '0.13' });
    const d = heat({ ...base, O: '0.13', Fe: '0.20' });
    const findings = matchingResults([a, b, c, d]);
    expect(
      findings.filter((finding) => finding.kind === 'identical-results').map((finding) => finding.heatIds),
    ).toEqual([[a.heatId, b.heatId]]);
    expect(
      findings
        .filter((finding) => finding.kind === 'near-identical-results')
        .map((finding) => [finding.heatIds, finding.property]),
    ).toEqual([
      [[a.heatId, c.heatId], 'O'],
      [[b.heatId, c.heatId], 'O'],
      [[c.heatId, d.heatId], 'Fe'],
    ]);
  });

  it('compares values as numbers (0.10 equals 0.1) and needs five shared properties', () => {
    expect(
      matchingResults([heat({ ...base, O: '0.10' }), heat({ ...base, O: '0.1' })]).map((finding) => finding.kind),
    ).toEqual(['identical-results']);
    expect(
      matchingResults([heat({ C: '0.02', Fe: '0.18', O: '0.12' }), heat({ C: '0.02', Fe: '0.18', O: '0.12' })]),
    ).toEqual([]);
  });
});

describe('one document for two heats', () => {
  it('flags every heat that carries the same document hash', () => {
    const a = heat({ O: '0.1' }, { documentHashes: ['abc123', 'x'] });
    const b = heat({ O: '0.1' }, { documentHashes: ['abc123'] });
    const c = heat({ O: '0.1' }, { documentHashes: ['y'] });
    const findings = sharedDocuments([a, b, c]);
    expect(findings).toHaveLength(1);
    expect(findings[0]!.heatIds).toEqual([a.heatId, b.heatId]);
    expect(findings[0]!.key).toBe('same-document:abc123');
  });
});

describe('a sudden change of reported precision', () => {
  const usual = (o: string) => heat({ C: '0.02', Fe: '0.18', N: '0.01', O: o, H: '0.004' });

  it(
    'flags a heat whose decimals differ from the previous five in at least two properties and half of those ' +
      'compared',
    () => {
      const history = [usual('0.11'), usual('0.12'), usual('0.10'), usual('0.12'), usual('0.11')];
      const odd = heat({ C: '0.021', Fe: '0.183', N: '0.01', O: '0.117', H: '0.004' });
      const findings = precisionChanges([...history, odd]);
      expect(findings.map((finding) => finding.heatIds)).toEqual([[odd.heatId]]);
      expect(findings[0]!.explanation).toMatch(
        /C 0\.021 \(usually 2 decimals\); Fe 0\.183 \(usually 2 decimals\); O 0\.117 \(usually 2 decimals\)/,
      );
    },
  );

  it('lets one property change alone, and judges nothing before five earlier heats exist', () => {
    const history = [usual('0.11'), usual('0.12'), usual('0.10'), usual('0.12'), usual('0.11')];
    expect(precisionChanges([...history, heat({ C: '0.02', Fe: '0.18', N: '0.01', O: '0.117', H: '0.004' })])).toEqual(
      [],
    );
    expect(
      precisionChanges([usual('0.11'), heat({ C: '0.021', Fe: '0.183', N: '0.01', O: '0.117', H: '0.004' })]),
    ).toEqual([]);
  });

  it('counts decimals as written', () => {
    expect(decimalsOf('0.20')).toBe(2);
    expect(decimalsOf('950')).toBe(0);
    expect(decimalsOf('-0.0040')).toBe(4);
    expect(decimalsOf('12.')).toBe(0);
  });
});

describe('the whole screening', () => {
  it('orders the history by receipt and returns every kind of finding with a stable key', () => {
    const findings = screenSupplierHistory(
      [heat({ O: '0.1' }, { documentHashes: ['same'] }), heat({ O: '0.1' }, { documentHashes: ['same'] })],
      { O: { max: '0.20' } },
    );
    expect(findings.map((finding) => finding.key)).toEqual(['same-document:same']);
  });
});
