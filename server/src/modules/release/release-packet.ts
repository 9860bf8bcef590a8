import type { EntityManager } from 'typeorm';
import bwipjs from 'bwip-js/node';
import QRCode from 'qrcode';
import type { Content, TDocumentDefinitions } from 'pdfmake/interfaces';
import { buildDigitalLink, buildElementString } from '@shared/domain/gs1/element-string';
import { contentHash } from '@shared/domain/signatures';
import { cautionBox, documentStyles, hashBlock as hash, heading, pageFooter, table } from '../../documents/pdf-blocks';
import { renderPdf } from '../../documents/pdf-printer';
import { sha256Hex } from '../ledger/ledger.repository';
import type { AuditTrail } from '@shared/schemas/release';
import { ancestry, releaseDossierIn } from './release-dossier';
import { lotAuditTrail } from './audit-trail';
import { plantDateTimeSeconds, timeZoneNote } from '@shared/domain/plant-time';
import { auditEventName } from '@shared/domain/audit/event-names';
import { signedContentDocument } from '@shared/domain/signed-content-document';
import { pdfSections } from '../../documents/pdf-document-sections';
import { findOrganisation } from '../organisation/organisation.repository';
import { nonconformanceIdsNumbered } from '../manufacturing/nonconformances.repository';
import { signaturesFor } from '../signatures/signatures.repository';
import { issuedBarTags, issuedHeats } from './release-dossier.repository';

export const releaseCaution =
  'Regulated release rests with the firm’s quality system. Ingotrace keeps the records and computes the ' +
  'checks; the decision to release belongs to the firm’s validated procedures and authorised people.';

interface SignatureLine {
  record: string;
  manifestation: string;
  reason: string | null;
  contentHash: string;
}

export interface PacketData {
  organisation: string;
  /** The plant's IANA time zone: every time in the packet is on its clock. */
  timeZone: string;
  lotId: number;
  dossier: Record<string, unknown> & { lot: string; part: string; gtin: string; quantity: number | null };
  barPieces: Array<{ tag: string; heat: string }>;
  signatures: SignatureLine[];
  releasedAt: Date;
  /** The ledger events the QA review covered (the lot's and those of the lots its units came through). */
  auditTrail: { reviewedThroughSeq: number | null; events: AuditTrail['events'] };
  elementString: string;
  digitalLink: string;
  /** SHA-256 of the canonical JSON of everything the packet states. */
  contentHash: string;
}

/** Everything a lot's release packet states, read in one place so the same data always gives the same packet. */
export async function packetData(manager: EntityManager, lotId: number, publicUrl: string): Promise<PacketData> {
  const dossier = await releaseDossierIn(manager, lotId);
  const lineage = await ancestry(manager, lotId);
  const barPieces = await issuedBarTags(manager, lineage);
  const heatIds = (await issuedHeats(manager, lineage)).map((heat) => ({ id: heat.id }));
  const ncIds = ((dossier.content.nonconformances as Array<{ nonconformance: string }>) ?? []).map(
    (nc) => nc.nonconformance,
  );
  const ncRows = await nonconformanceIdsNumbered(manager, ncIds);
  const records: Array<[string, string]> = [
    ['lot-release', String(lotId)],
    ...heatIds.map((row): [string, string] => ['heat', String(row.id)]),
    ...ncRows.map((row): [string, string] => ['nonconformance', String(row.id)]),
  ];
  const signatures: SignatureLine[] = [];
  let releasedAt: Date | null = null;
  for (const [recordType, recordId] of records) {
    const rows = await signaturesFor(manager, recordType, recordId);
    for (const row of rows) {
      signatures.push({
        record:
          recordType === 'lot-release' ? 'lot release' : recordType === 'heat' ? 'heat disposition' : 'nonconformance',
        manifestation: row.signed_at_text,
        reason: row.reason,
        contentHash: row.content_hash,
      });
      if (recordType === 'lot-release' && row.meaning === 'approved-for-release') releasedAt = new Date(row.signed_at);
    }
  }
  if (!releasedAt) throw new Error(`lot ${lotId} has no release signature`);
  const organisation = await findOrganisation(manager);
  const content = dossier.content as PacketData['dossier'];
  const udi = { gtin: content.gtin, lot: content.lot, serial: null, expiry: null, productionDate: null };
  const trail = await lotAuditTrail(manager, lotId, lineage);
  const reviewed = trail.reviewedThroughSeq;
  const data = {
    organisation: organisation?.name ?? '',
    timeZone: organisation?.timeZone ?? 'UTC',
    lotId,
    dossier: content,
    barPieces,
    signatures,
    releasedAt,
    auditTrail: {
      reviewedThroughSeq: reviewed,
      events: reviewed === null ? [] : trail.events.filter((event) => event.seq <= reviewed),
    },
    elementString: buildElementString(udi),
    digitalLink: buildDigitalLink(udi, publicUrl),
  };
  return { ...data, contentHash: contentHash({ ...data, releasedAt: releasedAt.toISOString() }, sha256Hex) };
}

