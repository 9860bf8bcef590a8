import type { DataSource } from 'typeorm';
import { barReceiptSchema, heatCreateSchema, heatResultsSchema } from '../../shared/schemas/materials';
import { bunchingMill, bunchingMillHeats } from './demo-screening';
import { findPersonBySubject } from '../../server/src/modules/people/people.repository';
import { attachCertificate, receiveHeat, recordResults } from '../../server/src/modules/materials/heats.service';
import { createSupplier } from '../../server/src/modules/materials/suppliers.service';
import { receiveBar } from '../../server/src/modules/materials/bar-stock.service';
import type { Person } from '@shared/schemas/people';
import { demoHeatHistory, type DemoHeat } from './demo-heat-history';
import { signAsDemoPerson } from './demo-signature';
import { seedDemoCheckAnalysis } from './demo-check-analysis';
import { registerProductRecordTypes } from '../../server/src/modules/signable-record-types';

/** Invented mills; none is a real firm. */
const mills = [
  { name: 'Nordvik Titanium Mill', country: 'Norway', approval: 'approved' as const },
  { name: 'Castellane Special Metals', country: 'France', approval: 'approved' as const },
  { name: 'Oriel Bar & Wire', country: 'United Kingdom', approval: 'conditional' as const },
  bunchingMill,
];

/** A small PDF whose text names the heat, standing in for the mill's scanned certificate. */
function demoCertificate(heatNumber: string, mill: string): Buffer {
  const text = `Inspection certificate 3.1 - ${mill} - heat ${heatNumber} (demo document)`;
  const stream = `BT /F1 11 Tf 40 780 Td (${text.replace(/[()\\]/g, '')}) Tj ET`;
  const objects = [
    '<< /Type /Catalog /Pages 2 0 R >>',
    '<< /Type /Pages /Kids [3 0 R] /Count 1 >>',
    '<< /Type /Page /Parent 2 0 R /MediaBox [0 0 595 842] /Contents 4 0 R /Resources << /Font << /F1 5 0 R >> >> >>',
    `<< /Length ${stream.length} >>\nstream\n${stream}\nendstream`,
    '<< /Type /Font /Subtype /Type1 /BaseFont /Helvetica >>',
  ];
  let body = '%PDF-1.4\n';
  const offsets: number[] = [];
  objects.forEach((object, index) => {
    offsets.push(body.length);
    body += `${index + 1} 0 obj\n${object}\nendobj\n`;
  });
  const xref = body.length;
  body +=
    `xref\n0 ${objects.length + 1}\n0000000000 65535 f ` +
    `\n${offsets.map((offset) => `${String(offset).padStart(10, '0')} 00000 n \n`).join('')}`;
  body += `trailer\n<< /Size ${objects.length + 1} /Root 1 0 R >>\nstartxref\n${xref}\n%%EOF\n`;
  return Buffer.from(body, 'latin1');
}

type RecentHeat = Omit<DemoHeat, 'daysAgo'>;

const f136 = (heatNumber: string, mill: number, o: string, fe: string, h: string, uts: string): RecentHeat => ({
  heatNumber,
  mill,
  specId: 'ASTM F136',
  sizeMm: '25.4',
  chemistry: { Al: '6.05', V: '4.02', Fe: fe, O: o, C: '0.02', N: '0.01', H: h },
  mechanical: { utsMPa: uts, ysMPa: String(Number(uts) - 70), elongationPct: '14', reductionOfAreaPct: '41' },
});

