import { describe, expect, it } from 'vitest';
import { processMethod, processMethods } from '@shared/domain/manufacturing/process-methods';
import { checkRunWindow } from '@shared/domain/manufacturing/run-window';

const nitric2 = processMethod('A967-NITRIC-2')!;
const run = (overrides: Record<string, string> = {}) => ({
  bath: 'T-3',
  acidConcentration: '30',
  temperature: '25',
  immersionTime: '30',
  rinseConductivity: '2.1',
  ...overrides,
});

describe('passivation runs against their method window', () => {
  it('when a Nitric 2 run sits on every bound, then it is in window (bounds inclusive)', () => {
    // Source: ASTM A967 Nitric 2 — 20–45 vol % HNO3, 70–90 °F (21–32 °C), ≥ 30 min (Advance Surface Technologies citing
    // A967-05; 20–45 % also Products Finishing).
    expect(
      checkRunWindow(nitric2, run({ acidConcentration: '20', temperature: '21', immersionTime: '30' })).inWindow,
    ).toBe(true);
    expect(checkRunWindow(nitric2, run({ acidConcentration: '45', temperature: '32' })).inWindow).toBe(true);
  });
  it(
    'when concentration, temperature or time leaves the ' + 'window by any amount, then the run is out and says why',
    () => {
      const weak = checkRunWindow(nitric2, run({ acidConcentration: '19.9' }));
      expect(weak.inWindow).toBe(false);
      expect(weak.items.find((item) => item.key === 'acidConcentration')).toMatchObject({
        verdict: 'out-of-window',
        window: '20–45 vol %',
        why: '19.9 vol % is below the minimum 20 vol %',
      });
      expect(
        checkRunWindow(nitric2, run({ temperature: '32.5' })).items.find((item) => item.key === 'temperature')?.why,
      ).toBe('32.5 °C is above the maximum 32 °C');
      expect(checkRunWindow(nitric2, run({ immersionTime: '29' })).inWindow).toBe(false);
    },
  );
  it('when Nitric 4 is run at Nitric 2 strength, then the concentration is out of its 45–55 vol % window', () => {
    // Source: ASTM A967 Nitric 4 — 45–55 vol %, 120–130 °F (49–54 °C), ≥ 30 min (Advance Surface Technologies citing
    // A967-05).
    const check = checkRunWindow(processMethod('A967-NITRIC-4')!, run({ acidConcentration: '30', temperature: '50' }));
    expect(check.items.filter((item) => item.verdict === 'out-of-window').map((item) => item.key)).toEqual([
      'acidConcentration',
    ]);
  });
  it('when a parameter is missing, then it is listed and the run is not in window', () => {
    const { bath: _bath, ...withoutBath } = run();
    expect(checkRunWindow(nitric2, withoutBath)).toMatchObject({ inWindow: false, missing: ['bath'] });
  });
  it(
    'when the cleaning run’s endotoxin result exceeds 20 EU/device for blood or tissue contact, then it is out ' +
      'of window',
    () => {
      // Source: FDA Q&A guidance and USP <161>, ≤ 20 EU/device (as reproduced by Nelson Labs).
      const cleaning = processMethod('KIW-CLEAN-AQ')!;
      const parameters = {
        detergent: 'D-1 lot 44',
        detergentConcentration: '2',
        washTemperature: '55',
        washTime: '15',
        rinseTemperature: '30',
        rinseTime: '6',
        rinseConductivity: '1.2',
        toc: '120',
        endotoxin: '20',
      };
      expect(checkRunWindow(cleaning, parameters, ['general-tissue']).inWindow).toBe(true);
      expect(checkRunWindow(cleaning, { ...parameters, endotoxin: '20.5' }, ['general-tissue']).inWindow).toBe(false);
    },
  );
  it('when the library is read, then every numeric window names its source and how sure it is', () => {
    for (const method of processMethods) {
      for (const parameter of method.parameters) {
        expect(parameter.source.length, `${method.id} ${parameter.key}`).toBeGreaterThan(10);
        if (!parameter.text) expect(parameter.min ?? parameter.max, `${method.id} ${parameter.key}`).toBeDefined();
      }
    }
    expect(
      processMethod('A967-CITRIC')!.parameters.find((parameter) => parameter.key === 'temperature')?.confidence,
    ).toBe('unconfirmed');
  });
});

describe('temperature and time are judged as published pairings', () => {
  const citric = processMethod('A967-CITRIC')!;
  const citricRun = (temperature: string, immersionTime: string) => ({
    bath: 'C-1',
    acidConcentration: '6',
    temperature,
    immersionTime,
    rinseConductivity: '2',
  });

  it(
    'when a citric run is 6 wt % at 25 °C for 5 minutes, then it is outside window: each value sits in the ' +
      'envelope but no pairing holds (A967 Citric 1–3 pairings, unverified)',
    () => {
      const check = checkRunWindow(citric, citricRun('25', '5'));
      expect(check).toMatchObject({ inWindow: false, pairing: null });
      expect(check.items.find((item) => item.key === 'immersionTime')).toMatchObject({ verdict: 'out-of-window' });
      expect(check.items.find((item) => item.key === 'temperature')?.why).toContain(
        'meets no temperature and time pairing',
      );
    },
  );

  it(
    'when the same bath runs 20 minutes at 25 °C, or 4 ' + 'minutes at 65 °C, then one pairing holds and says which',
    () => {
      expect(checkRunWindow(citric, citricRun('25', '20'))).toMatchObject({ inWindow: true, pairing: 'Citric 3' });
      expect(checkRunWindow(citric, citricRun('65', '4'))).toMatchObject({ inWindow: true, pairing: 'Citric 1' });
      expect(checkRunWindow(citric, citricRun('55', '9'))).toMatchObject({ inWindow: false, pairing: null });
    },
  );

  it(
    'when an F86 nitric run is heated to 50 °C for 20 minutes it is in window, but 20 minutes at room ' +
      'temperature is not (F86 as quoted on finishing.com: room temperature ≥ 30 min, or 120–140 °F ≥ 20 min)',
    () => {
      const f86 = processMethod('F86-NITRIC')!;
      expect(checkRunWindow(f86, run({ temperature: '50', immersionTime: '20' }))).toMatchObject({
        inWindow: true,
        pairing: 'Accelerated (120–140 °F)',
      });
      expect(checkRunWindow(f86, run({ temperature: '22', immersionTime: '20' }))).toMatchObject({
        inWindow: false,
        pairing: null,
      });
      expect(checkRunWindow(f86, run({ temperature: '22', immersionTime: '30' }))).toMatchObject({
        inWindow: true,
        pairing: 'Room temperature',
      });
      expect(checkRunWindow(f86, run({ temperature: '42', immersionTime: '60' }))).toMatchObject({ inWindow: false });
    },
  );
});
