/**
 * An invented mill whose certificates trip the certificate screening: over ten months its ASTM
 * F67 grade 4 bar reports oxygen at 0.39 or 0.40 wt % (the limit is 0.40) eleven times, and never
 * at 0.37 or 0.38, while its other heats sit near 0.30. Its heats wait for disposition.
 */
import { generator, type DemoHeat } from './demo-heat-history';

export const bunchingMill = { name: 'Brannock Alloy Works', country: 'Poland', approval: 'conditional' as const };

export function bunchingMillHeats(mill: number): DemoHeat[] {
  const random = generator(4711);
  const oxygen = [
    '0.29',
    '0.31',
    '0.39',
    '0.40',
    '0.28',
    '0.39',
    '0.40',
    '0.39',
    '0.32',
    '0.40',
    '0.39',
    '0.40',
    '0.39',
    '0.30',
    '0.40',
    '0.39',
  ];
  return oxygen.map((o, index) => ({
    heatNumber: `BAW-${7710 + index * 13}`,
    mill,
    specId: 'ASTM F67',
    grade: '4',
    sizeMm: '12.7',
    daysAgo: 300 - index * 20,
    chemistry: {
      N: '0.01',
      C: '0.02',
      H: (0.003 + random() * 0.002).toFixed(4),
      Fe: (0.22 + random() * 0.1).toFixed(2),
      O: o,
    },
    mechanical: {
      utsMPa: String(Math.round(640 + 20 * random())),
      ysMPa: String(Math.round(520 + 20 * random())),
      elongationPct: String(17 + Math.floor(random() * 4)),
      reductionOfAreaPct: '32',
    },
  }));
}
