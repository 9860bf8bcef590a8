/**
 * Passivation and cleaning methods with the parameter window each run must stay inside.
 * Published windows name their source and how sure it is; windows that no public source gives
 * are the firm's own validated values (here: the demo firm's) and say so. The firm must verify
 * published values against its licensed copy of the current standard.
 */
import type { MaterialFamily } from '../materials/specification';
import { endotoxinLimits, type ContactCategory } from './contact-categories';

export type ProcessKind = 'passivation' | 'cleaning';
export type Confidence = 'published' | 'secondary-source' | 'unconfirmed' | 'firm-validated';

export const methodConfidenceLabels: Record<Confidence, string> = {
  published: 'published by the standard’s publisher',
  'secondary-source': 'published, secondary source',
  unconfirmed: 'unverified — check your licensed copy',
  'firm-validated': 'firm’s validated window',
};

export interface ParameterWindow {
  key: string;
  label: string;
  unit: string;
  min?: string;
  max?: string;
  /** Text parameters (e.g. a bath identity) that must be recorded but have no numeric window. */
  text?: boolean;
  /**
   * A limit that depends on where the device touches the body: the run is judged against the strictest among its lots.
   */
  byContactCategory?: Array<{ category: ContactCategory; max: string; source: string }>;
  source: string;
  confidence: Confidence;
}

/** The materials a method's own scope covers, with the source that says so. */
export interface MaterialScope {
  families: MaterialFamily[];
  source: string;
  confidence: Confidence;
}

/** One published temperature band with the minimum time that goes with it. */
export interface TemperatureTimePairing {
  label: string;
  minC: string;
  maxC: string;
  minMinutes: string;
  source: string;
  confidence: Confidence;
}

export interface ProcessMethod {
  id: string;
  kind: ProcessKind;
  title: string;
  basis: string;
  materialScope: MaterialScope;
  parameters: ParameterWindow[];
  /**
   * Methods that pair each temperature band with its own minimum time: a run is in window only when
   * its temperature and time both meet one pairing (the parameters' own windows are the envelope).
   */
  pairings?: TemperatureTimePairing[];
}

const a967 =
  'ASTM A967 nitric treatments as listed by a processor citing A967-05 (Advance Surface Technologies, ' +
  'Passivation specifications)';
const a967Nitric2 = 'ASTM A967 Nitric 2, 20–45 vol % (Products Finishing, "Passivation Concentration")';
const f86 =
  'ASTM F86 nitric passivation as quoted in a practitioner’s letter (finishing.com, "Passivation of Stainless ' +
  'Steels and Titanium")';
const citric = 'ASTM A967 citric treatments, 4–10 % citric acid (Birmingham Springs, "Citric acid passivation")';
const firm = 'Kestrelmoor validated process window (firm’s own validation report; demo values)';

const stainlessOnly: MaterialScope = {
  families: ['stainless-steel'],
  source:
    'ASTM A967 scope: chemical passivation treatments for stainless steel parts (scope as quoted from ' +
    'A967-13; see the firm’s licensed copy)',
  confidence: 'secondary-source',
};
const f86Scope: MaterialScope = {
  families: ['stainless-steel', 'cobalt-chromium', 'titanium-unalloyed', 'titanium-alloy'],
  source:
    'ASTM F86 significance and use 3.1: implants of iron-, cobalt-, titanium- and tantalum-based materials ' +
    '(astm.org, ASTM F86-13)',
  confidence: 'published',
};

const bath = (source: string): ParameterWindow => ({
  key: 'bath',
  label: 'Bath identity',
  unit: '',
  text: true,
  source,
  confidence: 'firm-validated',
});
const rinse: ParameterWindow = {
  key: 'rinseConductivity',
  label: 'Final rinse water conductivity',
  unit: 'µS/cm',
  max: '5',
  source: firm,
  confidence: 'firm-validated',
};

const nitric = (
  id: string,
  title: string,
  acid: [string, string],
  temperature: [string, string],
  minutes: string,
  source = a967,
): ProcessMethod => ({
  id,
  kind: 'passivation',
  title,
  basis: source,
  materialScope: stainlessOnly,
  pairings: [
    {
      label: title.split(' (')[0]!,
      minC: temperature[0],
      maxC: temperature[1],
      minMinutes: minutes,
      source,
      confidence: 'secondary-source',
    },
  ],
  parameters: [
    bath(firm),
    {
      key: 'acidConcentration',
      label: 'Nitric acid concentration',
      unit: 'vol %',
      min: acid[0],
      max: acid[1],
      source,
      confidence: 'secondary-source',
    },
    {
      key: 'temperature',
      label: 'Bath temperature',
      unit: '°C',
      min: temperature[0],
      max: temperature[1],
      source,
      confidence: 'secondary-source',
    },
    {
      key: 'immersionTime',
      label: 'Immersion time',
      unit: 'min',
      min: minutes,
      source,
      confidence: 'secondary-source',
    },
    rinse,
  ],
});

/**
 * F86's nitric passivation: 20–40 % at room temperature for at least 30 minutes (the source gives
 * no temperature, so the firm's own room-temperature window applies), or heated to 49–60 °C
 * (120–140 °F) for at least 20 minutes.
 */
