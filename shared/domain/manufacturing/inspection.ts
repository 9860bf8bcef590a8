/**
 * Single sampling by attributes: inspect a sample of n units; accept when the defects found are
 * at most the acceptance number Ac, reject when they reach the rejection number Re.
 * Source: ISO 2859-1 single sampling plans (unverified: for single sampling Re = Ac + 1).
 */
export interface SamplingPlan {
  sampleSize: number;
  acceptNumber: number;
  rejectNumber: number;
}

export function samplingPlanProblem(plan: SamplingPlan): string | null {
  if (!Number.isInteger(plan.sampleSize) || plan.sampleSize < 1)
    return 'The sample size is a whole number of at least 1';
  if (!Number.isInteger(plan.acceptNumber) || plan.acceptNumber < 0)
    return 'The acceptance number is a whole number of at least 0';
  if (plan.acceptNumber >= plan.sampleSize) return 'The acceptance number must be smaller than the sample size';
  if (plan.rejectNumber !== plan.acceptNumber + 1)
    return 'In single sampling the rejection number is the acceptance number plus one';
  return null;
}

export interface InspectionVerdict {
  verdict: 'accept' | 'reject';
  why: string;
  /** When the lot is smaller than the plan's sample, every unit is inspected. */
  sampleSize: number;
}

export function inspectionVerdict(
  plan: SamplingPlan,
  lotSize: number,
  inspected: number,
  defects: number,
): InspectionVerdict {
  const required = Math.min(plan.sampleSize, lotSize);
  if (inspected < required) throw new Error(`The plan needs ${required} units inspected; ${inspected} were`);
  if (defects < 0 || defects > inspected) throw new Error('Defects found must lie between 0 and the units inspected');
  if (defects <= plan.acceptNumber)
    return {
      verdict: 'accept',
      why: `${defects} defective in ${inspected} ≤ Ac ${plan.acceptNumber}`,
      sampleSize: required,
    };
  return {
    verdict: 'reject',
    why: `${defects} defective in ${inspected} ≥ Re ${plan.rejectNumber}`,
    sampleSize: required,
  };
}
