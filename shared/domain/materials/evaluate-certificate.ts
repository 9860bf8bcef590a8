import {
  certificateInputSchema,
  type CannotEvaluateReason,
  type CertificateInput,
  type Evaluation,
  type EvaluationFlag,
  type EvaluationItem,
  type ParsedCertificateInput,
} from '../../schemas/evaluation';
import { DecimalE29, toDecimal } from './e29-rounding';
import { findSpecification } from './library';
import { conformsAbsolutely, judgeAgainstLimits } from './limit-judgement';
import { plausibilityFlags } from './plausibility';
import { readChemistryValue, readMechanicalValue, ReportedValueError } from './reported-value';
import { chooseMechanicalSet } from './requirement-selection';
import {
  limitCaution,
  mechanicalLabels,
  mechanicalProperties,
  productConditionLabels,
  type Specification,
  type SpecificationGrade,
  type ValueSource,
} from './specification';
import { titaniumIndices } from './titanium-indices';

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

interface LimitUnderTest {
  min?: string;
  max?: string;
  source: ValueSource;
  writtenFormUnverified?: boolean;
}

/**
 * Judges one reported value against one limit: E29 rounding to each limit's own place; when the
 * limit's written form is unverified and rounding at the stored place decides differently from no
 * rounding at all (the finest place the standard could write), no verdict is given.
 */
function judgedItem(
  base: Pick<EvaluationItem, 'item' | 'kind'>,
  value: string,
  limit: LimitUnderTest,
  note?: string,
): EvaluationItem {
  const judgement = judgeAgainstLimits(value, limit.min, limit.max);
  const unverified = limit.source.confidence === 'unconfirmed' || limit.writtenFormUnverified === true;
  const common = {
    ...base,
    reported: value,
    rounded: judgement.rounded,
    limit: limitText(limit.min, limit.max),
    source: limit.source.reference,
    confidence: limit.source.confidence,
    unverified,
  };
  if (limit.writtenFormUnverified && conformsAbsolutely(value, limit.min, limit.max) !== judgement.conforms) {
    const written =
      limit.min !== undefined && judgement.atMin !== undefined && judgement.rounded === judgement.atMin
        ? limit.min
        : (limit.max ?? limit.min)!;
    return {
      ...common,
      verdict: 'cannot-be-evaluated',
      reason: 'unverified-written-form',
      note:
        `${judgement.conforms ? 'Conforms' : 'Does not conform'} when the limit is written ${written}, but ` +
        `${judgement.conforms ? 'not' : 'does'} if the standard writes it to more decimals: check your ` +
        `licensed copy`,
    };
  }
  return { ...common, verdict: judgement.conforms ? 'conforms' : 'does-not-conform', ...(note ? { note } : {}) };
}

function cannotEvaluate(
  base: Pick<EvaluationItem, 'item' | 'kind' | 'limit'>,
  reason: CannotEvaluateReason,
  note: string,
  source: ValueSource,
  reported: string | null = null,
): EvaluationItem {
  return {
    ...base,
    reported,
    rounded: null,
    verdict: 'cannot-be-evaluated',
    reason,
    note,
    source: source.reference,
    confidence: source.confidence,
    unverified: source.confidence === 'unconfirmed',
  };
}

function chooseGrade(specification: Specification, grade: string | null): SpecificationGrade {
  if (specification.grades.length === 1) return specification.grades[0]!;
  const found = specification.grades.find((candidate) => candidate.grade === grade);
  if (!found) {
    const grades = specification.grades.map((candidate) => candidate.grade).join(', ');
    throw new EvaluationInputError(`${specification.id} needs a grade: one of ${grades}`, {
      grade: `One of ${grades}`,
    });
  }
  return found;
}

function readChemistry(
  input: ParsedCertificateInput,
): Record<string, { value: string; asReported: string; conversion?: string | null }> {
  const chemistry: Record<string, { value: string; asReported: string; conversion?: string | null }> = {};
  for (const [element, value] of Object.entries(input.chemistry)) {
    try {
      chemistry[element] = readChemistryValue(value);
    } catch (error) {
      if (error instanceof ReportedValueError)
        throw new EvaluationInputError(error.message, { [`chemistry.${element}`]: error.message });
      throw error;
    }
  }
  return chemistry;
}

/**
 * Evaluates a certificate's reported results against a specification, item by item, with the
 * ASTM E29 rounding method. Pure: no database, no clock.
 */
export function evaluateCertificate(raw: CertificateInput): Evaluation {
  const parsed = certificateInputSchema.safeParse(raw);
  if (!parsed.success) {
    const fields = Object.fromEntries(
      parsed.error.issues.map((issue) => [issue.path.join('.') || '(input)', issue.message]),
    );
    throw new EvaluationInputError('The certificate input is not valid', fields);
  }
  const specification = findSpecification(parsed.data.spec);
  if (!specification)
    throw new EvaluationInputError(`Unknown specification "${parsed.data.spec}"`, {
      spec: 'Not in the specification library',
    });
  return evaluateAgainst(specification, parsed.data);
}

