/**
 * Two years of invented heats for the demo, so that trends, capability and run rules have
 * something to show. Values come from a fixed-seed generator: the same history every time.
 */

export interface DemoHeat {
  heatNumber: string;
  mill: number;
  specId: string;
  grade?: string;
  sizeMm: string;
  /** Days before the seeding day on which the heat arrived. */
  daysAgo: number;
  chemistry: Record<string, string>;
  mechanical: Record<string, string>;
}

/** mulberry32: a small, well-known 32-bit generator; good enough for invented demo values. */
export function generator(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function normal(random: () => number): number {
  const u = Math.max(random(), 1e-9);
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * random());
}

const around = (random: () => number, mean: number, sigma: number, decimals: number, low: number, high: number) =>
  Math.min(high, Math.max(low, mean + sigma * normal(random))).toFixed(decimals);

interface Stream {
  mill: number;
  /** The mill's own heat numbering. */
  number: (index: number, daysAgo: number) => string;
  count: number;
  make: (random: () => number) => Pick<DemoHeat, 'specId' | 'grade' | 'sizeMm' | 'chemistry' | 'mechanical'>;
}

const streams: Stream[] = [
  {
    mill: 0,
    number: (index, daysAgo) => `NV-${daysAgo > 365 ? 24 : 25}-${String(400 + index * 37).padStart(4, '0')}`,
    count: 16,
    make: (r) => ({
      specId: 'ASTM F136',
      sizeMm: ['25.4', '19.05', '31.75'][Math.floor(r() * 3)]!,
      chemistry: {
        Al: around(r, 6.05, 0.12, 2, 5.6, 6.4),
        V: around(r, 4.0, 0.1, 2, 3.6, 4.4),
        Fe: around(r, 0.16, 0.02, 2, 0.08, 0.22),
        O: around(r, 0.105, 0.007, 2, 0.07, 0.12),
        C: '0.02',
        N: around(r, 0.012, 0.003, 3, 0.004, 0.03),
        H: around(r, 0.0045, 0.0008, 4, 0.002, 0.0075),
      },
      mechanical: (() => {
        const uts = Math.round(950 + 12 * normal(r));
        return {
          utsMPa: String(uts),
          ysMPa: String(uts - 70 - Math.round(8 * r())),
          elongationPct: String(13 + Math.floor(r() * 4)),
          reductionOfAreaPct: String(38 + Math.floor(r() * 8)),
        };
      })(),
    }),
  },
  {
    mill: 1,
    number: (index) => `CS-${7000 + index * 7}`,
    count: 10,
    make: (r) => ({
      specId: 'ASTM F136',
      sizeMm: '25.4',
      chemistry: {
        Al: around(r, 6.0, 0.1, 2, 5.6, 6.4),
        V: around(r, 4.05, 0.1, 2, 3.6, 4.4),
        Fe: around(r, 0.19, 0.015, 2, 0.1, 0.24),
        O: around(r, 0.11, 0.006, 2, 0.08, 0.12),
        C: '0.02',
        N: '0.01',
        H: around(r, 0.0035, 0.0006, 4, 0.002, 0.0065),
      },
      mechanical: (() => {
        const uts = Math.round(935 + 8 * normal(r));
        return { utsMPa: String(uts), ysMPa: String(uts - 68), elongationPct: '15', reductionOfAreaPct: '40' };
      })(),
    }),
  },
  {
    mill: 2,
    number: (index) => `OB-${54000 + index * 41}`,
    count: 6,
    make: (r) => ({
      specId: 'ASTM F67',
      grade: '4',
      sizeMm: '12.7',
      chemistry: {
        N: '0.01',
        C: '0.01',
        H: around(r, 0.004, 0.0008, 3, 0.002, 0.012),
        Fe: around(r, 0.3, 0.03, 2, 0.15, 0.45),
        O: around(r, 0.33, 0.02, 2, 0.25, 0.38),
      },
      mechanical: {
        utsMPa: String(Math.round(630 + 15 * normal(r))),
        ysMPa: String(Math.round(520 + 12 * normal(r))),
        elongationPct: '19',
        reductionOfAreaPct: '35',
      },
    }),
  },
  {
    mill: 1,
    number: (index) => `CS-S${3100 + index * 5}`,
    count: 4,
    make: (r) => ({
      specId: 'ASTM F138',
      sizeMm: '16',
      chemistry: {
        C: around(r, 0.02, 0.003, 3, 0.01, 0.028),
        Mn: '1.65',
        P: '0.017',
        S: '0.001',
        Si: '0.38',
        Cr: around(r, 17.6, 0.2, 2, 17.2, 18.4),
        Ni: around(r, 14.4, 0.2, 2, 14.0, 14.9),
        Mo: around(r, 2.65, 0.05, 2, 2.55, 2.9),
        N: '0.06',
        Cu: '0.10',
      },
      mechanical: {
        utsMPa: String(Math.round(545 + 10 * normal(r))),
        ysMPa: String(Math.round(255 + 8 * normal(r))),
        elongationPct: '44',
      },
    }),
  },
];

/** The historic heats, oldest first, spread over the 730 days before the recent demo heats. */
export function demoHeatHistory(): DemoHeat[] {
  const random = generator(20241);
  const heats: DemoHeat[] = [];
  for (const stream of streams) {
    for (let index = 0; index < stream.count; index++) {
      const daysAgo = Math.round(730 - (index * 640) / stream.count - random() * 20);
      heats.push({ heatNumber: stream.number(index, daysAgo), mill: stream.mill, daysAgo, ...stream.make(random) });
    }
  }
  return heats.sort((a, b) => b.daysAgo - a.daysAgo);
}
