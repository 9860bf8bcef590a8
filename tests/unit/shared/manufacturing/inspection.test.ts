import { describe, expect, it } from 'vitest';
import { inspectionVerdict, samplingPlanProblem } from '@shared/domain/manufacturing/inspection';

// Single sampling by attributes as in ISO 2859-1 (unverified: accept at ≤ Ac, reject at ≥ Re = Ac + 1).
describe('inspection verdicts from a sampling plan', () => {
  const plan = { sampleSize: 32, acceptNumber: 1, rejectNumber: 2 };
  it('when 1 defective is found in 32 with Ac 1, then the lot is accepted; 2 defectives reject it', () => {
    expect(inspectionVerdict(plan, 500, 32, 1)).toEqual({
      verdict: 'accept',
      why: '1 defective in 32 ≤ Ac 1',
      sampleSize: 32,
    });
    expect(inspectionVerdict(plan, 500, 32, 2).verdict).toBe('reject');
  });
  it('when the lot is smaller than the sample, then every unit is inspected', () => {
    expect(inspectionVerdict(plan, 20, 20, 0).sampleSize).toBe(20);
    expect(() => inspectionVerdict(plan, 20, 19, 0)).toThrow('The plan needs 20 units inspected; 19 were');
  });
  it('when a plan is inconsistent, then it is refused', () => {
    expect(samplingPlanProblem({ sampleSize: 32, acceptNumber: 1, rejectNumber: 3 })).toBe(
      'In single sampling the rejection number is the acceptance number plus one',
    );
    expect(samplingPlanProblem({ sampleSize: 2, acceptNumber: 2, rejectNumber: 3 })).toBe(
      'The acceptance number must be smaller than the sample size',
    );
    expect(samplingPlanProblem(plan)).toBeNull();
  });
});