function f86Nitric(): ProcessMethod {
  const method = nitric(
    'F86-NITRIC',
    'ASTM F86 nitric (20–40 % HNO₃; room temperature ≥ 30 min, or 49–60 °C ≥ 20 min)',
    ['20', '40'],
    ['15', '60'],
    '20',
    f86,
  );
  method.materialScope = f86Scope;
  method.parameters = method.parameters.map((parameter) =>
    parameter.key === 'temperature'
      ? { ...parameter, source: `${f86}; room temperature band: ${firm}`, confidence: 'firm-validated' }
      : parameter,
  );
  method.pairings = [
    {
      label: 'Room temperature',
      minC: '15',
      maxC: '35',
      minMinutes: '30',
      source: `${f86}; room temperature band: ${firm}`,
      confidence: 'firm-validated',
    },
    {
      label: 'Accelerated (120–140 °F)',
      minC: '49',
      maxC: '60',
      minMinutes: '20',
      source: f86,
      confidence: 'secondary-source',
    },
  ];
  return method;
}

const citricPairing = (label: string, minC: string, maxC: string, minMinutes: string) => ({
  label,
  minC,
  maxC,
  minMinutes,
  source:
    `ASTM A967 ${label}: unverified (no published source consulted gives the citric temperatures and times; ` +
    `check your licensed copy)`,
  confidence: 'unconfirmed' as const,
});

export const processMethods: ProcessMethod[] = [
  nitric(
    'A967-NITRIC-2',
    'ASTM A967 Nitric 2 (20–45 vol % HNO₃, 21–32 °C, ≥ 30 min)',
    ['20', '45'],
    ['21', '32'],
    '30',
    `${a967}; concentration also ${a967Nitric2}`,
  ),
  nitric(
    'A967-NITRIC-3',
    'ASTM A967 Nitric 3 (20–25 vol % HNO₃, 49–60 °C, ≥ 20 min)',
    ['20', '25'],
    ['49', '60'],
    '20',
  ),
  nitric(
    'A967-NITRIC-4',
    'ASTM A967 Nitric 4 (45–55 vol % HNO₃, 49–54 °C, ≥ 30 min)',
    ['45', '55'],
    ['49', '54'],
    '30',
  ),
  f86Nitric(),
  {
    id: 'A967-CITRIC',
    kind: 'passivation',
    title: 'ASTM A967 citric (4–10 % citric acid; temperature and time pairings unverified)',
    basis: citric,
    materialScope: stainlessOnly,
    pairings: [
      citricPairing('Citric 1', '60', '71', '4'),
      citricPairing('Citric 2', '49', '60', '10'),
      citricPairing('Citric 3', '21', '49', '20'),
    ],
    parameters: [
      bath(firm),
      {
        key: 'acidConcentration',
        label: 'Citric acid concentration',
        unit: 'wt %',
        min: '4',
        max: '10',
        source: citric,
        confidence: 'secondary-source',
      },
      {
        key: 'temperature',
        label: 'Bath temperature',
        unit: '°C',
        min: '21',
        max: '71',
        source: 'ASTM A967 Citric 1–3 envelope, unverified: the pairings below decide',
        confidence: 'unconfirmed',
      },
      {
        key: 'immersionTime',
        label: 'Immersion time',
        unit: 'min',
        min: '4',
        source: 'ASTM A967 Citric 1 minimum, unverified: the pairings below decide',
        confidence: 'unconfirmed',
      },
      rinse,
    ],
  },
  {
    id: 'KIW-CLEAN-AQ',
    kind: 'cleaning',
    title: 'Final aqueous ultrasonic clean (firm-validated window)',
    basis:
      `${firm}; validated following ASTM F3127 and ISO 19227, which leave chemical residue limits to the ` +
      `manufacturer`,
    materialScope: {
      families: ['titanium-unalloyed', 'titanium-alloy', 'stainless-steel', 'cobalt-chromium'],
      source: `${firm}: validated on worst-case parts of each of these materials`,
      confidence: 'firm-validated',
    },
    parameters: [
      {
        key: 'detergent',
        label: 'Detergent and lot',
        unit: '',
        text: true,
        source: firm,
        confidence: 'firm-validated',
      },
      {
        key: 'detergentConcentration',
        label: 'Detergent concentration',
        unit: 'vol %',
        min: '1.5',
        max: '3',
        source: firm,
        confidence: 'firm-validated',
      },
      {
        key: 'washTemperature',
        label: 'Wash temperature',
        unit: '°C',
        min: '50',
        max: '60',
        source: firm,
        confidence: 'firm-validated',
      },
      {
        key: 'washTime',
        label: 'Ultrasonic wash time',
        unit: 'min',
        min: '10',
        max: '20',
        source: firm,
        confidence: 'firm-validated',
      },
      {
        key: 'rinseTemperature',
        label: 'Rinse temperature',
        unit: '°C',
        min: '20',
        max: '40',
        source: firm,
        confidence: 'firm-validated',
      },
      { key: 'rinseTime', label: 'Rinse time', unit: 'min', min: '5', source: firm, confidence: 'firm-validated' },
      rinse,
      {
        key: 'toc',
        label: 'Residue: total organic carbon per device',
        unit: 'µg/device',
        max: '500',
        source: `${firm}; no published universal limit (ISO 19227 leaves it to ISO 10993-17 derivation)`,
        confidence: 'firm-validated',
      },
      {
        key: 'endotoxin',
        label: 'Residue: bacterial endotoxin',
        unit: 'EU/device',
        max: '20',
        byContactCategory: endotoxinLimits.map((limit) => ({
          category: limit.category,
          max: limit.maxEuPerDevice,
          source: limit.source,
        })),
        source: 'Per the devices’ contact category: ' + endotoxinLimits.map((limit) => limit.source).join('; '),
        confidence: 'secondary-source',
      },
    ],
  },
];

export function processMethod(id: string): ProcessMethod | undefined {
  return processMethods.find((method) => method.id === id);
}
