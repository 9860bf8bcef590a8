import { certificateInputSchema, type CertificateInput, type Evaluation, type EvaluationFlag, type EvaluationItem, type ParsedCertificateInput } from '../../schemas/evaluation';
import { compareDecimal, decimalsOf, DecimalE29, roundE29, toDecimal } from './e29-rounding';
import { findSpecification } from './library';
import { readChemistryValue, readMechanicalValue, ReportedValueError } from './reported-value';
import { limitCaution, mechanicalLabels, type ElementLimit, type MechanicalSet, type Specification, type SpecificationGrade, type ValueSource } from './specification';
import { aluminiumEquivalent, alloyClass, molybdenumEquivalentBania, molybdenumEquivalentBoyer, oxygenEquivalent } from './titanium-indices';

export class EvaluationInputError extends Error {
  constructor(
    message: string,
    readonly fields: Record<string, string> = {},
  ) {
    super(message);
  }
}

function limitText(min?: string, max?: string): string {
  if (min !== undefined && max !== undefined) return `${min}–${max}`;
  if (max !== undefined) return `≤ ${max}`;
  return `≥ ${min}`;
}

/** Rounds the reported value to the limit's place (ASTM E29) and compares. */
function judge(value: string, min?: string, max?: string): { rounded: string; conforms: boolean } {
  const decimals = Math.max(min !== undefined ? decimalsOf(min) : 0, max !== undefined ? decimalsOf(max) : 0);
  const rounded = roundE29(value, decimals);
  const conforms = (min === undefined || compareDecimal(rounded, min) >= 0) && (max === undefined || compareDecimal(rounded, max) <= 0);
  return { rounded, conforms };
}

function sourceFields(source: ValueSource) {
  return { source: source.reference, confidence: source.confidence };
}

function chooseGrade(specification: Specification, grade: string | null): SpecificationGrade {
  if (specification.grades.length === 1) return specification.grades[0]!;
  const found = specification.grades.find((candidate) => candidate.grade === grade);
  if (!found) {
    const grades = specification.grades.map((candidate) => candidate.grade).join(', ');
    throw new EvaluationInputError(`${specification.id} needs a grade: one of ${grades}`, { grade: `One of ${grades}` });
  }
  return found;
}

function inSize(set: MechanicalSet, sizeMm: string): boolean {
  if (!set.size) return true;
  const from = compareDecimal(sizeMm, set.size.fromMm);
  const to = compareDecimal(sizeMm, set.size.toMm);
  return (set.size.fromInclusive ? from >= 0 : from > 0) && (set.size.toInclusive ? to <= 0 : to < 0);
}

function plausibility(limit: ElementLimit, value: string, asReported: string): EvaluationFlag[] {
  const flags: EvaluationFlag[] = [];
  const decimal = toDecimal(value);
  if (decimal.isNegative() || decimal.greaterThan(100)) flags.push({ kind: 'out-of-range', item: limit.element, message: `${limit.element} ${asReported} is outside 0–100 %` });
  const reference = limit.max ?? limit.min!;
  const reportedDecimals = value.split('.')[1]?.length ?? 0;
  if (reportedDecimals > decimalsOf(reference) + 3) {
    flags.push({ kind: 'excess-precision', item: limit.element, message: `${limit.element} is reported to ${reportedDecimals} decimals, far finer than a mill's method reports against a limit of ${reference}` });
  }
  if (limit.max !== undefined && limit.min === undefined && toDecimal(limit.max).lessThan(0.1) && decimal.greaterThanOrEqualTo(1) && decimal.greaterThan(toDecimal(limit.max).times(50))) {
    flags.push({ kind: 'looks-like-ppm', item: limit.element, message: `${limit.element} ${asReported} % against a limit of ${limit.max} %: was it reported in ppm?` });
  }
  return flags;
}

/**
 * Evaluates a certificate's reported results against a specification, item by item, with the
 * ASTM E29 rounding method. Pure: no database, no clock.
 */
export function evaluateCertificate(raw: CertificateInput): Evaluation {
  const parsed = certificateInputSchema.safeParse(raw);
  if (!parsed.success) {
    const fields = Object.fromEntries(parsed.error.issues.map((issue) => [issue.path.join('.') || '(input)', issue.message]));
    throw new EvaluationInputError('The certificate input is not valid', fields);
  }
  const specification = findSpecification(parsed.data.spec);
  if (!specification) throw new EvaluationInputError(`Unknown specification "${parsed.data.spec}"`, { spec: 'Not in the specification library' });
  return evaluateAgainst(specification, parsed.data);
}

