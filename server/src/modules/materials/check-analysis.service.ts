import type { z } from 'zod';
// The independent check analysis in the running product: sampling rules in force, which heats
// they select, the check results entered and their evaluation (pure functions in shared/).
import type { DataSource, EntityManager } from 'typeorm';
import {
  applicableRule,
  CheckAnalysisInputError,
  checkFailureText,
  checkLimitsOf,
  checkRequirement,
  evaluateCheckAnalysis,
  type CheckEvaluation,
} from '@shared/domain/materials/check-analysis';
import {
  checkAnalysisInputSchema,
  checkRuleInputSchema,
  type CheckRuleView,
  type HeatAwaitingCheck,
  type HeatCheckAnalysis,
} from '@shared/schemas/check-analysis';
import type { Person } from '@shared/schemas/people';
import { AppError } from '../../errors';
import { inTransaction } from '../../db/transaction';
import { appendLedgerEvent, type Actor, type RequestOrigin } from '../ledger/ledger.repository';
import * as heats from './heats.repository';
import { currentSpecifications, storedSpecification } from './specification-library.repository';
import { findSupplier } from './suppliers.repository';
import {
  analysisRowsOfHeat,
  heatPosition,
  heatsWithCheckState,
  insertCheckAnalysis,
  insertRule,
  latestRuleRows,
} from './check-analysis.repository';

/** The rule in force for each scope: the latest row set for it. */
export async function currentRules(manager: EntityManager): Promise<CheckRuleView[]> {
  const rows = await latestRuleRows(manager);
  return rows.map((row) => ({
    id: row.id,
    supplierId: row.supplier_id,
    supplierName: row.supplier_name,
    specId: row.spec_id,
    everyNthHeat: row.every_nth_heat,
    everyHeatWhenConditional: Boolean(row.every_heat_when_conditional),
    reason: row.reason,
    setBy: row.set_by_name,
    setAt: new Date(row.set_at).toISOString(),
  }));
}

/** Sets the rule for a scope (a new row; the previous one stays as history). */
export async function setCheckRule(
  dataSource: DataSource,
  input: z.output<typeof checkRuleInputSchema>,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
): Promise<CheckRuleView[]> {
  return inTransaction(dataSource, async (manager) => {
    if (input.supplierId !== null && !(await findSupplier(manager, input.supplierId)))
      throw AppError.rule('Choose a registered supplier, or none for every supplier', {
        supplierId: 'Unknown supplier',
      });
    let specId: string | null = null;
    if (input.specId !== null) {
      const specification = (await currentSpecifications(manager)).find(
        (candidate) => candidate.id.toUpperCase() === input.specId!.toUpperCase(),
      );
      if (!specification)
        throw AppError.rule(`Unknown specification ${input.specId}`, { specId: 'Not in the specification library' });
      specId = specification.id;
    }
    const before =
      (await currentRules(manager)).find((rule) => rule.supplierId === input.supplierId && rule.specId === specId) ??
      null;
    const ruleId = await insertRule(manager, {
      supplierId: input.supplierId,
      specId,
      everyNthHeat: input.everyNthHeat,
      everyHeatWhenConditional: input.everyHeatWhenConditional,
      reason: input.reason,
      setBy: person.id,
    });
    await appendLedgerEvent(manager, {
      actor,
      action: 'check-analysis-rule.set',
      entity: { type: 'check-analysis-rule', id: ruleId },
      before: before
        ? { everyNthHeat: before.everyNthHeat, everyHeatWhenConditional: before.everyHeatWhenConditional }
        : null,
      after: {
        supplierId: input.supplierId,
        specId,
        everyNthHeat: input.everyNthHeat,
        everyHeatWhenConditional: input.everyHeatWhenConditional,
      },
      reason: input.reason,
      origin,
    });
    return currentRules(manager);
  });
}

async function analysesOf(manager: EntityManager, heatId: number): Promise<HeatCheckAnalysis['analyses']> {
  const rows = await analysisRowsOfHeat(manager, heatId);
  return rows.map((row) => ({
    id: row.id,
    laboratory: row.laboratory,
    reportReference: row.report_reference,
    results: JSON.parse(row.results_json) as Record<string, string>,
    evaluation: JSON.parse(row.evaluation_json) as CheckEvaluation,
    recordedBy: row.recorded_by_name,
    recordedAt: new Date(row.recorded_at).toISOString(),
  }));
}

async function gradeChemistry(manager: EntityManager, heat: NonNullable<Awaited<ReturnType<typeof heats.findHeat>>>) {
  const specification = await storedSpecification(manager, heat.spec.id, heat.spec.revision);
  const grade =
    specification?.grades.find((candidate) => candidate.grade === heat.spec.grade) ?? specification?.grades[0];
  if (!grade) throw new Error(`specification ${heat.spec.id} ${heat.spec.revision} is missing`);
  return grade.chemistry;
}

