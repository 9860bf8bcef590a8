import type { EntityManager } from 'typeorm';
import { insertReturningId } from '../../db/insert-returning-id';
import { CheckAnalysis } from './entities/check-analysis.entity';
import { CheckAnalysisRule } from './entities/check-analysis-rule.entity';

export interface RuleRow {
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

export interface AnalysisRow {
  id: number;
  laboratory: string;
  report_reference: string;
  results_json: string;
  evaluation_json: string;
  recorded_by_name: string;
  recorded_at: Date;
}

export async function insertRule(
  manager: EntityManager,
  rule: Pick<
    CheckAnalysisRule,
    'supplierId' | 'specId' | 'everyNthHeat' | 'everyHeatWhenConditional' | 'reason' | 'setBy'
  >,
): Promise<number> {
  return insertReturningId(manager, CheckAnalysisRule, rule);
}

export async function insertCheckAnalysis(
  manager: EntityManager,
  analysis: Pick<
    CheckAnalysis,
    'heatId' | 'laboratory' | 'reportReference' | 'resultsJson' | 'evaluationJson' | 'verdict' | 'recordedBy'
  >,
): Promise<number> {
  return insertReturningId(manager, CheckAnalysis, analysis);
}

/** The latest rule set for each scope (supplier and specification, either may be any). */
export function latestRuleRows(manager: EntityManager): Promise<RuleRow[]> {
  return manager.query(
    `SELECT r.id, r.supplier_id, s.name AS supplier_name, r.spec_id, r.every_nth_heat,
        r.every_heat_when_conditional, r.reason, p.name AS set_by_name, r.set_at
       FROM check_analysis_rule r JOIN person p ON p.id = r.set_by LEFT JOIN supplier s ON s.id = r.supplier_id
      WHERE r.id IN (SELECT MAX(id) FROM check_analysis_rule GROUP BY supplier_id, spec_id)
      ORDER BY r.supplier_id IS NOT NULL, s.name, r.spec_id IS NOT NULL, r.spec_id`,
  );
}

/** The check analyses recorded on a heat, newest first. */
export function analysisRowsOfHeat(manager: EntityManager, heatId: number): Promise<AnalysisRow[]> {
  return manager.query(
    `SELECT c.id, c.laboratory, c.report_reference, c.results_json, c.evaluation_json, p.name AS recorded_by_name,
        c.recorded_at
       FROM check_analysis c JOIN person p ON p.id = c.recorded_by WHERE c.heat_id = ? ORDER BY c.id DESC`,
    [heatId],
  );
}

/** How many heats of the supplier under the specification came before this one, with it. */
export function heatPosition(
  manager: EntityManager,
  supplierId: number,
  specId: string,
  heatId: number,
): Promise<Array<{ position: string }>> {
  return manager.query('SELECT COUNT(*) AS position FROM heat WHERE supplier_id = ? AND spec_id = ? AND id <= ?', [
    supplierId,
    specId,
    heatId,
  ]);
}

/** Every heat with its supplier's approval and whether a check analysis is recorded, oldest first. */
export function heatsWithCheckState(manager: EntityManager): Promise<
  Array<{
    id: number;
    heat_number: string;
    supplier_id: number;
    supplier_name: string;
    approval: 'approved' | 'conditional' | 'disqualified';
    spec_id: string;
    status: string;
    received_at: Date;
    checked: number;
  }>
> {
  return manager.query(
    `SELECT h.id, h.heat_number, h.supplier_id, s.name AS supplier_name, s.approval, h.spec_id, h.status, h.received_at,
              EXISTS (SELECT 1 FROM check_analysis c WHERE c.heat_id = h.id) AS checked
         FROM heat h JOIN supplier s ON s.id = h.supplier_id ORDER BY h.id`,
  );
}
