import type { DataSource } from 'typeorm';
import { methodValidationInputSchema } from '../../shared/schemas/process-methods';
import {
  consigneeInputSchema,
  dispositionInputSchema,
  lotOpenSchema,
  materialMovementSchema,
  nonconformanceInputSchema,
  operationInputSchema,
  partCreateSchema,
  processRunInputSchema,
  splitInputSchema,
} from '../../shared/schemas/manufacturing';
import type { Person } from '@shared/schemas/people';
import type { Part, PartCreate } from '@shared/schemas/manufacturing';
import { findPersonBySubject } from '../../server/src/modules/people/people.repository';
import { recordMethodValidation } from '../../server/src/modules/manufacturing/process-methods.service';
import { createPart } from '../../server/src/modules/manufacturing/parts.service';
import { issueMaterial, openLot, returnMaterial } from '../../server/src/modules/manufacturing/lots.service';
import { recordOperation } from '../../server/src/modules/manufacturing/operations.service';
import { recordProcessRun } from '../../server/src/modules/manufacturing/process-runs.service';
import { splitLot } from '../../server/src/modules/manufacturing/lot-links.service';
import {
  proposeDisposition,
  raiseNonconformance,
} from '../../server/src/modules/manufacturing/nonconformances.service';
import { createConsignee } from '../../server/src/modules/manufacturing/shipments.service';
import { generator } from './demo-heat-history';
import { signAsDemoPerson } from './demo-signature';

/** Invented consignees: customers, distributors and hospitals; none is a real organisation. */
export const demoConsignees: Array<{ name: string; kind: 'customer' | 'distributor' | 'hospital'; country: string }> = [
  { name: 'Brackenfold Orthopaedic Systems', kind: 'customer', country: 'United Kingdom' },
  { name: 'Veltrano Spine Devices', kind: 'customer', country: 'Italy' },
  { name: 'Halvorsen Dental Solutions', kind: 'customer', country: 'Norway' },
  { name: 'Quillmere Trauma Implants', kind: 'customer', country: 'Ireland' },
  { name: 'Ostrava Medical Distribution', kind: 'distributor', country: 'Czechia' },
  { name: 'Larkspur Surgical Supply', kind: 'distributor', country: 'United Kingdom' },
  { name: 'Nordlys Medtech Distribution', kind: 'distributor', country: 'Denmark' },
  { name: 'Iberflux Material Quirúrgico', kind: 'distributor', country: 'Spain' },
  { name: 'Rhenwald Klinikbedarf', kind: 'distributor', country: 'Germany' },
  { name: 'Saint-Aubrac Distribution Médicale', kind: 'distributor', country: 'France' },
  { name: 'Fellgate General Hospital', kind: 'hospital', country: 'United Kingdom' },
  { name: 'Tarnbridge Royal Infirmary', kind: 'hospital', country: 'United Kingdom' },
  { name: 'Ospedale San Liberio', kind: 'hospital', country: 'Italy' },
  { name: 'Klinikum Altensee', kind: 'hospital', country: 'Germany' },
  { name: 'Hôpital des Trois Vallées', kind: 'hospital', country: 'France' },
  { name: 'Hospital Costa Serena', kind: 'hospital', country: 'Portugal' },
  { name: 'Vesterhavn University Hospital', kind: 'hospital', country: 'Denmark' },
  { name: 'Carrowmore Regional Hospital', kind: 'hospital', country: 'Ireland' },
  { name: 'Lindqvist Orthopaedic Clinic', kind: 'hospital', country: 'Sweden' },
  { name: 'Moravia Spine Centre', kind: 'hospital', country: 'Czechia' },
];

