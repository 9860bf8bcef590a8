import type { Specification, ValueSource } from '../specification';

const f138Source: ValueSource = {
  reference: 'ASTM F138 bar and wire heat analysis as reproduced in a public machining-shop article (weak)',
  confidence: 'secondary',
};
const f138Index: ValueSource = {
  reference:
    'Cr + 3.3 Mo ≥ 26 is confirmed for ISO 5832-1 (1997) by BSSA; that F138 carries it too, and as 26.0, is unverified',
  confidence: 'unconfirmed',
};
const iso58321Source: ValueSource = {
  reference: 'BSSA, "Selection of stainless steels for surgical implants" (ISO 5832-1:1997 composition D)',
  confidence: 'secondary',
};
const iso58321Index: ValueSource = {
  reference:
    'BSSA, "Selection of stainless steels for surgical implants": ISO 5832-1 (1997) requires 3.3 Mo + Cr ≥ 26 ' +
    'for compositions D and E',
  confidence: 'secondary',
};
const f1537Source: ValueSource = {
  reference: 'ASTM F1537 Alloy 1 composition from FWM and Carpenter Technology data pages',
  confidence: 'secondary',
};
const unverified: ValueSource = {
  reference: 'unverified: not found in any published source consulted; check your licensed copy',
  confidence: 'unconfirmed',
};

export const astmF138: Specification = {
  id: 'ASTM F138',
  title: 'Wrought 18chromium-14nickel-2.5molybdenum stainless steel bar and wire for surgical implants (UNS S31673)',
  family: 'stainless-steel',
  revision: 'L2',
  edition: 'not stated by the source',
  scope: {
    forms: ['bar', 'wire'],
    conditions: ['annealed', 'cold-worked', 'extra-hard'],
    source: { reference: 'the title (bar and wire); conditions unverified', confidence: 'unconfirmed' },
  },
  notes: [
    'Mn, Si, the Cr + 3.3 × Mo requirement and all mechanical minima are unverified for F138: check them. ' +
      'Extra-hard material has no minima in the library and cannot be evaluated until the firm adds them.',
  ],
  grades: [
    {
      grade: null,
      uns: 'S31673',
      chemistry: [
        { element: 'C', max: '0.030', source: f138Source },
        { element: 'Mn', max: '2.00', source: unverified },
        { element: 'P', max: '0.025', source: f138Source },
        { element: 'S', max: '0.010', source: f138Source },
        { element: 'Si', max: '0.75', source: unverified },
        { element: 'Cr', min: '17.00', max: '19.00', source: f138Source },
        { element: 'Ni', min: '13.00', max: '15.00', source: f138Source },
        { element: 'Mo', min: '2.25', max: '3.00', source: f138Source },
        { element: 'N', max: '0.10', source: f138Source },
        { element: 'Cu', max: '0.50', source: f138Source },
      ],
      weightedSums: [
        {
          id: 'cr-3.3mo',
          label: 'Cr + 3.3 × Mo',
          terms: [
            { element: 'Cr', factor: '1' },
            { element: 'Mo', factor: '3.3' },
          ],
          min: '26.0',
          source: f138Index,
        },
      ],
      mechanicalProperties: ['utsMPa', 'ysMPa', 'elongationPct'],
      mechanical: [
        {
          forms: ['bar', 'wire'],
          condition: 'annealed',
          limits: [
            { property: 'utsMPa', min: '490' },
            { property: 'ysMPa', min: '190' },
            { property: 'elongationPct', min: '40' },
          ],
          source: unverified,
        },
        {
          forms: ['bar', 'wire'],
          condition: 'cold-worked',
          limits: [
            { property: 'utsMPa', min: '860' },
            { property: 'ysMPa', min: '690' },
            { property: 'elongationPct', min: '12' },
          ],
          source: unverified,
        },
      ],
    },
  ],
};

export const iso58321: Specification = {
  id: 'ISO 5832-1',
  title: 'Implants for surgery — Metallic materials — Part 1: Wrought stainless steel (composition D)',
  family: 'stainless-steel',
  revision: 'L2',
  edition: 'ISO 5832-1:1997 (withdrawn; the current 2024 edition was not seen)',
  scope: {
    forms: ['bar', 'wire', 'sheet', 'strip', 'plate'],
    conditions: ['annealed', 'cold-worked'],
    source: { reference: 'forms and conditions of ISO 5832-1 unverified', confidence: 'unconfirmed' },
  },
  notes: [
    'Values are from the 1997 edition as described by BSSA; the current edition may differ.',
    'The library holds no mechanical requirements for ISO 5832-1: every heat needs the firm to add them, or a ' +
      'QA approver’s signed justification, before it can be accepted.',
    'Whether the Cr + 3.3 × Mo minimum is written 26 or 26.0 is unverified.',
  ],
  grades: [
    {
      grade: 'D',
      uns: null,
      chemistry: [
        { element: 'C', max: '0.030', source: iso58321Source },
        { element: 'Si', max: '1.0', source: iso58321Source },
        { element: 'Mn', max: '2.0', source: iso58321Source },
        { element: 'P', max: '0.025', source: iso58321Source },
        { element: 'S', max: '0.010', source: iso58321Source },
        { element: 'Cr', min: '17.0', max: '19.0', source: iso58321Source },
        { element: 'Mo', min: '2.25', max: '3.5', source: iso58321Source },
        { element: 'Ni', min: '13.0', max: '15.0', source: iso58321Source },
        { element: 'N', max: '0.10', source: iso58321Source },
        { element: 'Cu', max: '0.50', source: iso58321Source },
      ],
      weightedSums: [
        {
          id: 'cr-3.3mo',
          label: 'Cr + 3.3 × Mo',
          terms: [
            { element: 'Cr', factor: '1' },
            { element: 'Mo', factor: '3.3' },
          ],
          min: '26',
          source: iso58321Index,
          writtenFormUnverified: true,
        },
      ],
      mechanicalProperties: ['utsMPa', 'ysMPa', 'elongationPct'],
      mechanical: [],
    },
  ],
};

