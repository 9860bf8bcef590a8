import type { Specification, ValueSource } from '../specification';

const f138Source: ValueSource = { reference: 'ASTM F138 bar and wire heat analysis as reproduced in a public machining-shop article (weak)', confidence: 'secondary' };
const f138Index: ValueSource = {
  reference: 'Cr + 3.3 Mo ≥ 26 is confirmed for ISO 5832-1 (1997) by BSSA; that F138 carries it too is unconfirmed',
  confidence: 'unconfirmed',
};
const iso58321Source: ValueSource = { reference: 'BSSA, "Selection of stainless steels for surgical implants" (ISO 5832-1:1997 composition D)', confidence: 'secondary' };
const iso58321Index: ValueSource = { reference: 'BSSA, "Selection of stainless steels for surgical implants": ISO 5832-1 (1997) requires 3.3 Mo + Cr ≥ 26 for compositions D and E', confidence: 'secondary' };
const f1537Source: ValueSource = { reference: 'ASTM F1537 Alloy 1 composition from FWM and Carpenter Technology data pages', confidence: 'secondary' };
const fromMemory: ValueSource = { reference: 'from memory, not confirmed in any source consulted', confidence: 'unconfirmed' };

export const astmF138: Specification = {
  id: 'ASTM F138',
  title: 'Wrought 18chromium-14nickel-2.5molybdenum stainless steel bar and wire for surgical implants (UNS S31673)',
  family: 'stainless-steel',
  revision: 'L1',
  edition: 'not stated by the source',
  notes: ['Mn, Si, the Cr + 3.3 × Mo requirement and all mechanical minima are unconfirmed for F138: verify them.'],
  grades: [
    {
      grade: null,
      uns: 'S31673',
      chemistry: [
        { element: 'C', max: '0.030', source: f138Source },
        { element: 'Mn', max: '2.00', source: fromMemory },
        { element: 'P', max: '0.025', source: f138Source },
        { element: 'S', max: '0.010', source: f138Source },
        { element: 'Si', max: '0.75', source: fromMemory },
        { element: 'Cr', min: '17.00', max: '19.00', source: f138Source },
        { element: 'Ni', min: '13.00', max: '15.00', source: f138Source },
        { element: 'Mo', min: '2.25', max: '3.00', source: f138Source },
        { element: 'N', max: '0.10', source: f138Source },
        { element: 'Cu', max: '0.50', source: f138Source },
      ],
      weightedSums: [{ id: 'cr-3.3mo', label: 'Cr + 3.3 × Mo', terms: [{ element: 'Cr', factor: '1' }, { element: 'Mo', factor: '3.3' }], min: '26.0', source: f138Index }],
      mechanical: [
        {
          forms: ['bar', 'wire'],
          condition: 'annealed',
          limits: [
            { property: 'utsMPa', min: '490' },
            { property: 'ysMPa', min: '190' },
            { property: 'elongationPct', min: '40' },
          ],
          source: fromMemory,
        },
        {
          forms: ['bar', 'wire'],
          condition: 'cold-worked',
          limits: [
            { property: 'utsMPa', min: '860' },
            { property: 'ysMPa', min: '690' },
            { property: 'elongationPct', min: '12' },
          ],
          source: fromMemory,
        },
      ],
    },
  ],
};

export const iso58321: Specification = {
  id: 'ISO 5832-1',
  title: 'Implants for surgery — Metallic materials — Part 1: Wrought stainless steel (composition D)',
  family: 'stainless-steel',
  revision: 'L1',
  edition: 'ISO 5832-1:1997 (withdrawn; the current 2024 edition was not seen)',
  notes: ['Values are from the 1997 edition as described by BSSA; the current edition may differ.'],
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
      weightedSums: [{ id: 'cr-3.3mo', label: 'Cr + 3.3 × Mo', terms: [{ element: 'Cr', factor: '1' }, { element: 'Mo', factor: '3.3' }], min: '26', source: iso58321Index }],
      mechanical: [],
    },
  ],
};

export const astmF1537: Specification = {
  id: 'ASTM F1537',
  title: 'Wrought cobalt-28chromium-6molybdenum alloys for surgical implants (Alloy 1, UNS R31537)',
  family: 'cobalt-chromium',
  revision: 'L1',
  edition: 'not stated by the source',
  notes: ['Only Alloy 1 (low carbon) is shipped. Mechanical minima depend on condition and are unconfirmed.'],
  grades: [
    {
      grade: '1',
      uns: 'R31537',
      chemistry: [
        { element: 'C', max: '0.14', source: f1537Source },
        { element: 'Cr', min: '26', max: '30', source: f1537Source },
        { element: 'Mo', min: '5', max: '7', source: f1537Source },
        { element: 'Ni', max: '1.0', source: f1537Source },
        { element: 'Fe', max: '0.75', source: f1537Source },
        { element: 'Si', max: '1.0', source: f1537Source },
        { element: 'Mn', max: '1.0', source: f1537Source },
        { element: 'N', max: '0.25', source: f1537Source },
      ],
      weightedSums: [],
      mechanical: [
        {
          forms: ['bar', 'rod', 'wire'],
          condition: 'annealed',
          limits: [
            { property: 'utsMPa', min: '897' },
            { property: 'ysMPa', min: '517' },
            { property: 'elongationPct', min: '20' },
            { property: 'reductionOfAreaPct', min: '20' },
          ],
          source: fromMemory,
        },
      ],
    },
  ],
};

export const astmF2063: Specification = {
  id: 'ASTM F2063',
  title: 'Wrought nickel-titanium shape memory alloys for medical devices and surgical implants',
  family: 'nickel-titanium',
  revision: 'L1',
  edition: 'F2063-18 (tolerances); Table 1 limits unconfirmed',
  notes: ['Every composition limit and mechanical minimum here is unconfirmed: verify before use. Transformation temperature is by agreement (DSC).'],
  grades: [
    {
      grade: null,
      uns: null,
      chemistry: [
        { element: 'Ni', min: '54.5', max: '57.0', source: fromMemory },
        { element: 'C', max: '0.040', source: fromMemory },
        { element: 'Co', max: '0.050', source: fromMemory },
        { element: 'Cu', max: '0.010', source: fromMemory },
        { element: 'Cr', max: '0.010', source: fromMemory },
        { element: 'H', max: '0.005', source: fromMemory },
        { element: 'Fe', max: '0.050', source: fromMemory },
        { element: 'Nb', max: '0.025', source: fromMemory },
      ],
      weightedSums: [{ id: 'n+o', label: 'N + O', terms: [{ element: 'N', factor: '1' }, { element: 'O', factor: '1' }], max: '0.050', source: fromMemory }],
      mechanical: [{ forms: ['bar', 'tube'], condition: 'annealed', limits: [{ property: 'utsMPa', min: '551' }, { property: 'elongationPct', min: '10' }], source: fromMemory }],
    },
  ],
};
