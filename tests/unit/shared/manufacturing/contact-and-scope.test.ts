import { describe, expect, it } from 'vitest';
import { familiesOutsideScope, outsideScopeMessage } from '@shared/domain/manufacturing/method-scope';
import { processMethod, processMethods } from '@shared/domain/manufacturing/process-methods';
import { checkRunWindow, windowForRun } from '@shared/domain/manufacturing/run-window';

const cleaningMethod = processMethod('KIW-CLEAN-AQ')!;
const clean = (endotoxin: string) => ({
  detergent: 'D-1',
  detergentConcentration: '2',
  washTemperature: '55',
  washTime: '15',
  rinseTemperature: '30',
  rinseTime: '6',
  rinseConductivity: '1.1',
  toc: '150',
  endotoxin,
});
const endotoxinItem = (check: ReturnType<typeof checkRunWindow>) =>
  check.items.find((item) => item.key === 'endotoxin')!;

describe('endotoxin limits follow where the device touches the body', () => {
  // Source: FDA guidance "Pyrogen and Endotoxins Testing: Q&A" (2012) with USP <161>, as reproduced by Nelson Labs:
  // 20 EU/device (0.5 EU/mL × 40 mL) generally and for cardiovascular/lymphatic contact; 2.15 EU/device (0.06 EU/mL ×
  // 40 mL) for cerebrospinal fluid.
  it('when a device touches blood or tissue, then 20 EU/device passes and 20.01 does not', () => {
    expect(endotoxinItem(checkRunWindow(cleaningMethod, clean('20'), ['general-tissue'])).verdict).toBe('in-window');
    expect(endotoxinItem(checkRunWindow(cleaningMethod, clean('20.01'), ['general-tissue']))).toMatchObject({
      verdict: 'out-of-window',
      why: '20.01 EU/device is above the maximum 20 EU/device',
    });
  });

  it(
    'when a device touches cerebrospinal fluid, then 2.15 EU/device passes, and 2.16 or the general 4 EU/device ' +
      'does not',
    () => {
      expect(endotoxinItem(checkRunWindow(cleaningMethod, clean('2.15'), ['cerebrospinal-fluid'])).verdict).toBe(
        'in-window',
      );
      expect(endotoxinItem(checkRunWindow(cleaningMethod, clean('2.16'), ['cerebrospinal-fluid'])).verdict).toBe(
        'out-of-window',
      );
      const four = endotoxinItem(checkRunWindow(cleaningMethod, clean('4'), ['cerebrospinal-fluid']));
      expect(four).toMatchObject({
        verdict: 'out-of-window',
        window: '≤ 2.15 EU/device (cerebrospinal fluid contact)',
      });
    },
  );

  it('when a run holds lots of both categories, then the strictest limit applies to the whole run', () => {
    expect(
      endotoxinItem(checkRunWindow(cleaningMethod, clean('3'), ['general-tissue', 'cerebrospinal-fluid'])).verdict,
    ).toBe('out-of-window');
    const endotoxin = cleaningMethod.parameters.find((parameter) => parameter.key === 'endotoxin')!;
    expect(windowForRun(endotoxin, ['general-tissue', 'cerebrospinal-fluid'])).toMatchObject({
      max: '2.15',
      appliesTo: 'cerebrospinal-fluid',
    });
    expect(windowForRun(endotoxin, ['general-tissue'])).toMatchObject({ max: '20', appliesTo: 'general-tissue' });
  });

  it('when no lot is known yet, then the run is judged against the strictest limit, never the looser one', () => {
    expect(endotoxinItem(checkRunWindow(cleaningMethod, clean('4'))).verdict).toBe('out-of-window');
  });
});

describe('a process method is used only within its material scope', () => {
  const a967 = processMethods.filter((method) => method.id.startsWith('A967'));

  it(
    'when a titanium part goes to an A967 method, then it is outside the scope (A967 scope: stainless steel ' +
      'parts)',
    () => {
      for (const method of a967) {
        expect(familiesOutsideScope(method, ['titanium-alloy'], [])).toEqual(['titanium-alloy']);
        expect(familiesOutsideScope(method, ['titanium-unalloyed', 'stainless-steel'], [])).toEqual([
          'titanium-unalloyed',
        ]);
        expect(familiesOutsideScope(method, ['stainless-steel'], [])).toEqual([]);
      }
    },
  );

  it(
    'when the part is titanium, cobalt-chromium or stainless, then F86 nitric covers it; nickel-titanium it ' +
      'does not (F86 3.1: iron-, cobalt-, titanium- and tantalum-based implants)',
    () => {
      const f86 = processMethod('F86-NITRIC')!;
      expect(
        familiesOutsideScope(f86, ['titanium-alloy', 'titanium-unalloyed', 'stainless-steel', 'cobalt-chromium'], []),
      ).toEqual([]);
      expect(familiesOutsideScope(f86, ['nickel-titanium'], [])).toEqual(['nickel-titanium']);
    },
  );

  it(
    'when the firm has validated a method for the material, then it is covered; a validation of another method ' +
      'or material is not',
    () => {
      const citric = processMethod('A967-CITRIC')!;
      expect(
        familiesOutsideScope(
          citric,
          ['titanium-alloy'],
          [{ methodId: 'A967-CITRIC', family: 'titanium-alloy', reference: 'VR-1' }],
        ),
      ).toEqual([]);
      expect(
        familiesOutsideScope(
          citric,
          ['titanium-alloy'],
          [{ methodId: 'A967-NITRIC-2', family: 'titanium-alloy', reference: 'VR-1' }],
        ),
      ).toEqual(['titanium-alloy']);
      expect(
        familiesOutsideScope(
          citric,
          ['titanium-unalloyed'],
          [{ methodId: 'A967-CITRIC', family: 'titanium-alloy', reference: 'VR-1' }],
        ),
      ).toEqual(['titanium-unalloyed']);
      expect(outsideScopeMessage(citric, ['titanium-unalloyed'], 'Lot T1')).toBe(
        "Lot T1 is unalloyed titanium; A967-CITRIC's scope covers stainless steel. Use a method whose scope " +
          "covers it, or have QA record the firm's own validation of A967-CITRIC for unalloyed titanium.",
      );
    },
  );

  it('when any method is shipped, then it states the materials its scope covers and the source', () => {
    for (const method of processMethods) {
      expect(method.materialScope.families.length).toBeGreaterThan(0);
      expect(method.materialScope.source.length).toBeGreaterThan(10);
    }
  });
});