/** The release packet PDF: what an auditor, a customer or a notified body sees of the release decision. */
export async function renderReleasePacket(data: PacketData): Promise<Buffer> {
  const dossier = data.dossier as PacketData['dossier'] & {
    heats: Array<{
      heat: string;
      supplier: string;
      specification: string;
      disposition: string;
      evaluation: string | null;
      justification?: string;
      certificates: string[];
    }>;
    operations: Array<{ step: string; units: string; by: string; ended: string; files: string[] }>;
    steps: Array<{ lot: string; step: string; verdict: string | null }>;
    runs: Array<{ run: string; method: string; inWindow: boolean; parameters: Record<string, string> }>;
    nonconformances: Array<{ nonconformance: string; subject: string; status: string; disposition: string | null }>;
    readiness: Array<{ item: string; verdict: string; why: string }>;
    genealogy: string[];
  };
  const dataMatrix = await bwipjs.toBuffer({ bcid: 'gs1datamatrix', text: data.elementString, scale: 4, padding: 4 });
  const qr = await QRCode.toDataURL(data.digitalLink, { margin: 4, scale: 4, errorCorrectionLevel: 'M' });
  const definition: TDocumentDefinitions = {
    info: {
      title: `Release packet, lot ${dossier.lot}`,
      author: data.organisation,
      subject: dossier.part,
      creator: 'Ingotrace',
      producer: 'Ingotrace',
      creationDate: data.releasedAt,
    },
    pageSize: 'A4',
    pageMargins: [40, 50, 40, 50],
    footer: pageFooter(`Lot ${dossier.lot} · release packet · content SHA-256 ${data.contentHash.slice(0, 16)}…`),
    styles: documentStyles,
    content: [
      { text: data.organisation, color: '#555' },
      { text: `Release packet — lot ${dossier.lot}`, style: 'title' },
      cautionBox(releaseCaution),
      {
        columns: [
          {
            width: '*',
            stack: [
              { text: dossier.part, bold: true, fontSize: 11, margin: [0, 4, 0, 6] },
              { text: `Lot ${dossier.lot}` },
              { text: `Quantity released: ${dossier.quantity ?? 0} units` },
              { text: `GTIN ${dossier.gtin}` },
              {
                text:
                  `Released ${plantDateTimeSeconds(data.releasedAt, data.timeZone)} ` +
                  `(${timeZoneNote(data.timeZone)})`,
              },
              { text: 'UDI (GS1 element string):', margin: [0, 8, 0, 0], bold: true },
              { text: data.elementString },
              { text: 'GS1 Digital Link (opens this lot in Ingotrace):', margin: [0, 6, 0, 0], bold: true },
              { text: data.digitalLink, style: 'mono' },
            ],
          },
          {
            width: 'auto',
            stack: [
              { image: `data:image/png;base64,${dataMatrix.toString('base64')}`, width: 90, alignment: 'center' },
              { text: 'GS1 DataMatrix', alignment: 'center', fontSize: 7, margin: [0, 2, 0, 8] },
              { image: qr, width: 100, alignment: 'center' },
              { text: 'GS1 Digital Link QR', alignment: 'center', fontSize: 7 },
            ],
          },
        ],
        columnGap: 16,
      },
      heading('Release signatures'),
      table(
        ['Record', 'Signature (name — meaning — date and time)', 'Reason'],
        data.signatures
          .filter((signature) => signature.record === 'lot release')
          .map((signature) => [signature.record, signature.manifestation, signature.reason ?? '']),
        [70, '*', 120],
      ),
      heading('Genealogy: heats, their bar pieces, the lot and its runs'),
      ...(dossier.genealogy.length ? [{ text: dossier.genealogy.join('; '), margin: [0, 0, 0, 6] } as Content] : []),
      table(
        ['Heat', 'Bar pieces', 'Lot', 'Runs'],
        dossier.heats.map((heat) => [
          heat.heat,
          data.barPieces
            .filter((piece) => piece.heat === heat.heat)
            .map((piece) => piece.tag)
            .join(', '),
          dossier.lot,
          dossier.runs.map((run) => run.run).join(', '),
        ]),
      ),
      // The release content as signed, drawn by the same document the signing dialog shows.
      ...pdfSections(
        signedContentDocument(data.dossier, data.timeZone).filter(
          (section) => section.title !== null && section.key !== 'genealogy',
        ),
      ),
      ...dossier.heats
        .filter((heat) => heat.justification)
        .map(
          (heat) =>
            ({
              text:
                `Heat ${heat.heat} was accepted although some items cannot be evaluated, on this signed ` +
                `justification: ${heat.justification}`,
              fontSize: 8,
              bold: true,
              color: '#7a4b00',
              margin: [0, 4, 0, 0],
            }) as never,
        ),
      heading('Audit trail reviewed before release'),
      {
        text:
          data.auditTrail.reviewedThroughSeq === null
            ? 'No review of the audit trail is recorded.'
            : `The QA review covered ${data.auditTrail.events.length} audit trail event(s) on this lot and the ` +
              `lots its units came through, up to event ${data.auditTrail.reviewedThroughSeq}.`,
        margin: [0, 0, 0, 4],
      },
      table(
        ['Event', 'Time', 'By', 'What', 'Lot', 'Reason'],
        data.auditTrail.events.map((event) => [
          String(event.seq),
          plantDateTimeSeconds(event.occurredAt, data.timeZone),
          event.actor,
          auditEventName(event.action),
          event.lot,
          event.reason ?? '',
        ]),
        ['auto', 88, 90, '*', 'auto', '*'],
      ),
      heading('Every signature in this record'),
      table(
        ['Record', 'Signature', 'Reason', 'Signed content SHA-256'],
        data.signatures.map((signature) => [
          signature.record,
          signature.manifestation,
          signature.reason ?? '',
          hash(signature.contentHash) as never,
        ]),
        ['auto', 150, '*', 'auto'],
      ),
      heading('Integrity'),
      { text: `Packet content SHA-256 (canonical JSON of everything stated here): ${data.contentHash}`, style: 'mono' },
      {
        table: { widths: ['*'], body: [[{ text: releaseCaution, style: 'caution', margin: [8, 6, 8, 6] }]] },
        layout: 'noBorders',
        margin: [0, 12, 0, 0],
      },
    ],
  };
  return renderPdf(definition);
}
