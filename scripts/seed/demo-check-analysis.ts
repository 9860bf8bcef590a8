import type { DataSource } from 'typeorm';
import { checkAnalysisInputSchema, checkRuleInputSchema } from '../../shared/schemas/check-analysis';
import type { Person } from '@shared/schemas/people';
import {
  heatsAwaitingCheck,
  recordCheckAnalysis,
  setCheckRule,
} from '../../server/src/modules/materials/check-analysis.service';

const origin = { requestId: 'demo-seed', clientAddress: null };

/**
 * The plant's check analysis rules, introduced after the accepted history: every heat from a
 * conditionally approved mill, and every third F136 heat from the mill whose certificates were
 * found copied. The first heat this selects from that mill has its check recorded (oxygen within
 * the product-analysis tolerance, not within the heat limit); the rest wait for their checks.
 */
export async function seedDemoCheckAnalysis(
  dataSource: DataSource,
  suppliers: { castellane: number },
  approver: Person,
  engineer: Person,
): Promise<void> {
  const approverActor = { id: approver.id, name: approver.name, role: 'qa-approver' };
  await setCheckRule(
    dataSource,
    checkRuleInputSchema.parse({
      supplierId: null,
      specId: null,
      everyNthHeat: null,
      everyHeatWhenConditional: true,
      reason: 'Supplier control procedure: every heat from a conditionally approved mill gets our own check analysis',
    }),
    approver,
    approverActor,
    origin,
  );
  await setCheckRule(
    dataSource,
    checkRuleInputSchema.parse({
      supplierId: suppliers.castellane,
      specId: 'ASTM F136',
      everyNthHeat: 3,
      everyHeatWhenConditional: true,
      reason: 'Tightened after two certificates with identical results (CS-7790, CS-7802)',
    }),
    approver,
    approverActor,
    origin,
  );
  const first = (await heatsAwaitingCheck(dataSource.manager)).find(
    (heat) => heat.supplier === 'Castellane Special Metals',
  );
  if (!first) return;
  await recordCheckAnalysis(
    dataSource,
    first.heatId,
    checkAnalysisInputSchema.parse({
      laboratory: 'Tarnbridge materials laboratory',
      reportReference: `TML-${first.heatNumber}`,
      chemistry: { Al: '6.02', V: '4.05', Fe: '0.21', O: '0.14', N: '0.012', H: '52 ppm' },
    }),
    engineer,
    { id: engineer.id, name: engineer.name, role: 'manufacturing-engineer' },
    origin,
  );
}