/** The recent heats, awaiting QA's disposition, in the order they arrived. */
const recentHeats: RecentHeat[] = [
  f136('NV-24-1107', 0, '0.11', '0.16', '0.0040', '948'),
  f136('NV-24-1162', 0, '0.10', '0.18', '45 ppm', '955'),
  f136('NV-25-0214', 0, '0.12', '0.15', '0.0050', '940'),
  f136('NV-25-0388', 0, '0.15', '0.17', '0.0045', '962'), // oxygen over the ELI limit: does not conform
  f136('CS-7781', 1, '0.11', '0.20', '0.0030', '930'),
  f136('CS-7790', 1, '0.12', '0.21', '0.0035', '936'),
  f136('CS-7802', 1, '0.12', '0.21', '0.0035', '936'), // the very same results as CS-7790: a copied certificate?
  f136('OB-55120', 2, '0.11', '0.14', '0.0060', '925'),
  {
    heatNumber: 'NV-25-0530',
    mill: 0,
    specId: 'ASTM F67',
    grade: '4',
    sizeMm: '12.7',
    chemistry: { N: '0.01', C: '0.01', H: '0.003', Fe: '0.30', O: '0.35' },
    mechanical: { utsMPa: '640', ysMPa: '540', elongationPct: '20', reductionOfAreaPct: '38' },
  },
  {
    heatNumber: 'CS-7850',
    mill: 1,
    specId: 'ASTM F67',
    grade: '2',
    sizeMm: '8',
    chemistry: { N: '0.01', C: '0.01', H: '0.002', Fe: '0.12', O: '0.16' },
    mechanical: { utsMPa: '420', ysMPa: '330', elongationPct: '28', reductionOfAreaPct: '45' },
  },
  {
    heatNumber: 'OB-55310',
    mill: 2,
    specId: 'ASTM F138',
    sizeMm: '16',
    chemistry: {
      C: '0.018',
      Mn: '1.70',
      P: '0.018',
      S: '0.001',
      Si: '0.40',
      Cr: '17.60',
      Ni: '14.30',
      Mo: '2.60',
      N: '0.06',
      Cu: '0.10',
    },
    mechanical: { utsMPa: '540', ysMPa: '250', elongationPct: '45' },
  },
];

/** A heat quarantined by QA: its results conform, but the certificate needs the mill's reissue. */
const quarantinedHeat: DemoHeat = {
  heatNumber: 'OB-55208',
  mill: 2,
  specId: 'ASTM F136',
  sizeMm: '19.05',
  daysAgo: 20,
  chemistry: { Al: '6.10', V: '3.95', Fe: '0.15', O: '0.11', C: '0.02', N: '0.01', H: '0.0050' },
  mechanical: { utsMPa: '941', ysMPa: '870', elongationPct: '15', reductionOfAreaPct: '42' },
};

const dayOf = (daysAgo: number) => new Date(Date.now() - daysAgo * 86_400_000).toISOString().slice(0, 10);
const origin = { requestId: 'demo-seed', clientAddress: null };

/**
 * Demo mass of a round bar (density only for invented demo values: Ti-6Al-4V about 4.43 g/cm³, 316L about 7.99 g/cm³).
 */
function barMassKg(specId: string, diameterMm: string, lengthMm: number): string {
  const density = specId === 'ASTM F138' ? 7.99 : 4.43;
  const radiusCm = Number(diameterMm) / 20;
  return ((Math.PI * radiusCm * radiusCm * (lengthMm / 10) * density) / 1000).toFixed(3);
}

async function enterHeat(
  dataSource: DataSource,
  heat: DemoHeat,
  supplierIds: number[],
  engineer: Person,
): Promise<number> {
  const actor = { id: engineer.id, name: engineer.name, role: 'manufacturing-engineer' };
  const received = await receiveHeat(
    dataSource,
    heatCreateSchema.parse({
      heatNumber: heat.heatNumber,
      supplierId: supplierIds[heat.mill]!,
      specId: heat.specId,
      grade: heat.grade ?? null,
      meltRoute: heat.specId === 'ASTM F138' ? 'VIM + ESR' : 'VAR ×3',
      productForm: 'bar',
      condition: 'annealed',
      sizeMm: heat.sizeMm,
      receivedOn: dayOf(heat.daysAgo),
    }),
    engineer,
    actor,
    origin,
  );
  await attachCertificate(
    dataSource,
    received.id,
    {
      bytes: demoCertificate(heat.heatNumber, mills[heat.mill]!.name),
      originalName: `certificate-${heat.heatNumber}.pdf`,
    },
    engineer,
    actor,
    origin,
  );
  await recordResults(
    dataSource,
    received.id,
    heatResultsSchema.parse({ chemistry: heat.chemistry, mechanical: heat.mechanical }),
    engineer,
    actor,
    origin,
  );
  return received.id;
}

