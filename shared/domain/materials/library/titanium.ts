import type { ElementLimit, MechanicalSet, Specification, ValueSource } from '../specification';

// Values and tags from the project's domain reference sheet (§1.1, §1.3, §1.4). "secondary" means
// read on a supplier or trade page that reproduces the standard; "unconfirmed" (shown as
// "unverified") means no published source consulted gives the value.
const f67Source: ValueSource = {
  reference: 'ASTM F67 Table 1 as reproduced by bktitanium, titanium.net and gsalloy supplier pages',
  confidence: 'secondary',
};
const f67Mechanical: ValueSource = {
  reference:
    'ASTM F67 annealed bar (3.18 mm and over), billet and forging minima as reproduced by bktitanium, ' +
    'titanium.net and gsalloy',
  confidence: 'secondary',
};
const f67Scope: ValueSource = {
  reference: 'ASTM F67-13 scope (normservis): strip, sheet, plate, bar, billet, forging and wire',
  confidence: 'secondary',
};
const f136Source: ValueSource = {
  reference:
    'ASTM F136 Table 1 as reproduced by bktitanium (edition not stated; H 0.012 vs 0.0125 and N 0.05 vs 0.08 ' +
    'differ between sources)',
  confidence: 'secondary',
};
const f136Mechanical: ValueSource = {
  reference:
    'ASTM F136 annealed bar, wire and forging minima by size as reproduced by bktitanium; headline values ' +
    'also in Materials 2021;14(3):658 Table 4',
  confidence: 'secondary',
};
const f1295Weak: ValueSource = {
  reference: 'ASTM F1295 composition from a public data file citing Wikipedia (weak)',
  confidence: 'secondary',
};
const f1295Scope: ValueSource = {
  reference:
    'ASTM F1295-16 scope (ASTM abstract; Document Center): annealed, cold-worked or hot-worked bar, wire, ' +
    'sheet, strip and plate',
  confidence: 'secondary',
};
const unverified: ValueSource = {
  reference: 'unverified: not found in any published source consulted; check your licensed copy',
  confidence: 'unconfirmed',
};

function f67Chemistry(n: string, fe: string, o: string, feTolerance: string, oTolerance: string): ElementLimit[] {
  return [
    { element: 'N', max: n, source: f67Source, tolerance: { over: '0.02' } },
    { element: 'C', max: '0.08', source: f67Source, tolerance: { over: '0.02' } },
    { element: 'H', max: '0.015', source: f67Source, tolerance: { over: '0.0020' } },
    { element: 'Fe', max: fe, source: f67Source, tolerance: { over: feTolerance } },
    { element: 'O', max: o, source: f67Source, tolerance: { over: oTolerance } },
  ];
}

function f67Annealed(uts: string, ys: string, elongation: string, reduction: string): MechanicalSet[] {
  const limits: MechanicalSet['limits'] = [
    { property: 'utsMPa', min: uts },
    { property: 'ysMPa', min: ys },
    { property: 'elongationPct', min: elongation },
    { property: 'reductionOfAreaPct', min: reduction },
  ];
  return [
    // Bar under 3.18 mm (0.125 in.) takes the wire table, which the library does not hold.
    {
      forms: ['bar'],
      condition: 'annealed',
      size: { fromMm: '3.18', fromInclusive: true },
      limits,
      source: f67Mechanical,
    },
    { forms: ['billet', 'forging'], condition: 'annealed', limits, source: f67Mechanical },
  ];
}

export const astmF67: Specification = {
  id: 'ASTM F67',
  title: 'Unalloyed titanium for surgical implant applications',
  family: 'titanium-unalloyed',
  revision: 'L2',
  edition: 'F67-13 scope; table values from secondary sources',
  scope: {
    forms: ['strip', 'sheet', 'plate', 'bar', 'billet', 'forging', 'wire'],
    conditions: ['annealed'],
    source: f67Scope,
  },
  notes: [
    'Mechanical minima here are for annealed bar of 3.18 mm and over, billet and forgings; sheet, strip, ' +
      'plate, wire and thinner bar have their own tables, not in the library: such heats cannot be evaluated ' +
      'until the firm adds them.',
  ],
  grades: [
    {
      grade: '1',
      uns: 'R50250',
      chemistry: f67Chemistry('0.03', '0.20', '0.18', '0.10', '0.02'),
      weightedSums: [],
      mechanical: f67Annealed('240', '170', '24', '30'),
    },
    {
      grade: '2',
      uns: 'R50400',
      chemistry: f67Chemistry('0.03', '0.30', '0.25', '0.15', '0.03'),
      weightedSums: [],
      mechanical: f67Annealed('345', '275', '20', '30'),
    },
    {
      grade: '3',
      uns: 'R50550',
      chemistry: f67Chemistry('0.05', '0.30', '0.35', '0.15', '0.03'),
      weightedSums: [],
      mechanical: f67Annealed('450', '380', '18', '30'),
    },
    {
      grade: '4',
      uns: 'R50700',
      chemistry: f67Chemistry('0.05', '0.50', '0.40', '0.15', '0.03'),
      weightedSums: [],
      mechanical: f67Annealed('550', '483', '15', '25'),
    },
  ],
};

