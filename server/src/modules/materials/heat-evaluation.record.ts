import type { EntityManager } from 'typeorm';
import { contentHash } from '@shared/domain/signatures';
import { reasonLabels, verdictLabels } from '@shared/schemas/evaluation';
import { sha256Hex } from '../ledger/ledger.repository';
import type { SignableContent, SignableRecordType } from '../signatures/signable-records';
import { signaturesFor } from '../signatures/signatures.repository';
import * as heats from './heats.repository';

/** What a QA approver signs to let a heat whose evaluation cannot be completed be accepted: the items and why. */
async function justificationContent(
  manager: EntityManager,
  heatId: number,
): Promise<(SignableContent & { verdict: string | null; status: string }) | null> {
  const heat = await heats.findHeat(manager, heatId);
  if (!heat) return null;
  const latest = await heats.latestEvaluation(manager, heatId);
  const evaluation = latest?.evaluation;
  const specification = `${heat.spec.id} ${heat.spec.revision}${heat.spec.grade ? ` grade ${heat.spec.grade}` : ''}`;
  return {
    title: `Evaluation of heat ${heat.heatNumber} from ${heat.supplier.name} (${specification})`,
    content: {
      heat: heat.heatNumber,
      supplier: heat.supplier.name,
      specification,
      form: `${heat.productForm} ${heat.sizeMm} mm ${heat.condition}`,
      evaluation: latest ? `evaluation ${latest.id}` : 'not evaluated',
      verdict: evaluation ? verdictLabels[evaluation.verdict] : 'not evaluated',
      cannotBeEvaluated: (evaluation?.items ?? [])
        .filter((item) => item.verdict === 'cannot-be-evaluated')
        .map(
          (item) =>
            `${item.item}: ` +
            `${item.reason ? reasonLabels[item.reason] : 'cannot be evaluated'}${item.note ? ` (${item.note})` : ''}`,
        ),
      restsOnUnverifiedLimits: evaluation?.restsOnUnverified ?? [],
    },
    authorIds: [heat.receivedById, ...(await heats.evaluatorIds(manager, heatId))],
    verdict: evaluation?.verdict ?? null,
    status: heat.status,
  };
}

/**
 * The signed justification that lets a heat be accepted although some items cannot be evaluated,
 * when it still covers the heat's current evaluation (re-recorded results need a new one).
 */
export async function currentJustification(
  manager: EntityManager,
  heatId: number,
): Promise<{ signatureId: number; manifestation: string; reason: string } | null> {
  const record = await justificationContent(manager, heatId);
  if (!record || record.verdict !== 'cannot-be-evaluated') return null;
  const hash = contentHash(record.content, sha256Hex);
  const rows = await signaturesFor(manager, heatEvaluationRecordType.type, String(heatId));
  const withdrawn = new Set(
    rows.filter((row) => row.withdraws_signature_id !== null).map((row) => String(row.withdraws_signature_id)),
  );
  const covering = rows
    .filter((row) => row.meaning === 'justified' && row.content_hash === hash && !withdrawn.has(String(row.id)))
    .at(-1);
  return covering
    ? { signatureId: Number(covering.id), manifestation: covering.signed_at_text, reason: covering.reason ?? '' }
    : null;
}

export const heatEvaluationRecordType: SignableRecordType<{ verdict: string | null; status: string }> = {
  type: 'heat-evaluation',
  label: 'heat evaluation justification',
  action: 'materials.justify',
  readAction: 'materials.read',
  meanings: ['justified', 'withdrawn'],
  async load(manager, recordId) {
    if (!/^\d{1,10}$/.test(recordId)) return null;
    return justificationContent(manager, Number(recordId));
  },
  refusal({ meaning, record }) {
    if (meaning !== 'justified') return null;
    const facts = record;
    if (facts.status === 'accepted' || facts.status === 'rejected') return `The heat is already ${facts.status}`;
    if (facts.verdict !== 'cannot-be-evaluated') {
      return facts.verdict === 'does-not-conform'
        ? 'The heat does not conform: a justification cannot cover a failed requirement'
        : 'Only an evaluation with items that cannot be evaluated needs a justification';
    }
    return null;
  },
};
