import type { EntityManager } from 'typeorm';
import type { SignableRecordType } from '../signatures/signable-records';
import { signaturesFor } from '../signatures/signatures.repository';
import { findHeat } from '../materials/heats.repository';
import { findLotWithPart } from './production-lot.repository';
import { heatNumbersIssuedTo } from './material-movements.repository';

export const heatMixingRecordId = (lotId: number, heatId: number) => `${lotId}-${heatId}`;

/** Whether a QA approver's signature (not withdrawn) allows this heat into this lot. */
export async function heatMixingApproved(manager: EntityManager, lotId: number, heatId: number): Promise<boolean> {
  const signatures = await signaturesFor(manager, 'heat-mixing', heatMixingRecordId(lotId, heatId));
  const withdrawn = new Set(
    signatures.filter((row) => row.withdraws_signature_id !== null).map((row) => String(row.withdraws_signature_id)),
  );
  return signatures.some((row) => row.meaning === 'approved' && !withdrawn.has(String(row.id)));
}

/**
 * A lot is made from one heat unless a QA approver signs that a further heat may be mixed in:
 * the signature binds the lot, its part, the heats already in it and the heat to be added.
 */
export const heatMixingRecordType: SignableRecordType<{ lotStatus: string; heatStatus: string; heatsInLot: number }> = {
  type: 'heat-mixing',
  label: 'heat mixing approval',
  action: 'heat-mixing.approve',
  readAction: 'lots.read',
  meanings: ['approved', 'withdrawn'],
  async load(manager, recordId) {
    const match = /^(\d{1,10})-(\d{1,10})$/.exec(recordId);
    if (!match) return null;
    const [lotId, heatId] = [Number(match[1]), Number(match[2])];
    const lot = await findLotWithPart(manager, lotId);
    const heat = await findHeat(manager, heatId);
    if (!lot?.part || !heat) return null;
    const already = await heatNumbersIssuedTo(manager, lotId);
    return {
      title: `Mix heat ${heat.heatNumber} into lot ${lot.lotNumber}`,
      content: {
        lot: lot.lotNumber,
        part: `${lot.part.partNumber} rev ${lot.part.revision}`,
        heatsInLot: already,
        heatToAdd:
          `${heat.heatNumber} from ${heat.supplier.name} (${heat.spec.id} ` +
          `${heat.spec.revision}${heat.spec.grade ? ` grade ${heat.spec.grade}` : ''}), ${heat.status}`,
      },
      authorIds: [lot.openedBy],
      lotStatus: lot.status,
      heatStatus: heat.status,
      heatsInLot: already.length,
    };
  },
  refusal({ meaning, record }) {
    if (meaning !== 'approved') return null;
    const facts = record;
    if (facts.lotStatus !== 'open') return `The lot is ${facts.lotStatus}; no more bar can be issued to it`;
    if (facts.heatStatus !== 'accepted')
      return `The heat is ${facts.heatStatus}; only an accepted heat can be mixed in`;
    if (facts.heatsInLot === 0) return 'The lot has no heat yet; the first heat needs no approval';
    return null;
  },
};