const f1537Set = (condition: string, uts: string, ys: string, elongation: string, reduction: string) => ({
  forms: ['bar', 'rod', 'wire'] as const,
  condition,
  limits: [
    { property: 'utsMPa' as const, min: uts },
    { property: 'ysMPa' as const, min: ys },
    { property: 'elongationPct' as const, min: elongation },
    { property: 'reductionOfAreaPct' as const, min: reduction },
  ],
  source: unverified,
});

export const astmF1537: Specification = {
  id: 'ASTM F1537',
  title: 'Wrought cobalt-28chromium-6molybdenum alloys for surgical implants (Alloy 1, UNS R31537)',
  family: 'cobalt-chromium',
  revision: 'L2',
  edition: 'not stated by the source',
  scope: {
    forms: ['bar', 'rod', 'wire'],
    conditions: ['annealed', 'hot-worked', 'warm-worked'],
    source: {
      reference: 'ASTM F1537-11 abstract (iTeh): bar, rod and wire; conditions unverified',
      confidence: 'secondary',
    },
  },
  notes: [
    'Only Alloy 1 (low carbon) is shipped. Mechanical minima depend on condition and are unverified.',
    'Cr 26–30 and Mo 5–7 are shown as whole numbers by the sources; whether the standard writes them with ' +
      'decimals is unverified.',
  ],
  grades: [
    {
      grade: '1',
      uns: 'R31537',
      chemistry: [
        { element: 'C', max: '0.14', source: f1537Source },
        { element: 'Cr', min: '26', max: '30', source: f1537Source, writtenFormUnverified: true },
        { element: 'Mo', min: '5', max: '7', source: f1537Source, writtenFormUnverified: true },
        { element: 'Ni', max: '1.0', source: f1537Source },
        { element: 'Fe', max: '0.75', source: f1537Source },
        { element: 'Si', max: '1.0', source: f1537Source },
        { element: 'Mn', max: '1.0', source: f1537Source },
        { element: 'N', max: '0.25', source: f1537Source },
      ],
      weightedSums: [],
      mechanicalProperties: ['utsMPa', 'ysMPa', 'elongationPct', 'reductionOfAreaPct'],
      mechanical: [
        f1537Set('annealed', '897', '517', '20', '20'),
        f1537Set('hot-worked', '1000', '700', '12', '12'),
        f1537Set('warm-worked', '1172', '827', '12', '12'),
      ],
    },
  ],
};

export const astmF2063: Specification = {
  id: 'ASTM F2063',
  title: 'Wrought nickel-titanium shape memory alloys for medical devices and surgical implants',
  family: 'nickel-titanium',
  revision: 'L2',
  edition: 'F2063-18 (tolerances); Table 1 limits unverified',
  scope: {
    forms: ['bar', 'sheet', 'strip', 'plate', 'tube'],
    conditions: ['annealed'],
    source: {
      reference: 'ASTM F2063-12/-18 scope (iTeh; TestResources): bar, flat-rolled products and tubes',
      confidence: 'secondary',
    },
  },
  notes: [
    'Every composition limit and mechanical minimum here is unverified: check before use. Transformation ' +
      'temperature is by agreement (DSC).',
  ],
  grades: [
    {
      grade: null,
      uns: null,
      chemistry: [
        { element: 'Ni', min: '54.5', max: '57.0', source: unverified },
        { element: 'C', max: '0.040', source: unverified },
        { element: 'Co', max: '0.050', source: unverified },
        { element: 'Cu', max: '0.010', source: unverified },
        { element: 'Cr', max: '0.010', source: unverified },
        { element: 'H', max: '0.005', source: unverified },
        { element: 'Fe', max: '0.050', source: unverified },
        { element: 'Nb', max: '0.025', source: unverified },
      ],
      weightedSums: [
        {
          id: 'n+o',
          label: 'N + O',
          terms: [
            { element: 'N', factor: '1' },
            { element: 'O', factor: '1' },
          ],
          max: '0.050',
          source: unverified,
        },
      ],
      mechanicalProperties: ['utsMPa', 'elongationPct'],
      mechanical: [
        {
          forms: ['bar', 'tube'],
          condition: 'annealed',
          limits: [
            { property: 'utsMPa', min: '551' },
            { property: 'elongationPct', min: '10' },
          ],
          source: unverified,
        },
      ],
    },
  ],
};