/** Whether a heat needs a check analysis, why, and the checks recorded for it (latest first; the latest counts). */
export async function checkAnalysisOfHeat(manager: EntityManager, heatId: number): Promise<HeatCheckAnalysis> {
  const heat = await heats.findHeat(manager, heatId);
  if (!heat) throw AppError.notFound('Heat');
  const [counted] = await heatPosition(manager, heat.supplier.id, heat.spec.id, heatId);
  const position = Number(counted!.position);
  const rule = applicableRule(await currentRules(manager), heat.supplier.id, heat.spec.id);
  const requirement = checkRequirement(rule, position, heat.supplier.approval);
  const analyses = await analysesOf(manager, heatId);
  const chemistry = await gradeChemistry(manager, heat);
  const latest = analyses[0];
  return {
    status: latest ? latest.evaluation.verdict : requirement.required ? 'awaiting' : 'not-required',
    required: requirement.required,
    why: requirement.why,
    position,
    rule,
    elements: checkLimitsOf(chemistry),
    analyses,
  };
}

/** Why the heat cannot be accepted for its check analysis, or null. */
export function checkAnalysisRefusal(check: HeatCheckAnalysis): string | null {
  if (check.status === 'awaiting')
    return `A check analysis of this heat is due (${check.why}); record its results before accepting the heat`;
  if (check.status === 'does-not-conform')
    return (
      `The latest check analysis does not conform (${checkFailureText(check.analyses[0]!.evaluation)}); the ` +
      `heat cannot be accepted`
    );
  return null;
}

/** Stores a check analysis of a heat with its evaluation against the widened limits. */
export async function recordCheckAnalysis(
  dataSource: DataSource,
  heatId: number,
  input: z.output<typeof checkAnalysisInputSchema>,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
): Promise<HeatCheckAnalysis> {
  return inTransaction(dataSource, async (manager) => {
    const heat = await heats.findHeat(manager, heatId, true);
    if (!heat) throw AppError.notFound('Heat');
    if (heat.status === 'accepted' || heat.status === 'rejected')
      throw AppError.rule(`The heat is already ${heat.status}; a check analysis can no longer change its disposition`, {
        chemistry: 'Dispositioned heat',
      });
    const results = Object.fromEntries(
      Object.entries(input.chemistry).map(([element, value]) => [element, String(value).trim()]),
    );
    let evaluation: CheckEvaluation;
    try {
      evaluation = evaluateCheckAnalysis(await gradeChemistry(manager, heat), results);
    } catch (error) {
      if (error instanceof CheckAnalysisInputError)
        throw new AppError('VALIDATION_FAILED', error.message, error.fields);
      throw error;
    }
    const checkAnalysisId = await insertCheckAnalysis(manager, {
      heatId,
      laboratory: input.laboratory,
      reportReference: input.reportReference,
      resultsJson: JSON.stringify(results),
      evaluationJson: JSON.stringify(evaluation),
      verdict: evaluation.verdict,
      recordedBy: person.id,
    });
    await appendLedgerEvent(manager, {
      actor,
      action: 'heat.check-analysis-recorded',
      entity: { type: 'heat', id: heatId },
      after: {
        checkAnalysisId,
        laboratory: input.laboratory,
        reportReference: input.reportReference,
        results,
        verdict: evaluation.verdict,
        beyondTolerance: checkFailureText(evaluation) || null,
      },
      origin,
    });
    return checkAnalysisOfHeat(manager, heatId);
  });
}

/** Heats not yet accepted or rejected whose check analysis is due and not recorded, oldest first. */
export async function heatsAwaitingCheck(manager: EntityManager): Promise<HeatAwaitingCheck[]> {
  const rows = await heatsWithCheckState(manager);
  const rules = await currentRules(manager);
  const positions = new Map<string, number>();
  const awaiting: HeatAwaitingCheck[] = [];
  for (const row of rows) {
    const key = `${row.supplier_id} ${row.spec_id}`;
    const position = (positions.get(key) ?? 0) + 1;
    positions.set(key, position);
    if (row.status === 'accepted' || row.status === 'rejected' || Number(row.checked)) continue;
    const requirement = checkRequirement(applicableRule(rules, row.supplier_id, row.spec_id), position, row.approval);
    if (requirement.required) {
      awaiting.push({
        heatId: row.id,
        heatNumber: row.heat_number,
        supplier: row.supplier_name,
        specId: row.spec_id,
        receivedAt: new Date(row.received_at).toISOString(),
        why: requirement.why,
      });
    }
  }
  return awaiting;
}