/** An invented field-action address under the reserved .example domain (RFC 2606): mail to it goes nowhere real. */
export function demoContactEmail(name: string): string {
  const slug = name
    .normalize('NFD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-|-$/g, '');
  return `field-actions@${slug}.example`;
}

const finishing = (passivation: string) => [
  { kind: 'passivation' as const, name: 'Passivate', processMethod: passivation },
  { kind: 'cleaning' as const, name: 'Final clean', processMethod: 'KIW-CLEAN-AQ' },
  { kind: 'inspection' as const, name: 'Final inspection', sampleSize: 13, acceptNumber: 0, rejectNumber: 1 },
  { kind: 'packaging' as const, name: 'Pack and label' },
];

/** Invented parts; the GTINs use the GS1 demonstration prefix 952 with valid check digits. */
export const demoParts: Array<PartCreate & { units: [number, number]; weight: number }> = [
  {
    partNumber: 'KIW-CS35-40',
    revision: 'C',
    description: 'Cortical screw 3.5 × 40 mm, self-tapping',
    gtin: '09520123000011',
    unitLengthMm: '42',
    cutoffAllowanceMm: '3',
    lotPattern: 'CS{YY}{SEQ:4}',
    contactCategory: 'general-tissue',
    specifications: [{ specId: 'ASTM F136', grade: null }],
    routing: [
      { kind: 'machining', name: 'Swiss-turn and thread' },
      { kind: 'machining', name: 'Hex drive and deburr' },
      ...finishing('F86-NITRIC'),
    ],
    units: [30, 60],
    weight: 5,
  },
  {
    partNumber: 'KIW-LP-8H',
    revision: 'B',
    description: 'Locking plate, 8 holes',
    gtin: '09520123000028',
    unitLengthMm: '110',
    cutoffAllowanceMm: '4',
    lotPattern: 'LP{YY}{SEQ:4}',
    contactCategory: 'general-tissue',
    specifications: [{ specId: 'ASTM F136', grade: null }],
    routing: [
      { kind: 'machining', name: 'Mill profile and holes' },
      { kind: 'machining', name: 'Thread locking holes' },
      ...finishing('F86-NITRIC'),
    ],
    units: [10, 24],
    weight: 3,
  },
  {
    partNumber: 'KIW-SR-55',
    revision: 'A',
    description: 'Spinal rod 5.5 × 480 mm',
    gtin: '09520123000035',
    unitLengthMm: '480',
    cutoffAllowanceMm: '5',
    lotPattern: 'SR{YY}{SEQ:4}',
    contactCategory: 'general-tissue',
    specifications: [{ specId: 'ASTM F136', grade: null }],
    routing: [
      { kind: 'machining', name: 'Centreless grind' },
      { kind: 'machining', name: 'Cut to length and chamfer' },
      ...finishing('F86-NITRIC'),
    ],
    units: [4, 5],
    weight: 1,
  },
  {
    partNumber: 'KIW-DI-4010',
    revision: 'D',
    description: 'Dental implant body 4.0 × 10 mm',
    gtin: '09520123000042',
    unitLengthMm: '14',
    cutoffAllowanceMm: '2.5',
    lotPattern: 'DI{YY}{SEQ:4}',
    contactCategory: 'general-tissue',
    specifications: [{ specId: 'ASTM F67', grade: '4' }],
    routing: [
      { kind: 'machining', name: 'Swiss-turn body and thread' },
      { kind: 'machining', name: 'Connection and polish' },
      ...finishing('F86-NITRIC'),
    ],
    units: [60, 120],
    weight: 2,
  },
  {
    partNumber: 'KIW-HT-316',
    revision: 'A',
    description: 'Hip stem trial, size 3 (316L)',
    gtin: '09520123000059',
    unitLengthMm: '180',
    cutoffAllowanceMm: '5',
    lotPattern: 'HT{YY}{SEQ:4}',
    contactCategory: 'general-tissue',
    specifications: [{ specId: 'ASTM F138', grade: null }],
    routing: [
      { kind: 'machining', name: 'Turn and mill profile' },
      { kind: 'machining', name: 'Polish' },
      ...finishing('A967-NITRIC-3'),
    ],
    units: [6, 12],
    weight: 1,
  },
];

const origin = { requestId: 'demo-seed', clientAddress: null };
const DAY = 86_400_000;

interface Bar {
  tag: string;
  specId: string;
  grade: string | null;
  remaining: number;
}

interface OpenLot {
  id: number;
  part: Part;
  qty: number;
  readyAt: number;
}

/**
 * Eighteen months of production: parts with routings, about two hundred lots cut from the demo
 * bar, their machining steps, passivation and cleaning runs of ten to twenty lots (one run out of
 * its window, its nonconformances dispositioned and closed by QA), final inspection, packing,
 * a few splits, and the consignees lots will ship to once released. The newest lots are still in
 * machining.
 */
export async function seedDemoManufacturing(dataSource: DataSource): Promise<void> {
  const engineer = (await findPersonBySubject(dataSource.manager, 'kiw-0101')) as Person;
  const reviewer = (await findPersonBySubject(dataSource.manager, 'kiw-0201')) as Person;
  const approver = (await findPersonBySubject(dataSource.manager, 'kiw-0301')) as Person;
  const actor = { id: engineer.id, name: engineer.name, role: 'manufacturing-engineer' };
  const random = generator(18_2026);
  const between = (low: number, high: number) => low + Math.floor(random() * (high - low + 1));

  for (const consignee of demoConsignees)
    await createConsignee(
      dataSource,
      consigneeInputSchema.parse({ ...consignee, contactEmail: demoContactEmail(consignee.name) }),
      actor,
      origin,
    );
  // The firm's own validation of the citric method for titanium alloy parts: shown as the firm's own beside the
  // method's stainless-steel scope.
  await recordMethodValidation(
    dataSource,
    'A967-CITRIC',
    methodValidationInputSchema.parse({
      materialFamily: 'titanium-alloy',
      reference: 'VR-2025-031 (demo)',
      reason:
        'Three worst-case lots of F136 parts passed water immersion and iron contamination checks after ' +
        'citric treatment (demo scenario)',
    }),
    approver,
    { id: approver.id, name: approver.name, role: 'qa-approver' },
    origin,
  );
  const parts: Array<{ part: Part; demo: (typeof demoParts)[number] }> = [];
  for (const demo of demoParts) {
    const { units: _units, weight: _weight, ...create } = demo;
    parts.push({ part: await createPart(dataSource, partCreateSchema.parse(create), engineer, actor, origin), demo });
  }
  const bars: Bar[] = await dataSource.query(
    `SELECT b.tag, h.spec_id AS specId, h.grade, b.length_mm + 0 AS remaining FROM bar_piece b JOIN heat h ON h.id
        = b.heat_id
      WHERE h.status = 'accepted' AND b.status = 'in-stock' ORDER BY h.received_at, b.id`,
  );
  for (const bar of bars) bar.remaining = Number(bar.remaining);
  const weighted = parts.flatMap((entry) => Array.from({ length: entry.demo.weight }, () => entry));

  const now = Date.now();
  const lotCount = 200;
  const waiting: OpenLot[] = [];
  let runs = 0;
  const iso = (time: number) => new Date(time).toISOString();
  const operation = (
    stepNo: number,
    qtyIn: number,
    scrap: number,
    at: number,
    workCentre: string,
    extra: Record<string, unknown> = {},
  ) => ({
    stepNo,
    operatorName: engineer.name,
    workCentre,
    programRevision: stepNo === 10 ? 'NC-100 rev 4' : null,
    startedAt: iso(at),
    endedAt: iso(at + 3 * 3_600_000),
    qtyIn,
    qtyGood: qtyIn - scrap,
    qtyScrap: scrap,
    scrapReasons: scrap
      ? [{ reason: ['Thread form out of tolerance', 'Tool mark', 'Diameter undersize'][scrap % 3]!, qty: scrap }]
      : [],
    ...extra,
  });

  async function finishBatch(batch: OpenLot[]): Promise<void> {
    runs++;
    const runAt = Math.max(...batch.map((lot) => lot.readyAt)) + DAY;
    const outOfWindow = runs === 5;
    const byMethod = new Map<string, OpenLot[]>();
    for (const lot of batch) {
      const method = lot.part.routing.find((step) => step.kind === 'passivation')!.processMethod!;
      byMethod.set(method, [...(byMethod.get(method) ?? []), lot]);
    }
    for (const [methodId, lots] of byMethod) {
      const hot = methodId === 'A967-NITRIC-3';
      const run = await recordProcessRun(
        dataSource,
        processRunInputSchema.parse({
          kind: 'passivation',
          methodId,
          equipment: hot ? 'Passivation tank P2' : 'Passivation tank P1',
          operatorName: engineer.name,
          runAt: iso(runAt),
          parameters: {
            bath: hot ? 'P2 bath 2024-07' : 'P1 bath 2024-09',
            acidConcentration: hot ? '22' : String(between(28, 34)),
            temperature: outOfWindow && !hot ? '37.5' : hot ? '54' : String(between(23, 28)),
            immersionTime: hot ? '25' : String(between(32, 40)),
            rinseConductivity: (1 + random() * 2).toFixed(1),
          },
          lotIds: lots.map((lot) => lot.id),
        }),
        engineer,
        actor,
        origin,
      );
      if (!run.inWindow) {
        for (const nc of run.nonconformances) {
          await proposeDisposition(
            dataSource,
            nc.id,
            dispositionInputSchema.parse({
              disposition: 'use-as-is',
              note:
                'Bath 2.5 °C over for the last 10 minutes; passivation verification (water immersion) passed on ' +
                'samples from every lot',
            }),
            { id: approver.id, name: approver.name, role: 'qa-approver' },
            origin,
          );
          await signAsDemoPerson(dataSource, 'kiw-0301', {
            recordType: 'nonconformance',
            recordId: String(nc.id),
            meaning: 'dispositioned',
          });
          await signAsDemoPerson(dataSource, 'kiw-0301', {
            recordType: 'nonconformance',
            recordId: String(nc.id),
            meaning: 'closed',
            reason: 'Verification tests on file; chiller serviced',
          });
        }
      }
    }
    await recordProcessRun(
      dataSource,
      processRunInputSchema.parse({
        kind: 'cleaning',
        methodId: 'KIW-CLEAN-AQ',
        equipment: 'Ultrasonic line U1',
        operatorName: engineer.name,
        runAt: iso(runAt + 4 * 3_600_000),
        parameters: {
          detergent: 'Alkaline detergent, lot 24-118',
          detergentConcentration: '2',
          washTemperature: String(between(52, 58)),
          washTime: '15',
          rinseTemperature: '30',
          rinseTime: '6',
          rinseConductivity: (0.8 + random()).toFixed(1),
          toc: String(between(60, 240)),
          endotoxin: (random() * 3).toFixed(2),
        },
        lotIds: batch.map((lot) => lot.id),
      }),
      engineer,
      actor,
      origin,
    );
    for (const lot of batch) {
      const inspectAt = runAt + DAY;
      const sample = Math.min(13, lot.qty);
      await recordOperation(
        dataSource,
        lot.id,
        operationInputSchema.parse(
          operation(50, lot.qty, 0, inspectAt, 'Final inspection bench', { inspected: sample, defectsFound: 0 }),
        ),
        engineer,
        actor,
        origin,
      );
      await recordOperation(
        dataSource,
        lot.id,
        operationInputSchema.parse(operation(60, lot.qty, 0, inspectAt + 3_600_000, 'Clean-room packing')),
        engineer,
        actor,
        origin,
      );
    }
  }

  for (let index = 0; index < lotCount; index++) {
    const { part, demo } = weighted[Math.floor(random() * weighted.length)]!;
    const openedAt = now - Math.round((545 - index * 2.7) * DAY);
    const qty = between(demo.units[0], demo.units[1]);
    const perUnit = Number(part.unitLengthMm) + Number(part.cutoffAllowanceMm);
    const need = (qty + 1) * perUnit;
    const allowed = part.specifications[0]!;
    const bar = bars.find(
      (candidate) =>
        candidate.specId === allowed.specId &&
        (allowed.grade === null || candidate.grade === allowed.grade) &&
        candidate.remaining >= need,
    );
    if (!bar) continue;
    const lot = await openLot(
      dataSource,
      lotOpenSchema.parse({ partId: part.id, plannedQty: qty, openedOn: iso(openedAt).slice(0, 10) }),
      engineer,
      actor,
      origin,
    );
    await issueMaterial(
      dataSource,
      lot.id,
      materialMovementSchema.parse({ tag: bar.tag, lengthMm: need.toFixed(2) }),
      engineer,
      actor,
      origin,
    );
    bar.remaining -= need;
    const scrap = random() < 0.3 ? between(1, 2) : 0;
    await recordOperation(
      dataSource,
      lot.id,
      operationInputSchema.parse(operation(10, qty, scrap, openedAt + 2 * 3_600_000, 'Swiss lathe 2')),
      engineer,
      actor,
      origin,
    );
    await recordOperation(
      dataSource,
      lot.id,
      operationInputSchema.parse(operation(20, qty - scrap, 0, openedAt + DAY, 'Machining cell 4')),
      engineer,
      actor,
      origin,
    );
    // The spare unit's bar comes back as a remnant.
    await returnMaterial(
      dataSource,
      lot.id,
      materialMovementSchema.parse({ tag: bar.tag, lengthMm: (perUnit - random() * 0.5).toFixed(2) }),
      engineer,
      actor,
      origin,
    );
    let units = qty - scrap;
    if (index % 30 === 17 && units > 8) {
      const split = await splitLot(
        dataSource,
        lot.id,
        splitInputSchema.parse({
          quantities: [Math.floor(units / 3)],
          reason: 'Part of the lot expedited for an urgent order',
        }),
        engineer,
        actor,
        origin,
      );
      units -= split.children[0]!.qty;
      waiting.push({ id: split.children[0]!.id, part, qty: split.children[0]!.qty, readyAt: openedAt + DAY });
    }
    if (openedAt > now - 20 * DAY) continue;
    waiting.push({ id: lot.id, part, qty: units, readyAt: openedAt + DAY });
    if (waiting.length >= between(10, 20)) await finishBatch(waiting.splice(0));
  }
  if (waiting.length) await finishBatch(waiting.splice(0));

  const [recent] = await dataSource.query(
    "SELECT l.id, l.lot_number FROM production_lot l WHERE l.status = 'open' AND l.origin = 'bar' AND NOT " +
      'EXISTS (SELECT 1 FROM lot_operation o JOIN routing_step s ON s.id = o.routing_step_id WHERE o.lot_id = ' +
      "l.id AND s.kind = 'passivation') ORDER BY l.opened_at DESC LIMIT 1",
  );
  if (recent) {
    await raiseNonconformance(
      dataSource,
      nonconformanceInputSchema.parse({
        subjectType: 'lot',
        subjectId: recent.id,
        description: 'Burr on the hex drive of 3 sample parts at in-process check',
        containment: 'Lot held at machining cell 4; remaining parts to be inspected 100 %',
      }),
      reviewer,
      { id: reviewer.id, name: reviewer.name, role: 'qa-reviewer' },
      origin,
    );
  }
}
