/**
 * How sure we are of a value: the tags of the domain reference sheet for shipped values, and the
 * firm's own value for a drafted one. "unconfirmed" is shown as "unverified".
 */
export const confidences = ['published', 'secondary', 'firm', 'unconfirmed'] as const;
export type Confidence = (typeof confidences)[number];

export const confidenceLabels: Record<Confidence, string> = {
  published: 'published, with its citation',
  secondary: 'secondary source',
  firm: 'the firm’s own value',
  unconfirmed: 'unverified — check your licensed copy',
};

export interface ValueSource {
  /** Where the value was read, e.g. "supplier page reproducing ASTM F136 Table 1". */
  reference: string;
  confidence: Confidence;
}

export type MechanicalProperty = 'utsMPa' | 'ysMPa' | 'elongationPct' | 'reductionOfAreaPct';
export const mechanicalProperties: readonly MechanicalProperty[] = [
  'utsMPa',
  'ysMPa',
  'elongationPct',
  'reductionOfAreaPct',
];

export const mechanicalLabels: Record<MechanicalProperty, string> = {
  utsMPa: 'Tensile strength (MPa)',
  ysMPa: '0.2 % yield strength (MPa)',
  elongationPct: 'Elongation (%)',
  reductionOfAreaPct: 'Reduction of area (%)',
};

export const productForms = ['bar', 'wire', 'forging', 'billet', 'rod', 'sheet', 'strip', 'plate', 'tube'] as const;
export type ProductForm = (typeof productForms)[number];

export const productFormLabels: Record<ProductForm, string> = {
  bar: 'Bar',
  wire: 'Wire',
  forging: 'Forging',
  billet: 'Billet',
  rod: 'Rod',
  sheet: 'Sheet',
  strip: 'Strip',
  plate: 'Plate',
  tube: 'Tube',
};

/** The metallurgical conditions a certificate can state; chosen from this list, never typed. */
export const productConditions = ['annealed', 'cold-worked', 'hot-worked', 'warm-worked', 'extra-hard'] as const;
export type ProductCondition = (typeof productConditions)[number];

export const productConditionLabels: Record<ProductCondition, string> = {
  annealed: 'Annealed',
  'cold-worked': 'Cold worked',
  'hot-worked': 'Hot worked',
  'warm-worked': 'Warm worked',
  'extra-hard': 'Extra hard',
};

/** The controlled condition a text names ("Annealed", " cold worked ", "cold-worked"), or null. */
export function conditionOf(text: string): ProductCondition | null {
  const key = text
    .trim()
    .toLowerCase()
    .replace(/[\s_]+/g, '-');
  return (productConditions as readonly string[]).includes(key) ? (key as ProductCondition) : null;
}

/**
 * min and max are decimal strings written exactly as in the standard: each one's decimals set the
 * place E29 rounds to when comparing with it. `writtenFormUnverified` marks a limit whose written
 * form (e.g. "26" or "26.0") no published source consulted shows; the evaluation then refuses a
 * verdict that only that place decides.
 */
export interface ElementLimit {
  element: string;
  min?: string;
  max?: string;
  source: ValueSource;
  writtenFormUnverified?: boolean;
  /** Product (check) analysis tolerance under the minimum / over the maximum. */
  tolerance?: { under?: string; over?: string };
}

export interface SizeRange {
  fromMm: string;
  fromInclusive: boolean;
  /** Absent: no upper bound. */
  toMm?: string;
  toInclusive?: boolean;
}

export interface MechanicalSet {
  forms: readonly ProductForm[];
  condition: string;
  /** Absent: the limits apply whatever the size. */
  size?: SizeRange;
  limits: Array<{ property: MechanicalProperty; min: string; writtenFormUnverified?: boolean }>;
  /**
   * Properties the standard lists but does not require for this set (e.g. reduction of area below 4.75 mm), with why.
   */
  notRequired?: Array<{ property: MechanicalProperty; why: string }>;
  source: ValueSource;
}

/** A requirement over several elements, e.g. Cr + 3.3 × Mo ≥ 26.0. */
export interface WeightedSum {
  id: string;
  label: string;
  terms: Array<{ element: string; factor: string }>;
  min?: string;
  max?: string;
  source: ValueSource;
  writtenFormUnverified?: boolean;
}

export interface SpecificationGrade {
  /** null when the specification has a single composition. */
  grade: string | null;
  uns: string | null;
  chemistry: ElementLimit[];
  weightedSums: WeightedSum[];
  mechanical: MechanicalSet[];
  /**
   * The mechanical properties the standard requires of this grade; a heat is judged on each. Absent: those its sets
   * name.
   */
  mechanicalProperties?: MechanicalProperty[];
}

export const materialFamilies = [
  'titanium-unalloyed',
  'titanium-alloy',
  'stainless-steel',
  'cobalt-chromium',
  'nickel-titanium',
] as const;
export type MaterialFamily = (typeof materialFamilies)[number];

export const materialFamilyLabels: Record<MaterialFamily, string> = {
  'titanium-unalloyed': 'Unalloyed titanium',
  'titanium-alloy': 'Titanium alloy',
  'stainless-steel': 'Stainless steel',
  'cobalt-chromium': 'Cobalt-chromium alloy',
  'nickel-titanium': 'Nickel-titanium alloy',
};

/** The product forms and conditions a specification covers: what a heat received to it can be. */
export interface SpecificationScope {
  forms: ProductForm[];
  conditions: ProductCondition[];
  source: ValueSource;
}

export interface Specification {
  /** The standard's designation, e.g. "ASTM F136". */
  id: string;
  title: string;
  family: MaterialFamily;
  /** Our revision of this limit set; a revision that any evaluation used is never changed. */
  revision: string;
  /** The edition of the standard the values come from, as far as the source says. */
  edition: string;
  /** Absent on revisions stored before scopes were recorded: every form, and the conditions its sets name. */
  scope?: SpecificationScope;
  grades: SpecificationGrade[];
  notes: string[];
}

/** The forms and conditions a heat received to this revision may state. */
export function scopeOf(specification: Specification): { forms: ProductForm[]; conditions: ProductCondition[] } {
  if (specification.scope)
    return { forms: [...specification.scope.forms], conditions: [...specification.scope.conditions] };
  const named = new Set(
    specification.grades
      .flatMap((grade) => grade.mechanical.map((set) => conditionOf(set.condition)))
      .filter((condition) => condition !== null),
  );
  named.add('annealed');
  return { forms: [...productForms], conditions: productConditions.filter((condition) => named.has(condition)) };
}

export const limitCaution =
  'Limits shipped with Ingotrace are taken from published sources named beside each value; verify them ' +
  'against your licensed copy of the current edition of the standard before relying on them.';