function chemistryItems(
  specification: Specification,
  grade: SpecificationGrade,
  chemistry: ReturnType<typeof readChemistry>,
  flags: EvaluationFlag[],
): EvaluationItem[] {
  const items: EvaluationItem[] = [];
  for (const limit of grade.chemistry) {
    const reported = chemistry[limit.element];
    if (!reported) {
      items.push(
        cannotEvaluate(
          { item: limit.element, kind: 'chemistry', limit: limitText(limit.min, limit.max) },
          'missing-value',
          'not reported',
          limit.source,
        ),
      );
      continue;
    }
    items.push(
      judgedItem({ item: limit.element, kind: 'chemistry' }, reported.value, limit, reported.conversion ?? undefined),
    );
    flags.push(...plausibilityFlags(limit, reported.value, reported.asReported));
  }
  for (const element of Object.keys(chemistry)) {
    if (!grade.chemistry.some((limit) => limit.element === element)) {
      flags.push({
        kind: 'not-in-specification',
        item: element,
        message: `${element} is reported but ${specification.id} sets no limit for it`,
      });
    }
  }
  for (const requirement of grade.weightedSums) {
    const missing = requirement.terms
      .filter((term) => chemistry[term.element] === undefined)
      .map((term) => term.element);
    if (missing.length) {
      items.push(
        cannotEvaluate(
          { item: requirement.label, kind: 'requirement', limit: limitText(requirement.min, requirement.max) },
          'missing-value',
          `needs ${missing.join(', ')}`,
          requirement.source,
        ),
      );
      continue;
    }
    const total = requirement.terms.reduce(
      (sum, term) => sum.plus(toDecimal(chemistry[term.element]!.value).times(term.factor)),
      new DecimalE29(0),
    );
    items.push(judgedItem({ item: requirement.label, kind: 'requirement' }, total.toFixed(), requirement));
  }
  return items;
}

/** The size as a plain decimal (12.700 → 12.7), or null. */
function sizeOf(input: ParsedCertificateInput): string | null {
  return input.sizeMm === null || input.sizeMm === undefined
    ? null
    : toDecimal(readMechanicalValue(input.sizeMm)).toFixed();
}

function mechanicalItems(
  specification: Specification,
  grade: SpecificationGrade,
  input: ParsedCertificateInput,
): EvaluationItem[] {
  const sizeMm = sizeOf(input);
  const selection = chooseMechanicalSet(specification, grade, { form: input.form, condition: input.condition, sizeMm });
  if (selection.kind !== 'chosen') {
    const selectionSource: ValueSource = {
      reference: `${specification.id} revision ${specification.revision} in the library`,
      confidence: 'secondary',
    };
    return [
      cannotEvaluate(
        { item: 'Mechanical requirements', kind: 'selection', limit: selection.wanted },
        selection.reason,
        selection.note,
        selectionSource,
      ),
    ];
  }
  const set = selection.set;
  const required =
    grade.mechanicalProperties ??
    mechanicalProperties.filter((property) =>
      grade.mechanical.some((candidate) => candidate.limits.some((limit) => limit.property === property)),
    );
  const items: EvaluationItem[] = [];
  for (const property of required) {
    const label = mechanicalLabels[property];
    const limit = set.limits.find((candidate) => candidate.property === property);
    if (!limit) {
      if (set.notRequired?.some((entry) => entry.property === property)) continue;
      items.push(
        cannotEvaluate(
          { item: label, kind: 'mechanical', limit: 'no requirement in the library' },
          'no-requirement',
          `${specification.id} ${specification.revision} gives no ${label.toLowerCase()} minimum for ` +
            `${input.form}, ${productConditionLabels[input.condition].toLowerCase()}${sizeMm ? `, ${sizeMm} mm` : ''}`,
          set.source,
        ),
      );
      continue;
    }
    const raw = input.mechanical[property];
    if (raw === undefined) {
      items.push(
        cannotEvaluate(
          { item: label, kind: 'mechanical', limit: limitText(limit.min) },
          'missing-value',
          'not reported',
          set.source,
        ),
      );
      continue;
    }
    items.push(
      judgedItem({ item: label, kind: 'mechanical' }, readMechanicalValue(raw), {
        min: limit.min,
        source: set.source,
        ...(limit.writtenFormUnverified ? { writtenFormUnverified: true } : {}),
      }),
    );
  }
  return items;
}

/** Does not conform if any item does not; else cannot be evaluated if any item cannot; else conforms. */
export function overallVerdict(items: readonly Pick<EvaluationItem, 'verdict'>[]): Evaluation['verdict'] {
  if (items.some((item) => item.verdict === 'does-not-conform')) return 'does-not-conform';
  if (items.some((item) => item.verdict === 'cannot-be-evaluated')) return 'cannot-be-evaluated';
  return 'conforms';
}

/** Evaluates parsed input against a given specification revision (e.g. the one a heat was bought to). */
export function evaluateAgainst(specification: Specification, input: ParsedCertificateInput): Evaluation {
  const grade = chooseGrade(
    specification,
    input.grade === null || input.grade === undefined ? null : String(input.grade),
  );
  const flags: EvaluationFlag[] = [];
  const chemistry = readChemistry(input);
  const items = [
    ...chemistryItems(specification, grade, chemistry, flags),
    ...mechanicalItems(specification, grade, input),
  ];
  const values = Object.fromEntries(Object.entries(chemistry).map(([element, reported]) => [element, reported.value]));
  const sizeMm = sizeOf(input);
  return {
    verdict: overallVerdict(items),
    items,
    derived: titaniumIndices(specification.family, values),
    flags,
    spec: {
      id: specification.id,
      revision: specification.revision,
      edition: specification.edition,
      grade: grade.grade,
    },
    basis: { form: input.form, condition: input.condition, sizeMm },
    restsOnUnverified: items
      .filter((item) => item.unverified && item.verdict !== 'cannot-be-evaluated')
      .map((item) => item.item),
    caution: limitCaution,
  };
}
