import type { ElementLimit, MechanicalSet, Specification, ValueSource } from '../specification';

// Values and tags from the project's domain reference sheet (§1.1, §1.3, §1.4). "secondary" means
// read on a supplier or trade page that reproduces the standard; "unconfirmed" means from memory.
const f67Source: ValueSource = { reference: 'ASTM F67 Table 1 as reproduced by bktitanium, titanium.net and gsalloy supplier pages', confidence: 'secondary' };
const f67Mechanical: ValueSource = { reference: 'ASTM F67 annealed bar minima as reproduced by bktitanium, titanium.net and gsalloy', confidence: 'secondary' };
const f136Source: ValueSource = { reference: 'ASTM F136 Table 1 as reproduced by bktitanium (edition not stated; H 0.012 vs 0.0125 and N 0.05 vs 0.08 differ between sources)', confidence: 'secondary' };
const f136Mechanical: ValueSource = { reference: 'ASTM F136 annealed bar minima by size as reproduced by bktitanium; headline values also in Materials 2021;14(3):658 Table 4', confidence: 'secondary' };
const f1295Weak: ValueSource = { reference: 'ASTM F1295 composition from a public data file citing Wikipedia (weak)', confidence: 'secondary' };
const fromMemory: ValueSource = { reference: 'from memory, not confirmed in any source consulted', confidence: 'unconfirmed' };

function f67Chemistry(n: string, fe: string, o: string, feTolerance: string, oTolerance: string): ElementLimit[] {
  return [
    { element: 'N', max: n, source: f67Source, tolerance: { over: '0.02' } },
    { element: 'C', max: '0.08', source: f67Source, tolerance: { over: '0.02' } },
    { element: 'H', max: '0.015', source: f67Source, tolerance: { over: '0.0020' } },
    { element: 'Fe', max: fe, source: f67Source, tolerance: { over: feTolerance } },
    { element: 'O', max: o, source: f67Source, tolerance: { over: oTolerance } },
  ];
}

function f67Bar(uts: string, ys: string, elongation: string, reduction: string): MechanicalSet[] {
  return [
    {
      forms: ['bar', 'billet', 'forging'],
      condition: 'annealed',
      limits: [
        { property: 'utsMPa', min: uts },
        { property: 'ysMPa', min: ys },
        { property: 'elongationPct', min: elongation },
        { property: 'reductionOfAreaPct', min: reduction },
      ],
      source: f67Mechanical,
    },
  ];
}

export const astmF67: Specification = {
  id: 'ASTM F67',
  title: 'Unalloyed titanium for surgical implant applications',
  family: 'titanium-unalloyed',
  revision: 'L1',
  edition: 'F67-13 scope; table values from secondary sources',
  notes: ['Mechanical minima here are for annealed bar, billet and forgings; sheet, strip, plate and wire have their own tables (not shipped).'],
  grades: [
    { grade: '1', uns: 'R50250', chemistry: f67Chemistry('0.03', '0.20', '0.18', '0.10', '0.02'), weightedSums: [], mechanical: f67Bar('240', '170', '24', '30') },
    { grade: '2', uns: 'R50400', chemistry: f67Chemistry('0.03', '0.30', '0.25', '0.15', '0.03'), weightedSums: [], mechanical: f67Bar('345', '275', '20', '30') },
    { grade: '3', uns: 'R50550', chemistry: f67Chemistry('0.05', '0.30', '0.35', '0.15', '0.03'), weightedSums: [], mechanical: f67Bar('450', '380', '18', '30') },
    { grade: '4', uns: 'R50700', chemistry: f67Chemistry('0.05', '0.50', '0.40', '0.15', '0.03'), weightedSums: [], mechanical: f67Bar('550', '483', '15', '25') },
  ],
};

const f136Bar = (size: MechanicalSet['size'], uts: string, ys: string, elongation: string, reduction: string | null): MechanicalSet => ({
  forms: ['bar', 'wire', 'forging'],
  condition: 'annealed',
  size,
  limits: [
    { property: 'utsMPa', min: uts },
    { property: 'ysMPa', min: ys },
    { property: 'elongationPct', min: elongation },
    ...(reduction ? [{ property: 'reductionOfAreaPct' as const, min: reduction }] : []),
  ],
  source: f136Mechanical,
});

export const astmF136: Specification = {
  id: 'ASTM F136',
  title: 'Wrought titanium-6aluminum-4vanadium ELI alloy for surgical implant applications (UNS R56401)',
  family: 'titanium-alloy',
  revision: 'L1',
  edition: 'not stated by the source',
  notes: ['Beta transus is measured and reported per heat; it is not computed from composition.'],
  grades: [
    {
      grade: null,
      uns: 'R56401',
      chemistry: [
        { element: 'Al', min: '5.50', max: '6.50', source: f136Source, tolerance: { under: '0.40', over: '0.40' } },
        { element: 'V', min: '3.5', max: '4.5', source: f136Source, tolerance: { under: '0.15', over: '0.15' } },
        { element: 'Fe', max: '0.25', source: f136Source, tolerance: { over: '0.10' } },
        { element: 'O', max: '0.13', source: f136Source, tolerance: { over: '0.02' } },
        { element: 'C', max: '0.08', source: f136Source, tolerance: { over: '0.02' } },
        { element: 'N', max: '0.05', source: f136Source, tolerance: { over: '0.02' } },
        { element: 'H', max: '0.012', source: f136Source, tolerance: { over: '0.0020' } },
      ],
      weightedSums: [],
      mechanical: [
        f136Bar({ fromMm: '0', fromInclusive: true, toMm: '4.75', toInclusive: false }, '860', '795', '10', null),
        f136Bar({ fromMm: '4.75', fromInclusive: true, toMm: '44.45', toInclusive: true }, '860', '795', '10', '25'),
        f136Bar({ fromMm: '44.45', fromInclusive: false, toMm: '63.50', toInclusive: true }, '825', '760', '8', '20'),
        f136Bar({ fromMm: '63.50', fromInclusive: false, toMm: '101.60', toInclusive: true }, '825', '760', '8', '15'),
      ],
    },
  ],
};

export const astmF1295: Specification = {
  id: 'ASTM F1295',
  title: 'Wrought titanium-6aluminum-7niobium alloy for surgical implant applications (UNS R56700)',
  family: 'titanium-alloy',
  revision: 'L1',
  edition: 'not stated by the source',
  notes: ['Composition limits are weakly sourced and Ta and the mechanical minima are unconfirmed: verify every value before use.'],
  grades: [
    {
      grade: null,
      uns: 'R56700',
      chemistry: [
        { element: 'Al', min: '5.5', max: '6.5', source: f1295Weak },
        { element: 'Nb', min: '6.5', max: '7.5', source: f1295Weak },
        { element: 'Ta', max: '0.50', source: fromMemory },
        { element: 'Fe', max: '0.25', source: f1295Weak },
        { element: 'O', max: '0.20', source: f1295Weak },
        { element: 'C', max: '0.08', source: f1295Weak },
        { element: 'N', max: '0.05', source: f1295Weak },
        { element: 'H', max: '0.009', source: f1295Weak },
      ],
      weightedSums: [],
      mechanical: [
        {
          forms: ['bar'],
          condition: 'annealed',
          limits: [
            { property: 'utsMPa', min: '900' },
            { property: 'ysMPa', min: '800' },
            { property: 'elongationPct', min: '10' },
            { property: 'reductionOfAreaPct', min: '25' },
          ],
          source: fromMemory,
        },
      ],
    },
  ],
};
