/** How sure we are of a shipped value (the tags of the domain reference sheet). */
export type Confidence = 'published' | 'secondary' | 'unconfirmed';

export interface ValueSource {
  /** Where the value was read, e.g. "supplier page reproducing ASTM F136 Table 1". */
  reference: string;
  confidence: Confidence;
}

export type MechanicalProperty = 'utsMPa' | 'ysMPa' | 'elongationPct' | 'reductionOfAreaPct';

export const mechanicalLabels: Record<MechanicalProperty, string> = {
  utsMPa: 'Tensile strength (MPa)',
  ysMPa: '0.2 % yield strength (MPa)',
  elongationPct: 'Elongation (%)',
  reductionOfAreaPct: 'Reduction of area (%)',
};

export const productForms = ['bar', 'wire', 'forging', 'billet', 'rod', 'sheet', 'strip', 'plate', 'tube'] as const;
export type ProductForm = (typeof productForms)[number];

/** min and max are decimal strings written exactly as in the standard (their decimals set the E29 rounding place). */
export interface ElementLimit {
  element: string;
  min?: string;
  max?: string;
  source: ValueSource;
  /** Product (check) analysis tolerance under the minimum / over the maximum. */
  tolerance?: { under?: string; over?: string };
}

export interface SizeRange {
  fromMm: string;
  fromInclusive: boolean;
  toMm: string;
  toInclusive: boolean;
}

export interface MechanicalSet {
  forms: readonly ProductForm[];
  condition: string;
  /** Absent: the limits apply whatever the size. */
  size?: SizeRange;
  limits: Array<{ property: MechanicalProperty; min: string }>;
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
}

export interface SpecificationGrade {
  /** null when the specification has a single composition. */
  grade: string | null;
  uns: string | null;
  chemistry: ElementLimit[];
  weightedSums: WeightedSum[];
  mechanical: MechanicalSet[];
}

export type MaterialFamily = 'titanium-unalloyed' | 'titanium-alloy' | 'stainless-steel' | 'cobalt-chromium' | 'nickel-titanium';

export interface Specification {
  /** The standard's designation, e.g. "ASTM F136". */
  id: string;
  title: string;
  family: MaterialFamily;
  /** Our revision of this limit set; a revision that any evaluation used is never changed. */
  revision: string;
  /** The edition of the standard the values come from, as far as the source says. */
  edition: string;
  grades: SpecificationGrade[];
  notes: string[];
}

export const limitCaution =
  'Limits shipped with Ingotrace are taken from published sources named beside each value; verify them against your licensed copy of the current edition of the standard before relying on them.';