/** Evaluates parsed input against a given specification revision (e.g. the one a heat was bought to). */
export function evaluateAgainst(specification: Specification, input: ParsedCertificateInput): Evaluation {
  const grade = chooseGrade(specification, input.grade === null || input.grade === undefined ? null : String(input.grade));
  const items: EvaluationItem[] = [];
  const flags: EvaluationFlag[] = [];
  const chemistry: Record<string, string> = {};

  for (const [element, value] of Object.entries(input.chemistry)) {
    try {
      chemistry[element] = readChemistryValue(value).value;
    } catch (error) {
      if (error instanceof ReportedValueError) throw new EvaluationInputError(error.message, { [`chemistry.${element}`]: error.message });
      throw error;
    }
  }

  for (const limit of grade.chemistry) {
    const raw = input.chemistry[limit.element];
    const limitLabel = limitText(limit.min, limit.max);
    if (raw === undefined) {
      items.push({ item: limit.element, kind: 'chemistry', reported: null, rounded: null, limit: limitLabel, verdict: 'missing', note: 'not reported', ...sourceFields(limit.source) });
      continue;
    }
    const reported = readChemistryValue(raw);
    const { rounded, conforms } = judge(reported.value, limit.min, limit.max);
    items.push({
      item: limit.element,
      kind: 'chemistry',
      reported: reported.value,
      rounded,
      limit: limitLabel,
      verdict: conforms ? 'conforms' : 'does-not-conform',
      ...(reported.conversion ? { note: reported.conversion } : {}),
      ...sourceFields(limit.source),
    });
    flags.push(...plausibility(limit, reported.value, reported.asReported));
  }
  for (const element of Object.keys(input.chemistry)) {
    if (!grade.chemistry.some((limit) => limit.element === element)) {
      flags.push({ kind: 'not-in-specification', item: element, message: `${element} is reported but ${specification.id} sets no limit for it` });
    }
  }

  for (const requirement of grade.weightedSums) {
    const missing = requirement.terms.filter((term) => chemistry[term.element] === undefined).map((term) => term.element);
    const limitLabel = limitText(requirement.min, requirement.max);
    if (missing.length) {
      items.push({ item: requirement.label, kind: 'requirement', reported: null, rounded: null, limit: limitLabel, verdict: 'missing', note: `needs ${missing.join(', ')}`, ...sourceFields(requirement.source) });
      continue;
    }
    const total = requirement.terms.reduce((sum, term) => sum.plus(toDecimal(chemistry[term.element]!).times(term.factor)), new DecimalE29(0));
    const exact = total.toFixed();
    const { rounded, conforms } = judge(exact, requirement.min, requirement.max);
    items.push({ item: requirement.label, kind: 'requirement', reported: exact, rounded, limit: limitLabel, verdict: conforms ? 'conforms' : 'does-not-conform', ...sourceFields(requirement.source) });
  }

  const sets = grade.mechanical.filter((set) => set.forms.includes(input.form) && set.condition === input.condition);
  const sizeMm = input.sizeMm === null || input.sizeMm === undefined ? null : readMechanicalValue(input.sizeMm);
  const sized = sets.some((set) => set.size);
  let chosen: MechanicalSet | undefined;
  if (sized && sizeMm === null) {
    items.push({ item: 'size', kind: 'selection', reported: null, rounded: null, limit: 'diameter or thickness in mm', verdict: 'missing', note: 'the mechanical minima depend on size', source: 'specification', confidence: 'secondary' });
  } else {
    chosen = sets.find((set) => sizeMm === null || inSize(set, sizeMm));
    if (sets.length && !chosen) {
      items.push({ item: 'size', kind: 'selection', reported: sizeMm, rounded: null, limit: 'within a size range of the specification', verdict: 'does-not-conform', note: `${sizeMm} mm is outside every size range for ${input.form}`, source: 'specification', confidence: 'secondary' });
    }
  }
  for (const limit of chosen?.limits ?? []) {
    const raw = input.mechanical[limit.property];
    const label = mechanicalLabels[limit.property];
    if (raw === undefined) {
      items.push({ item: label, kind: 'mechanical', reported: null, rounded: null, limit: limitText(limit.min), verdict: 'missing', note: 'not reported', ...sourceFields(chosen!.source) });
      continue;
    }
    const value = readMechanicalValue(raw);
    const { rounded, conforms } = judge(value, limit.min);
    items.push({ item: label, kind: 'mechanical', reported: value, rounded, limit: limitText(limit.min), verdict: conforms ? 'conforms' : 'does-not-conform', ...sourceFields(chosen!.source) });
  }

  const derived: Evaluation['derived'] = {};
  if (specification.family === 'titanium-unalloyed' || specification.family === 'titanium-alloy') {
    if (specification.family === 'titanium-unalloyed') derived.oxygenEquivalent = oxygenEquivalent(chemistry);
    derived.aluminiumEquivalent = aluminiumEquivalent(chemistry);
    derived.molybdenumEquivalentBania = molybdenumEquivalentBania(chemistry);
    derived.molybdenumEquivalentBoyer = molybdenumEquivalentBoyer(chemistry);
    const classified = alloyClass(derived.molybdenumEquivalentBania.value);
    derived.alloyClass = classified.alloyClass;
    derived.alloyClassRule = classified.rule;
  }

  const verdict = items.some((item) => item.verdict === 'does-not-conform') ? 'does-not-conform' : items.some((item) => item.verdict === 'missing') ? 'incomplete' : 'conforms';
  return { verdict, items, derived, flags, spec: { id: specification.id, revision: specification.revision, edition: specification.edition, grade: grade.grade }, caution: limitCaution };
}
