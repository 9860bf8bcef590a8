import { materialFamilyLabels, type MaterialFamily } from '../materials/specification';
import type { ProcessMethod } from './process-methods';

/** A firm's own validation of a method for a material outside the method's published scope. */
export interface FirmMethodValidation {
  methodId: string;
  family: MaterialFamily;
  reference: string;
}

/**
 * Whether a method may treat parts of the given materials: each family must be in the method's
 * own scope or covered by the firm's recorded validation of that method for it. Returns the
 * families that are neither (empty when the method may be used).
 */
export function familiesOutsideScope(
  method: ProcessMethod,
  families: readonly MaterialFamily[],
  validations: readonly FirmMethodValidation[],
): MaterialFamily[] {
  return [...new Set(families)].filter(
    (family) =>
      !method.materialScope.families.includes(family) &&
      !validations.some((validation) => validation.methodId === method.id && validation.family === family),
  );
}

/** The sentence shown when a method is refused for a material. */
export function outsideScopeMessage(
  method: ProcessMethod,
  outside: readonly MaterialFamily[],
  subject: string,
): string {
  const names = outside.map((family) => materialFamilyLabels[family].toLowerCase()).join(' and ');
  const covered = method.materialScope.families.map((family) => materialFamilyLabels[family].toLowerCase()).join(', ');
  return (
    `${subject} is ${names}; ${method.id}'s scope covers ${covered}. Use a method whose scope covers it, or ` +
    `have QA record the firm's own validation of ${method.id} for ${names}.`
  );
}
