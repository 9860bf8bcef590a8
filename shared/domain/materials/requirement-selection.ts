import type { CannotEvaluateReason } from '../../schemas/evaluation';
import { compareDecimal } from './e29-rounding';
import {
  conditionOf,
  productConditionLabels,
  scopeOf,
  type MechanicalSet,
  type ProductCondition,
  type ProductForm,
  type Specification,
  type SpecificationGrade,
} from './specification';

export type MechanicalSelection =
  { kind: 'chosen'; set: MechanicalSet } | { kind: 'none'; reason: CannotEvaluateReason; wanted: string; note: string };

function inSize(set: MechanicalSet, sizeMm: string): boolean {
  if (!set.size) return true;
  const from = compareDecimal(sizeMm, set.size.fromMm);
  if (!(set.size.fromInclusive ? from >= 0 : from > 0)) return false;
  if (set.size.toMm === undefined) return true;
  const to = compareDecimal(sizeMm, set.size.toMm);
  return set.size.toInclusive ? to <= 0 : to < 0;
}

/**
 * Picks the one mechanical requirement set that applies to a heat's form, condition and size.
 * Conditions are compared as controlled values, never as free text. When none applies, says why:
 * nothing is ever skipped silently.
 */
export function chooseMechanicalSet(
  specification: Specification,
  grade: SpecificationGrade,
  heat: { form: ProductForm; condition: ProductCondition; sizeMm: string | null },
): MechanicalSelection {
  const conditionLabel = productConditionLabels[heat.condition].toLowerCase();
  const wanted = `${heat.form}, ${conditionLabel}${heat.sizeMm ? `, ${heat.sizeMm} mm` : ''}`;
  const where = `${specification.id} revision ${specification.revision}`;
  const scope = scopeOf(specification);
  if (!scope.forms.includes(heat.form))
    return {
      kind: 'none',
      reason: 'no-requirement',
      wanted,
      note: `${heat.form} is not a product form ${where} covers`,
    };
  if (!scope.conditions.includes(heat.condition))
    return {
      kind: 'none',
      reason: 'no-requirement',
      wanted,
      note: `${conditionLabel} is not a condition ${where} covers`,
    };
  if (!grade.mechanical.length)
    return {
      kind: 'none',
      reason: 'no-requirement',
      wanted,
      note: `${where} holds no mechanical requirements${grade.grade ? ` for grade ${grade.grade}` : ''}`,
    };
  const sets = grade.mechanical.filter(
    (set) => set.forms.includes(heat.form) && conditionOf(set.condition) === heat.condition,
  );
  if (!sets.length)
    return {
      kind: 'none',
      reason: 'no-requirement',
      wanted,
      note: `${where} holds no mechanical requirements for ${heat.form} in the ${conditionLabel} condition`,
    };
  if (sets.some((set) => set.size) && heat.sizeMm === null)
    return {
      kind: 'none',
      reason: 'missing-value',
      wanted: 'diameter or thickness in mm',
      note: 'the mechanical minima depend on size',
    };
  const chosen = sets.find((set) => heat.sizeMm === null || inSize(set, heat.sizeMm));
  if (!chosen)
    return {
      kind: 'none',
      reason: 'no-requirement',
      wanted,
      note: `${heat.sizeMm} mm is outside every size range ${where} gives for ${heat.form}, ${conditionLabel}`,
    };
  return { kind: 'chosen', set: chosen };
}