const f136Annealed = (
  size: MechanicalSet['size'],
  uts: string,
  ys: string,
  elongation: string,
  reduction: string | null,
): MechanicalSet => ({
  forms: ['bar', 'wire', 'forging'],
  condition: 'annealed',
  size,
  limits: [
    { property: 'utsMPa', min: uts },
    { property: 'ysMPa', min: ys },
    { property: 'elongationPct', min: elongation },
    ...(reduction ? [{ property: 'reductionOfAreaPct' as const, min: reduction }] : []),
  ],
  ...(reduction
    ? {}
    : {
        notRequired: [
          { property: 'reductionOfAreaPct' as const, why: 'the table gives no reduction of area below 4.75 mm' },
        ],
      }),
  source: f136Mechanical,
});

export const astmF136: Specification = {
  id: 'ASTM F136',
  title: 'Wrought titanium-6aluminum-4vanadium ELI alloy for surgical implant applications (UNS R56401)',
  family: 'titanium-alloy',
  revision: 'L2',
  edition: 'not stated by the source',
  scope: {
    forms: ['bar', 'wire', 'forging'],
    conditions: ['annealed'],
    source: {
      reference: 'the forms and condition of the F136 mechanical table as reproduced by bktitanium',
      confidence: 'secondary',
    },
  },
  notes: [
    'Beta transus is measured and reported per heat; it is not computed from composition.',
    'Only annealed bar, wire and forgings up to 101.60 mm are in the library; other forms and sizes cannot be ' +
      'evaluated until the firm adds them.',
  ],
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
      mechanicalProperties: ['utsMPa', 'ysMPa', 'elongationPct', 'reductionOfAreaPct'],
      mechanical: [
        f136Annealed({ fromMm: '0', fromInclusive: true, toMm: '4.75', toInclusive: false }, '860', '795', '10', null),
        f136Annealed(
          { fromMm: '4.75', fromInclusive: true, toMm: '44.45', toInclusive: true },
          '860',
          '795',
          '10',
          '25',
        ),
        f136Annealed(
          { fromMm: '44.45', fromInclusive: false, toMm: '63.50', toInclusive: true },
          '825',
          '760',
          '8',
          '20',
        ),
        f136Annealed(
          { fromMm: '63.50', fromInclusive: false, toMm: '101.60', toInclusive: true },
          '825',
          '760',
          '8',
          '15',
        ),
      ],
    },
  ],
};

export const astmF1295: Specification = {
  id: 'ASTM F1295',
  title: 'Wrought titanium-6aluminum-7niobium alloy for surgical implant applications (UNS R56700)',
  family: 'titanium-alloy',
  revision: 'L2',
  edition: 'not stated by the source',
  scope: {
    forms: ['bar', 'wire', 'sheet', 'strip', 'plate'],
    conditions: ['annealed', 'cold-worked', 'hot-worked'],
    source: f1295Scope,
  },
  notes: [
    'Composition limits are weakly sourced; the written form of Al 5.5–6.5 and Nb 6.5–7.5 (one or two ' +
      'decimals) is unverified, and Ta and the mechanical minima are unverified: check every value against ' +
      'your licensed copy.',
    'Only annealed bar has mechanical minima in the library; other forms and conditions cannot be evaluated ' +
      'until the firm adds them.',
  ],
  grades: [
    {
      grade: null,
      uns: 'R56700',
      chemistry: [
        { element: 'Al', min: '5.5', max: '6.5', source: f1295Weak, writtenFormUnverified: true },
        { element: 'Nb', min: '6.5', max: '7.5', source: f1295Weak, writtenFormUnverified: true },
        { element: 'Ta', max: '0.50', source: unverified },
        { element: 'Fe', max: '0.25', source: f1295Weak },
        { element: 'O', max: '0.20', source: f1295Weak },
        { element: 'C', max: '0.08', source: f1295Weak },
        { element: 'N', max: '0.05', source: f1295Weak },
        { element: 'H', max: '0.009', source: f1295Weak },
      ],
      weightedSums: [],
      mechanicalProperties: ['utsMPa', 'ysMPa', 'elongationPct', 'reductionOfAreaPct'],
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
          source: unverified,
        },
      ],
    },
  ],
};
