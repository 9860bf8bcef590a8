import { buildDigitalLink, digitalLinkSegment } from '../gs1/element-string';
import { utcOffset } from '../plant-time';

/**
 * A genealogy as an EPCIS 2.0 document in JSON-LD (GS1 EPCIS 2.0 and CBV 2.0): bar into lot and
 * lot into lot (split, merge) as TransformationEvents, a lot's release as commissioning and each
 * shipment as shipping ObjectEvents with source and destination lists. Lots are named by GS1
 * Digital Link URIs (GTIN + lot, AI 01 and 10); a heat and a bar have no GS1 key, so they are
 * named by HTTP URIs under the firm's own address, as EPCIS 2.0 allows for any identifier.
 */
export interface EpcisFacts {
  /** The firm's own address, under which its identifiers without a GS1 key live. */
  base: string;
  timeZone: string;
  lots: Array<{
    id: number;
    lotNumber: string;
    gtin: string;
    origin: 'bar' | 'split' | 'merge';
    openedAt: string;
    startQty: number;
    released: { qty: number; at: string } | null;
  }>;
  issues: Array<{ lotId: number; barTag: string; heatNumber: string; lengthMm: string; at: string }>;
  links: Array<{ parentLotId: number; childLotId: number; kind: 'split' | 'merge'; qty: number; at: string }>;
  shipments: Array<{
    id: number;
    lotId: number;
    consigneeId: number;
    qty: number;
    documentNumber: string;
    at: string;
  }>;
}

export const epcisContext = 'https://ref.gs1.org/standards/epcis/2.0.0/epcis-context.jsonld';

type EpcisEvent = Record<string, unknown>;

/** UN/ECE Recommendation 20 unit codes: H87 piece, MMT millimetre. */
const piece = 'H87';
const millimetre = 'MMT';

export function epcisDocument(facts: EpcisFacts, creationDate: Date): Record<string, unknown> {
  const base = facts.base.replace(/\/+$/, '');
  const lotById = new Map(facts.lots.map((lot) => [lot.id, lot]));
  const lotClass = (lotId: number) => {
    const lot = lotById.get(lotId)!;
    return buildDigitalLink({ gtin: lot.gtin, lot: lot.lotNumber, serial: null, expiry: null, productionDate: null });
  };
  const id = (kind: string, value: string | number) => `${base}/id/${kind}/${digitalLinkSegment(String(value))}`;
  const firm = id('party', 'firm');
  const plant = id('location', 'plant');
  const when = (at: string) => ({
    eventTime: new Date(at).toISOString(),
    eventTimeZoneOffset: utcOffset(at, facts.timeZone),
  });
  const events: Array<EpcisEvent & { eventTime: string }> = [];

  for (const lot of facts.lots.filter((candidate) => candidate.origin === 'bar')) {
    const issues = facts.issues.filter((issue) => issue.lotId === lot.id);
    events.push({
      type: 'TransformationEvent',
      eventID: id('event', `lot-${lot.id}-made`),
      ...when(issues[0]?.at ?? lot.openedAt),
      inputQuantityList: issues.map((issue) => ({
        epcClass: id('bar', issue.barTag),
        quantity: Number(issue.lengthMm),
        uom: millimetre,
      })),
      outputQuantityList: [{ epcClass: lotClass(lot.id), quantity: lot.startQty, uom: piece }],
      bizStep: 'creating_class_instance',
      readPoint: { id: plant },
      ilmd: { 'cbvmda:lotNumber': lot.lotNumber },
      'ingotrace:heats': [...new Set(issues.map((issue) => issue.heatNumber))],
    });
  }
  const childLots = [...new Set(facts.links.map((link) => link.childLotId))].filter((lotId) => lotById.has(lotId));
  for (const child of childLots) {
    const links = facts.links.filter((link) => link.childLotId === child && lotById.has(link.parentLotId));
    if (!links.length) continue;
    events.push({
      type: 'TransformationEvent',
      eventID: id('event', `lot-${child}-${links[0]!.kind}`),
      ...when(links[0]!.at),
      inputQuantityList: links.map((link) => ({
        epcClass: lotClass(link.parentLotId),
        quantity: link.qty,
        uom: piece,
      })),
      outputQuantityList: [
        { epcClass: lotClass(child), quantity: links.reduce((sum, link) => sum + link.qty, 0), uom: piece },
      ],
      // One transformation per child lot; a split's parts share the parent's transformation ID.
      transformationID: id(
        'transformation',
        links[0]!.kind === 'split' ? `split-of-${links[0]!.parentLotId}` : `merge-into-${child}`,
      ),
      bizStep: 'creating_class_instance',
      readPoint: { id: plant },
    });
  }
  for (const lot of facts.lots.filter((candidate) => candidate.released)) {
    events.push({
      type: 'ObjectEvent',
      eventID: id('event', `lot-${lot.id}-released`),
      ...when(lot.released!.at),
      epcList: [],
      quantityList: [{ epcClass: lotClass(lot.id), quantity: lot.released!.qty, uom: piece }],
      action: 'ADD',
      bizStep: 'commissioning',
      disposition: 'active',
      readPoint: { id: plant },
      bizLocation: { id: plant },
    });
  }
  for (const shipment of facts.shipments.filter((candidate) => lotById.has(candidate.lotId))) {
    events.push({
      type: 'ObjectEvent',
      eventID: id('event', `shipment-${shipment.id}`),
      ...when(shipment.at),
      epcList: [],
      quantityList: [{ epcClass: lotClass(shipment.lotId), quantity: shipment.qty, uom: piece }],
      action: 'OBSERVE',
      bizStep: 'shipping',
      disposition: 'in_transit',
      readPoint: { id: plant },
      bizTransactionList: [{ type: 'desadv', bizTransaction: id('despatch-advice', shipment.documentNumber) }],
      sourceList: [
        { type: 'owning_party', source: firm },
        { type: 'location', source: plant },
      ],
      destinationList: [{ type: 'owning_party', destination: id('party', `consignee-${shipment.consigneeId}`) }],
    });
  }
  events.sort((a, b) => a.eventTime.localeCompare(b.eventTime));
  return {
    '@context': [epcisContext, { ingotrace: `${base}/ns/` }],
    type: 'EPCISDocument',
    schemaVersion: '2.0',
    creationDate: creationDate.toISOString(),
    epcisBody: { eventList: events },
  };
}
