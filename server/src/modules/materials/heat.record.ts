import type { HeatSummary } from '@shared/schemas/materials';
import type { SignableRecordType } from '../signatures/signable-records';
import { appendLedgerEvent } from '../ledger/ledger.repository';
import * as heats from './heats.repository';
import { openFindings } from './certificate-screening.service';
import { checkAnalysisOfHeat, checkAnalysisRefusal } from './check-analysis.service';
import { currentJustification } from './heat-evaluation.record';

const statusByMeaning = { accepted: 'accepted', rejected: 'rejected', quarantined: 'quarantined' } as const;

/**
 * A heat's disposition is an electronic signature by a QA reviewer on exactly this content: the
 * heat, its supplier, its specification revision, its reported results, the evaluation and the
 * certificates' hashes. Only a conforming heat from a supplier that is not disqualified can be
 * accepted.
 */
export const heatRecordType: SignableRecordType<{
  status: HeatSummary['status'];
  supplierApproval: string;
  hasCertificate: boolean;
  openFindings: string[];
  checkRefusal: string | null;
  content: { verdict: string; justification?: string };
}> = {
  type: 'heat',
  label: 'heat disposition',
  action: 'materials.disposition',
  readAction: 'materials.read',
  meanings: ['accepted', 'rejected', 'quarantined'],
  async load(manager, recordId) {
    if (!/^\d{1,10}$/.test(recordId)) return null;
    const heatId = Number(recordId);
    const heat = await heats.findHeat(manager, heatId);
    if (!heat) return null;
    const evaluation = (await heats.latestEvaluation(manager, heatId))?.evaluation;
    const justification = await currentJustification(manager, heatId);
    const certificates = await heats.heatCertificates(manager, heatId);
    const check = await checkAnalysisOfHeat(manager, heatId);
    return {
      title:
        `Heat ${heat.heatNumber} from ${heat.supplier.name} (${heat.spec.id} ` +
        `${heat.spec.revision}${heat.spec.grade ? ` grade ${heat.spec.grade}` : ''})`,
      content: {
        heat: heat.heatNumber,
        supplier: heat.supplier.name,
        specification: `${heat.spec.id} ${heat.spec.revision}${heat.spec.grade ? ` grade ${heat.spec.grade}` : ''}`,
        form: `${heat.productForm} ${heat.sizeMm} mm ${heat.condition}`,
        results: await heats.heatResults(manager, heatId),
        verdict: evaluation?.verdict ?? 'not evaluated',
        items: (evaluation?.items ?? []).map(
          (item) =>
            `${item.item}: ${item.rounded ?? '—'} ${item.verdict}${item.unverified ? ' (unverified limit)' : ''}`,
        ),
        // Added only when present, so that heats without them sign the same content as before.
        ...(evaluation?.restsOnUnverified.length ? { restsOnUnverifiedLimits: evaluation.restsOnUnverified } : {}),
        ...(justification ? { justification: `${justification.manifestation}: ${justification.reason}` } : {}),
        certificates: certificates.map((certificate) => certificate.sha256),
        // Only the checks recorded, which cannot change once the heat is dispositioned; whether a
        // rule wants one is not signed (rules change later), and a heat without checks signs the
        // same content as before checks existed.
        ...(check.analyses.length
          ? {
              checkAnalyses: check.analyses.map(
                (analysis) =>
                  `${analysis.evaluation.verdict}: ${analysis.laboratory} report ${analysis.reportReference}`,
              ),
            }
          : {}),
      },
      authorIds: [heat.receivedById, ...(await heats.evaluatorIds(manager, heatId))],
      status: heat.status,
      supplierApproval: heat.supplier.approval,
      hasCertificate: certificates.length > 0,
      openFindings: await openFindings(manager, heatId),
      checkRefusal: checkAnalysisRefusal(check),
    };
  },
  refusal({ meaning, record }) {
    const facts = record;
    if (facts.status === 'accepted' || facts.status === 'rejected') return `The heat is already ${facts.status}`;
    if (meaning === 'accepted') {
      if (facts.supplierApproval === 'disqualified') return 'Heats from a disqualified supplier cannot be accepted';
      if (!facts.hasCertificate) return 'Attach the mill certificate before accepting the heat';
      if (facts.content.verdict === 'cannot-be-evaluated' && !facts.content.justification) {
        return (
          'Some items of this heat cannot be evaluated: correct the record, or have a QA approver sign a ' +
          'justification, before accepting it'
        );
      }
      if (facts.content.verdict !== 'conforms' && facts.content.verdict !== 'cannot-be-evaluated') {
        return (
          `Only a conforming heat can be accepted; its evaluation says ` +
          `${facts.content.verdict === 'does-not-conform' ? 'does not conform' : facts.content.verdict}`
        );
      }
      if (facts.openFindings.length) {
        return (
          `Acknowledge the certificate screening finding${facts.openFindings.length > 1 ? 's' : ''} on this ` +
          `heat first (${facts.openFindings.length} open): ${facts.openFindings[0]}`
        );
      }
      if (facts.checkRefusal) return facts.checkRefusal;
    }
    return null;
  },
  async afterSign(manager, { recordId, meaning, signer, reason }) {
    const heatId = Number(recordId);
    const heat = await heats.findHeat(manager, heatId, true);
    const status = statusByMeaning[meaning as keyof typeof statusByMeaning];
    if (!heat || !status) return;
    await heats.setHeatStatus(manager, heatId, status);
    await appendLedgerEvent(manager, {
      actor: { id: signer.id, name: signer.name, role: signer.role },
      action: 'heat.dispositioned',
      entity: { type: 'heat', id: heatId },
      before: { status: heat.status },
      after: { status },
      reason,
    });
  },
};