/**
 * Suppliers and two years of heats with certificates and evaluated results, entered as the demo
 * engineer would; QA has accepted the history (and taken bar from the last heats into stock),
 * quarantined one heat, and left the recent heats for disposition.
 */
export async function seedDemoMaterials(dataSource: DataSource): Promise<void> {
  registerProductRecordTypes();
  const engineer = await findPersonBySubject(dataSource.manager, 'kiw-0101');
  const approver = await findPersonBySubject(dataSource.manager, 'kiw-0301');
  if (!engineer || !approver) throw new Error('seed the demo people first');
  const supplierIds: number[] = [];
  for (const mill of mills) {
    const supplier = await createSupplier(
      dataSource,
      { ...mill, reason: 'demo scenario: supplier qualification on file' },
      { id: approver.id, name: approver.name, role: 'qa-approver' },
      origin,
    );
    supplierIds.push(supplier.id);
  }
  const history = demoHeatHistory();
  const accepted: Array<{ id: number; heat: DemoHeat }> = [];
  for (const heat of history) {
    const id = await enterHeat(dataSource, heat, supplierIds, engineer);
    await signAsDemoPerson(dataSource, 'kiw-0201', { recordType: 'heat', recordId: String(id), meaning: 'accepted' });
    accepted.push({ id, heat });
  }
  const quarantinedId = await enterHeat(dataSource, quarantinedHeat, supplierIds, engineer);
  await signAsDemoPerson(dataSource, 'kiw-0201', {
    recordType: 'heat',
    recordId: String(quarantinedId),
    meaning: 'quarantined',
    reason: 'Certificate scan is partly illegible (mechanical table); the mill has been asked to reissue it',
  });
  for (const [index, heat] of recentHeats.entries()) {
    await enterHeat(dataSource, { ...heat, daysAgo: 60 - index * 5 }, supplierIds, engineer);
  }
  for (const heat of bunchingMillHeats(mills.indexOf(bunchingMill)))
    await enterHeat(dataSource, heat, supplierIds, engineer);
  await seedDemoBarStock(dataSource, accepted, engineer);
  await seedDemoCheckAnalysis(dataSource, { castellane: supplierIds[1]! }, approver, engineer);
}

/** Bar from every accepted heat: six 3 m bars of each, in the bar store (production lots draw on them). */
async function seedDemoBarStock(
  dataSource: DataSource,
  heats: Array<{ id: number; heat: DemoHeat }>,
  engineer: Person,
): Promise<void> {
  const actor = { id: engineer.id, name: engineer.name, role: 'manufacturing-engineer' };
  for (const [index, { id, heat }] of heats.entries()) {
    for (const bar of [1, 2, 3, 4, 5, 6]) {
      await receiveBar(
        dataSource,
        barReceiptSchema.parse({
          heatId: id,
          markedHeatNumber: heat.heatNumber,
          tag: `${heat.heatNumber.replace(/[^A-Z0-9]+/g, '-')}-B${bar}`,
          diameterMm: heat.sizeMm,
          lengthMm: '3000',
          massKg: barMassKg(heat.specId, heat.sizeMm, 3000),
          location: `Bar store rack ${String.fromCharCode(65 + (index % 4))}${bar}`,
        }),
        engineer,
        actor,
        origin,
      );
    }
  }
}
