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
  type CheckAnalysisInput,
  type CheckRuleInput,
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

interface RuleRow {
  id: number;
  supplier_id: number | null;
  supplier_name: string | null;
  spec_id: string | null;
  every_nth_heat: number | null;
  every_heat_when_conditional: number;
  reason: string;
  set_by_name: string;
  set_at: Date;
}

/** The rule in force for each scope: the latest row set for it. */
export async function currentRules(manager: EntityManager): Promise<CheckRuleView[]> {
  const rows: RuleRow[] = await manager.query(
    `SELECT r.id, r.supplier_id, s.name AS supplier_name, r.spec_id, r.every_nth_heat, r.every_heat_when_conditional, r.reason, p.name AS set_by_name, r.set_at
       FROM check_analysis_rule r JOIN person p ON p.id = r.set_by LEFT JOIN supplier s ON s.id = r.supplier_id
      WHERE r.id IN (SELECT MAX(id) FROM check_analysis_rule GROUP BY supplier_id, spec_id)
      ORDER BY r.supplier_id IS NOT NULL, s.name, r.spec_id IS NOT NULL, r.spec_id`,
  );
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
  raw: CheckRuleInput,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
): Promise<CheckRuleView[]> {
  const input = checkRuleInputSchema.parse(raw);
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
    const result: { insertId: number } = await manager.query(
      'INSERT INTO check_analysis_rule (supplier_id, spec_id, every_nth_heat, every_heat_when_conditional, reason, set_by) VALUES (?, ?, ?, ?, ?, ?)',
      [input.supplierId, specId, input.everyNthHeat, input.everyHeatWhenConditional ? 1 : 0, input.reason, person.id],
    );
    await appendLedgerEvent(manager, {
      actor,
      action: 'check-analysis-rule.set',
      entity: { type: 'check-analysis-rule', id: Number(result.insertId) },
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

interface AnalysisRow {
  id: number;
  laboratory: string;
  report_reference: string;
  results_json: string;
  evaluation_json: string;
  recorded_by_name: string;
  recorded_at: Date;
}

async function analysesOf(manager: EntityManager, heatId: number): Promise<HeatCheckAnalysis['analyses']> {
  const rows: AnalysisRow[] = await manager.query(
    `SELECT c.id, c.laboratory, c.report_reference, c.results_json, c.evaluation_json, p.name AS recorded_by_name, c.recorded_at
       FROM check_analysis c JOIN person p ON p.id = c.recorded_by WHERE c.heat_id = ? ORDER BY c.id DESC`,
    [heatId],
  );
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
  const [counted]: Array<{ position: string }> = await manager.query(
    'SELECT COUNT(*) AS position FROM heat WHERE supplier_id = ? AND spec_id = ? AND id <= ?',
    [heat.supplier.id, heat.spec.id, heatId],
  );
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
    return `The latest check analysis does not conform (${checkFailureText(check.analyses[0]!.evaluation)}); the heat cannot be accepted`;
  return null;
}

/** Stores a check analysis of a heat with its evaluation against the widened limits. */
export async function recordCheckAnalysis(
  dataSource: DataSource,
  heatId: number,
  raw: CheckAnalysisInput,
  person: Person,
  actor: Actor,
  origin: RequestOrigin,
): Promise<HeatCheckAnalysis> {
  const input = checkAnalysisInputSchema.parse(raw);
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
    const inserted: { insertId: number } = await manager.query(
      'INSERT INTO check_analysis (heat_id, laboratory, report_reference, results_json, evaluation_json, verdict, recorded_by) VALUES (?, ?, ?, ?, ?, ?, ?)',
      [
        heatId,
        input.laboratory,
        input.reportReference,
        JSON.stringify(results),
        JSON.stringify(evaluation),
        evaluation.verdict,
        person.id,
      ],
    );
    await appendLedgerEvent(manager, {
      actor,
      action: 'heat.check-analysis-recorded',
      entity: { type: 'heat', id: heatId },
      after: {
        checkAnalysisId: Number(inserted.insertId),
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
  const rows: Array<{
    id: number;
    heat_number: string;
    supplier_id: number;
    supplier_name: string;
    approval: 'approved' | 'conditional' | 'disqualified';
    spec_id: string;
    status: string;
    received_at: Date;
    checked: number;
  }> = await manager.query(
    `SELECT h.id, h.heat_number, h.supplier_id, s.name AS supplier_name, s.approval, h.spec_id, h.status, h.received_at,
              EXISTS (SELECT 1 FROM check_analysis c WHERE c.heat_id = h.id) AS checked
         FROM heat h JOIN supplier s ON s.id = h.supplier_id ORDER BY h.id`,
  );
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
