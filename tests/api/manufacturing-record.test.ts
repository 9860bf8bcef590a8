import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { LotDetail } from '@shared/schemas/lot-detail';
import { createTestApp } from '../helpers/test-app';
import { lotToRecallPeople, SamlTestDriver, signInPeople } from '../helpers/saml-round-trip';
import { signThroughApi } from '../helpers/signing';

type Agent = Awaited<ReturnType<SamlTestDriver['signIn']>>['agent'];

const routing = [
  { kind: 'machining', name: 'Turn' },
  { kind: 'machining', name: 'Mill flats' },
  { kind: 'passivation', name: 'Passivate', processMethod: 'F86-NITRIC' },
  { kind: 'cleaning', name: 'Final clean', processMethod: 'KIW-CLEAN-AQ' },
  { kind: 'inspection', name: 'Final inspection', sampleSize: 8, acceptNumber: 0, rejectNumber: 1 },
  { kind: 'packaging', name: 'Pack and label' },
];
const part = {
  partNumber: 'TST-SCREW-01',
  revision: 'A',
  description: 'Test cortical screw 3.5 × 40',
  gtin: '09521230000017',
  unitLengthMm: '42',
  cutoffAllowanceMm: '3',
  reconciliationTolerancePct: '2',
  lotPattern: 'T{YY}{SEQ:4}',
  contactCategory: 'general-tissue',
  specifications: [{ specId: 'ASTM F136' }],
  routing,
};
const operation = (stepNo: number, qtyIn: number, qtyScrap = 0, extra: Record<string, unknown> = {}) => ({
  stepNo,
  operatorName: 'Test Operator',
  workCentre: 'Swiss lathe 2',
  programRevision: 'P-12 rev C',
  startedAt: '2026-11-02T07:00:00Z',
  endedAt: '2026-11-02T09:00:00Z',
  qtyIn,
  qtyGood: qtyIn - qtyScrap,
  qtyScrap,
  scrapReasons: qtyScrap ? [{ reason: 'Thread damaged', qty: qtyScrap }] : [],
  ...extra,
});
const passivation = {
  bath: 'Tank N2-1',
  acidConcentration: '30',
  temperature: '25',
  immersionTime: '35',
  rinseConductivity: '1.8',
};
const cleaning = {
  detergent: 'Alkaline D-1 lot 77',
  detergentConcentration: '2',
  washTemperature: '55',
  washTime: '15',
  rinseTemperature: '30',
  rinseTime: '6',
  rinseConductivity: '1.1',
  toc: '150',
  endotoxin: '4',
};

describe('the manufacturing record: parts, lots, material, operations, runs, nonconformances', () => {
  const running = createTestApp();
  let saml: SamlTestDriver;
  const people: Record<string, { agent: Agent; csrf: string; subject: string }> = {};
  let partId: number;
  const lots: Array<{ id: number; lotNumber: string }> = [];
  let tags: string[];

  beforeAll(async () => {
    saml = await SamlTestDriver.create(running.config);
    Object.assign(people, await signInPeople(saml, running.app, lotToRecallPeople));
    const db = await running.database.connect();
    // Two accepted F136 heats from the demo scenario; the test receives its own bar of each.
    const heats: Array<{ id: number; heat_number: string }> = await db.query(
      "SELECT id, heat_number FROM heat WHERE status = 'accepted' AND spec_id = 'ASTM F136' ORDER BY id DESC LIMIT 2",
    );
    tags = ['TST-BAR-01', 'TST-BAR-02'];
    for (const [index, heat] of heats.entries()) {
      const received = await post('engineer', '/api/bar-pieces', {
        heatId: heat.id,
        markedHeatNumber: heat.heat_number,
        tag: tags[index],
        diameterMm: '25.4',
        lengthMm: '3000',
        location: 'Test rack',
      });
      if (received.status !== 201) throw new Error(`receiving test bar answered ${received.status}`);
    }
  });
  afterAll(() => running.close());

  const post = (who: string, path: string, body: unknown) =>
    people[who]!.agent.post(path)
      .set('X-CSRF-Token', people[who]!.csrf)
      .send(body as object);
  const detail = async (lotId: number) => (await people.auditor!.agent.get(`/api/lots/${lotId}`)).body as LotDetail;
  const count = async (table: string) =>
    Number((await running.database.dataSource.query(`SELECT COUNT(*) AS n FROM ${table}`))[0].n);

  it(
    'when an engineer registers a part, then a wrong GTIN, an unknown specification or a bad pattern is refused ' +
      'field by field',
    async () => {
      const badGtin = await post('engineer', '/api/parts', { ...part, gtin: '09521230000018' });
      expect(badGtin.status).toBe(400);
      expect(badGtin.body.error.fields.gtin).toBe('The check digit should be 7');
      const badPattern = await post('engineer', '/api/parts', { ...part, lotPattern: 'T {SEQ}' });
      expect(badPattern.body.error.fields.lotPattern).toBe('“ ” cannot be used in a GS1 lot number');
      const unknownSpec = await post('engineer', '/api/parts', { ...part, specifications: [{ specId: 'ASTM F9999' }] });
      expect(unknownSpec.status).toBe(422);
      expect(unknownSpec.body.error.fields).toEqual({
        'specifications.0.specId': 'ASTM F9999 is not in the specification library',
      });
      const noPlan = await post('engineer', '/api/parts', {
        ...part,
        routing: [{ kind: 'inspection', name: 'Inspect' }],
      });
      expect(noPlan.body.error.fields['routing.0.sampleSize']).toBe(
        'An inspection step needs its sampling plan (sample size, Ac, Re)',
      );
      expect((await post('reviewer', '/api/parts', part)).status).toBe(403);
      const created = await post('engineer', '/api/parts', part);
      expect(created.status).toBe(201);
      expect(created.body.routing.map((step: { stepNo: number }) => step.stepNo)).toEqual([10, 20, 30, 40, 50, 60]);
      partId = created.body.id;
    },
  );

  it('when lots are opened, then their numbers follow the part’s pattern in sequence', async () => {
    for (let index = 0; index < 4; index++) {
      const response = await post('engineer', '/api/lots', { partId, plannedQty: 40 });
      expect(response.status).toBe(201);
      lots.push({ id: response.body.id, lotNumber: response.body.lotNumber });
    }
    const year = String(new Date().getUTCFullYear()).slice(-2);
    expect(lots.map((lot) => lot.lotNumber)).toEqual(
      [1, 2, 3, 4].map((seq) => `T${year}${String(seq).padStart(4, '0')}`),
    );
  });

  it(
    '[LOT-ISSUE-REFUSED] when bar is issued, then over-issue, a second heat without approval and the wrong ' +
      'material are refused and nothing is written',
    async () => {
      const [first, second] = tags;
      const lot = lots[0]!;
      const before = await count('material_movement');
      const over = await post('engineer', `/api/lots/${lot.id}/material-issues`, { tag: first, lengthMm: '3000.01' });
      expect(over.status).toBe(422);
      expect(over.body.error.message).toBe(`Piece ${first} has 3000.00 mm left; 3000.01 mm cannot be issued`);
      const issued = await post('engineer', `/api/lots/${lot.id}/material-issues`, {
        tag: first!.toLowerCase(),
        lengthMm: '1800',
      });
      expect(issued.status).toBe(201);
      const mixed = await post('engineer', `/api/lots/${lot.id}/material-issues`, { tag: second, lengthMm: '100' });
      expect(mixed.status).toBe(422);
      expect(mixed.body.error.fields).toEqual({ tag: 'Heat mixing not approved' });
      const [grade4] = await running.database.dataSource.query(
        "SELECT b.tag FROM bar_piece b JOIN heat h ON h.id = b.heat_id WHERE h.spec_id = 'ASTM F67' AND " +
          "h.status = 'accepted' LIMIT 1",
      );
      if (grade4) {
        const wrong = await post('engineer', `/api/lots/${lot.id}/material-issues`, {
          tag: grade4.tag,
          lengthMm: '100',
        });
        expect(wrong.body.error.message).toMatch(/must be made from ASTM F136$/);
      }
      expect(await count('material_movement')).toBe(before + 1);
      for (const other of lots.slice(1))
        expect(
          (await post('engineer', `/api/lots/${other.id}/material-issues`, { tag: second, lengthMm: '450' })).status,
        ).toBe(201);
    },
  );

  it('when a quarantined heat’s bar is issued, then it is refused with the heat’s status', async () => {
    const [heat] = await running.database.dataSource.query("SELECT id FROM heat WHERE heat_number = 'OB-55208'");
    const received = await post('engineer', '/api/bar-pieces', {
      heatId: heat.id,
      markedHeatNumber: 'OB 55208',
      tag: 'TST-Q-01',
      diameterMm: '19.05',
      lengthMm: '1000',
      location: 'Quarantine cage',
    });
    expect(received.status).toBe(201);
    const refused = await post('engineer', `/api/lots/${lots[0]!.id}/material-issues`, {
      tag: 'TST-Q-01',
      lengthMm: '10',
    });
    expect(refused.status).toBe(422);
    expect(refused.body.error.message).toBe('Heat OB-55208 is quarantined, not accepted; its bar cannot be issued');
  });

  it(
    '[LOT-ISSUE-HELD] when bar is under an open nonconformance or an open recall, then it is refused naming the ' +
      'record; a drill holds nothing',
    async () => {
      const [heat] = await running.database.dataSource.query(
        'SELECT h.id, h.heat_number FROM heat h JOIN bar_piece b ON b.heat_id = h.id WHERE b.tag = ?',
        [tags[0]],
      );
      const receive = async (tag: string) => {
        const received = await post('engineer', '/api/bar-pieces', {
          heatId: heat.id,
          markedHeatNumber: heat.heat_number,
          tag,
          diameterMm: '25.4',
          lengthMm: '500',
          location: 'Test rack',
        });
        expect(received.status).toBe(201);
        return received.body.id as number;
      };
      const issue = (tag: string) =>
        post('engineer', `/api/lots/${lots[0]!.id}/material-issues`, { tag, lengthMm: '10' });
      const flagged = await receive('TST-HOLD-NC');
      const nc = await post('reviewer', '/api/nonconformances', {
        subjectType: 'bar-piece',
        subjectId: flagged,
        description: 'Surface crack found at receipt',
        containment: 'Tagged red in the rack',
      });
      expect(nc.status).toBe(201);
      const refusedNc = await issue('TST-HOLD-NC');
      expect(refusedNc.status).toBe(422);
      expect(refusedNc.body.error.message).toBe(
        `Bar TST-HOLD-NC of heat ${heat.heat_number} is held: nonconformance ${nc.body.ncNumber} on the bar ` +
          `piece is open. It cannot be issued until that is closed`,
      );
      expect(refusedNc.body.error.fields).toEqual({ tag: 'Material on hold' });
      // Cutting the piece does not free its pieces.
      const cut = await post('engineer', `/api/bar-pieces/${flagged}/cuts`, {
        pieces: [{ lengthMm: '248.5' }, { lengthMm: '248.5' }],
      });
      expect(cut.status).toBe(201);
      expect((await issue('TST-HOLD-NC-A')).body.error.message).toContain(
        `nonconformance ${nc.body.ncNumber} on the bar piece is open`,
      );

      const recalled = await receive('TST-HOLD-RC');
      const recall = await post('coordinator', '/api/recalls', {
        trigger: { pieceId: recalled },
        mode: 'recall',
        reason: 'Piece suspected mixed with another heat at the saw',
      });
      expect(recall.status).toBe(201);
      expect((await issue('TST-HOLD-RC')).body.error.message).toMatch(
        new RegExp(`is held: recall investigation ${recall.body.recallNumber} is open \\(`),
      );

      const drilled = await receive('TST-HOLD-DR');
      expect(
        (
          await post('coordinator', '/api/recalls', {
            trigger: { pieceId: drilled },
            mode: 'drill',
            reason: 'Quarterly drill on a fresh piece',
          })
        ).status,
      ).toBe(201);
      expect((await issue('TST-HOLD-DR')).status).toBe(201);
      // Returned at once, so that the lot's bar reconciliation further on is not changed by this test.
      expect(
        (await post('engineer', `/api/lots/${lots[0]!.id}/material-returns`, { tag: 'TST-HOLD-DR', lengthMm: '10' }))
          .status,
      ).toBe(201);
    },
  );

  it('when a QA approver signs the mixing of a second heat, then its bar can be issued to the lot', async () => {
    const [heat] = await running.database.dataSource.query('SELECT heat_id FROM bar_piece WHERE tag = ?', [tags[1]]);
    const signed = await signThroughApi(saml, people.approver!, {
      recordType: 'heat-mixing',
      recordId: `${lots[0]!.id}-${heat.heat_id}`,
      meaning: 'approved',
    });
    expect(signed.status).toBe(201);
    expect(
      (await post('engineer', `/api/lots/${lots[0]!.id}/material-issues`, { tag: tags[1], lengthMm: '60' })).status,
    ).toBe(201);
    expect((await detail(lots[0]!.id)).heats).toHaveLength(2);
  });

  it(
    '[LOT-UNIT-CHAIN] when operations are recorded, then ' + 'the routing order and the unit chain are enforced',
    async () => {
      const lot = lots[0]!;
      const early = await post('engineer', `/api/lots/${lot.id}/operations`, operation(20, 40));
      expect(early.body.error.message).toBe('Record step 10 Turn first; the routing runs in order');
      const unbalanced = await post('engineer', `/api/lots/${lot.id}/operations`, {
        ...operation(10, 40, 2),
        qtyGood: 37,
      });
      expect(unbalanced.status).toBe(400);
      expect(unbalanced.body.error.fields.qtyGood).toBe('Good + scrap must equal the 40 units in');
      expect((await post('engineer', `/api/lots/${lot.id}/operations`, operation(10, 40, 2))).status).toBe(201);
      const leaking = await post('engineer', `/api/lots/${lot.id}/operations`, operation(20, 40));
      expect(leaking.body.error.fields).toEqual({ qtyIn: 'Expected 38' });
      expect((await post('engineer', `/api/lots/${lot.id}/operations`, operation(20, 38))).status).toBe(201);
      const passivateByHand = await post('engineer', `/api/lots/${lot.id}/operations`, operation(30, 38));
      expect(passivateByHand.body.error.fields).toEqual({ stepNo: 'Record a passivation run' });
      for (const other of lots.slice(1, 3)) {
        await post('engineer', `/api/lots/${other.id}/operations`, operation(10, 10));
        await post('engineer', `/api/lots/${other.id}/operations`, operation(20, 10));
      }
    },
  );

  it(
    'when a measurement file is attached to an operation, then its type comes from its bytes and it downloads ' +
      'as stored',
    async () => {
      const lot = await detail(lots[0]!.id);
      const turning = lot.operations.find((operation) => operation.stepNo === 10)!;
      const path = `/api/lots/${lot.id}/operations/${turning.id}/files`;
      const attach = (bytes: Buffer, name: string) =>
        people.engineer!.agent.post(path).set('X-CSRF-Token', people.engineer!.csrf).attach('file', bytes, name);
      const csv = Buffer.from('feature,nominal,measured\nthread OD,3.50,3.49\n');
      const attached = await attach(csv, 'cmm-report.csv');
      expect(attached.status).toBe(201);
      expect(attached.body).toMatchObject({ mediaType: 'text/csv', name: 'cmm-report.csv' });
      const fake = await attach(Buffer.from([0x4d, 0x5a, 0x90, 0x00, 0x03, 0x00, 0x00, 0x00]), 'report.pdf');
      expect(fake.status).toBe(415);
      expect(fake.body.error.fields).toEqual({ file: 'Attach measurements as PDF, PNG, JPEG, CSV or text' });
      const binaryCsv = await attach(Buffer.from([0x61, 0x00, 0x62]), 'sneaky.csv');
      expect(binaryCsv.status).toBe(415);
      const download = await people.auditor!.agent.get(`${path}/${attached.body.documentId}`);
      expect(download.status).toBe(200);
      expect(download.headers['content-type']).toMatch(/^text\/csv/);
      expect(download.text).toBe(csv.toString('utf8'));
      expect((await detail(lot.id)).operations.find((operation) => operation.id === turning.id)?.files).toEqual([
        { documentId: attached.body.documentId, name: 'cmm-report.csv', sha256: attached.body.sha256 },
      ]);
    },
  );

  it(
    '[LOT-RUN-WINDOW] when three lots go through a passivation run in window and a cleaning run out of window, ' +
      'then each out-of-window lot gets a nonconformance',
    async () => {
      const three = lots.slice(0, 3).map((lot) => lot.id);
      const missing = await post('engineer', '/api/process-runs', {
        kind: 'passivation',
        methodId: 'F86-NITRIC',
        equipment: 'Line P1',
        operatorName: 'Test Operator',
        runAt: '2026-11-03T08:00:00Z',
        parameters: { bath: 'N2-1' },
        lotIds: three,
      });
      expect(missing.status).toBe(400);
      expect(Object.keys(missing.body.error.fields).sort()).toEqual([
        'parameters.acidConcentration',
        'parameters.immersionTime',
        'parameters.rinseConductivity',
        'parameters.temperature',
      ]);
      const notDue = await post('engineer', '/api/process-runs', {
        kind: 'passivation',
        methodId: 'F86-NITRIC',
        equipment: 'Line P1',
        operatorName: 'Test Operator',
        runAt: '2026-11-03T08:00:00Z',
        parameters: passivation,
        lotIds: [...three, lots[3]!.id],
      });
      expect(notDue.body.error.message).toBe(
        `Lot ${lots[3]!.lotNumber} is not due for passivation: its next step is 10 Turn`,
      );
      const passivated = await post('engineer', '/api/process-runs', {
        kind: 'passivation',
        methodId: 'F86-NITRIC',
        equipment: 'Line P1',
        operatorName: 'Test Operator',
        runAt: '2026-11-03T08:00:00Z',
        parameters: passivation,
        lotIds: three,
      });
      expect(passivated.status).toBe(201);
      expect(passivated.body).toMatchObject({
        inWindow: true,
        lotsInRun: expect.arrayContaining([expect.objectContaining({ qty: 38 })]),
        nonconformances: [],
      });
      const before = await count('nonconformance');
      const cleaned = await post('engineer', '/api/process-runs', {
        kind: 'cleaning',
        methodId: 'KIW-CLEAN-AQ',
        equipment: 'Ultrasonic U2',
        operatorName: 'Test Operator',
        runAt: '2026-11-03T11:00:00Z',
        parameters: { ...cleaning, washTemperature: '63' },
        lotIds: three,
      });
      expect(cleaned.status).toBe(201);
      expect(cleaned.body.inWindow).toBe(false);
      expect(
        cleaned.body.windowCheck.items.find((item: { key: string }) => item.key === 'washTemperature'),
      ).toMatchObject({ verdict: 'out-of-window', why: '63 °C is above the maximum 60 °C' });
      expect(cleaned.body.nonconformances).toHaveLength(3);
      expect(await count('nonconformance')).toBe(before + 3);
      expect((await detail(lots[0]!.id)).openNonconformances).toBe(1);
    },
  );

  it(
    'when QA dispositions and closes the nonconformance with signatures, then it is closed; the raiser may not ' +
      'sign it',
    async () => {
      const { nonconformances } = await detail(lots[0]!.id);
      const nc = nonconformances[0]!;
      const early = await signThroughApi(saml, people.approver!, {
        recordType: 'nonconformance',
        recordId: String(nc.id),
        meaning: 'dispositioned',
      });
      expect(early.body.error.message).toBe('State the disposition before signing it');
      expect(
        (
          await people
            .engineer!.agent.put(`/api/nonconformances/${nc.id}/disposition`)
            .set('X-CSRF-Token', people.engineer!.csrf)
            .send({ disposition: 'use-as-is', note: 'x' })
        ).status,
      ).toBe(403);
      const proposed = await people
        .approver!.agent.put(`/api/nonconformances/${nc.id}/disposition`)
        .set('X-CSRF-Token', people.approver!.csrf)
        .send({ disposition: 'use-as-is', note: 'Wash 3 °C over for 4 min; residue results within limits' });
      expect(proposed.status).toBe(200);
      const closeFirst = await signThroughApi(
        saml,
        people.approver!,
        { recordType: 'nonconformance', recordId: String(nc.id), meaning: 'closed' },
        'done',
      );
      expect(closeFirst.body.error.message).toBe('Sign the disposition before closing the nonconformance');
      expect(
        (
          await signThroughApi(saml, people.approver!, {
            recordType: 'nonconformance',
            recordId: String(nc.id),
            meaning: 'dispositioned',
          })
        ).status,
      ).toBe(201);
      expect(
        (
          await signThroughApi(
            saml,
            people.approver!,
            { recordType: 'nonconformance', recordId: String(nc.id), meaning: 'closed' },
            'Residue retest passed; disposition carried out',
          )
        ).status,
      ).toBe(201);
      expect((await people.auditor!.agent.get(`/api/nonconformances/${nc.id}`)).body.status).toBe('closed');

      const own = await post('approver', '/api/nonconformances', {
        subjectType: 'lot',
        subjectId: lots[3]!.id,
        description: 'Burr found on sample part',
        containment: 'Lot segregated on rack Q',
      });
      expect(own.status).toBe(201);
      await people
        .approver!.agent.put(`/api/nonconformances/${own.body.id}/disposition`)
        .set('X-CSRF-Token', people.approver!.csrf)
        .send({ disposition: 'rework', note: 'Deburr and re-inspect' });
      const refused = await signThroughApi(saml, people.approver!, {
        recordType: 'nonconformance',
        recordId: String(own.body.id),
        meaning: 'dispositioned',
      });
      expect(refused.status).toBe(422);
      expect(refused.body.error.message).toBe('You authored this record, so you cannot approve it');
    },
  );

  it(
    'when an inspection finds more defects than Ac, then the step records a reject and a nonconformance is ' + 'raised',
    async () => {
      const lot = lots[0]!;
      const short = await post(
        'engineer',
        `/api/lots/${lot.id}/operations`,
        operation(50, 38, 0, { inspected: 5, defectsFound: 0 }),
      );
      expect(short.body.error.fields).toEqual({ inspected: 'At least 8' });
      const rejected = await post(
        'engineer',
        `/api/lots/${lot.id}/operations`,
        operation(50, 38, 0, { inspected: 8, defectsFound: 1 }),
      );
      expect(rejected.status).toBe(201);
      expect(rejected.body).toMatchObject({ verdict: 'reject', why: '1 defective in 8 ≥ Re 1' });
      expect((await detail(lot.id)).nonconformances.filter((nc) => nc.status === 'open')).toHaveLength(1);
    },
  );

  it(
    '[LOT-SPLIT-MERGE] when a lot is split and two lots merged, then units are conserved and the genealogy is ' +
      'kept',
    async () => {
      const [a, b] = [lots[1]!, lots[2]!];
      const over = await post('engineer', `/api/lots/${a.id}/splits`, { quantities: [6, 5], reason: 'Customer split' });
      expect(over.body.error.message).toBe('The lot holds 10 units; 11 cannot be split off');
      const split = await post('engineer', `/api/lots/${a.id}/splits`, {
        quantities: [4],
        reason: 'Expedite four units',
      });
      expect(split.status).toBe(201);
      expect(split.body).toMatchObject({ children: [{ lotNumber: `${a.lotNumber}-A`, qty: 4 }], remaining: 6 });
      const child = await detail(split.body.children[0].id);
      expect(child).toMatchObject({
        origin: 'split',
        onHand: 4,
        resumesAfterStep: 40,
        parents: [{ lotNumber: a.lotNumber, kind: 'split', qty: 4 }],
      });
      const withOpenNc = await post('engineer', '/api/lots/merges', { lotIds: [a.id, b.id], reason: 'Consolidate' });
      expect(withOpenNc.body.error.message).toBe(`Lot ${a.lotNumber} cannot be merged: it has an open nonconformance`);
      const mergeable = await post('engineer', '/api/lots/merges', {
        lotIds: [split.body.children[0].id, lots[3]!.id],
        reason: 'x1y',
      });
      expect(mergeable.body.error.message).toMatch(/cannot be merged: it has not started$/);
    },
  );

  it(
    '[LOT-REJECTED] when a lot’s own nonconformance is dispositioned Scrap and signed, then the lot is Rejected ' +
      'for good; Rework leaves it open',
    async () => {
      const opened = await post('engineer', '/api/lots', { partId, plannedQty: 5 });
      expect(opened.status).toBe(201);
      const scrapped = await post('reviewer', '/api/nonconformances', {
        subjectType: 'lot',
        subjectId: opened.body.id,
        description: 'Wrong bar diameter turned; all parts undersize',
        containment: 'Lot quarantined on rack Q',
      });
      const reworked = await post('reviewer', '/api/nonconformances', {
        subjectType: 'lot',
        subjectId: lots[3]!.id,
        description: 'Burr on two parts',
        containment: 'Parts segregated',
      });
      const decide = async (ncId: number, disposition: string) => {
        expect(
          (
            await people
              .approver!.agent.put(`/api/nonconformances/${ncId}/disposition`)
              .set('X-CSRF-Token', people.approver!.csrf)
              .send({ disposition, note: 'Decided by the review board' })
          ).status,
        ).toBe(200);
        expect(
          (
            await signThroughApi(saml, people.approver!, {
              recordType: 'nonconformance',
              recordId: String(ncId),
              meaning: 'dispositioned',
            })
          ).status,
        ).toBe(201);
      };
      const before = (await detail(lots[3]!.id)).status;
      await decide(reworked.body.id, 'rework');
      expect((await detail(lots[3]!.id)).status).toBe(before);
      await decide(scrapped.body.id, 'scrap');
      expect((await detail(opened.body.id)).status).toBe('rejected');
      const [event] = await running.database.dataSource.query(
        "SELECT action, before_json, after_json FROM audit_event WHERE entity_type = 'lot' AND entity_id = ? " +
          'ORDER BY seq DESC LIMIT 1',
        [String(opened.body.id)],
      );
      expect([event.action, JSON.parse(event.before_json), JSON.parse(event.after_json)]).toEqual([
        'lot.rejected',
        { status: 'open' },
        { status: 'rejected', nonconformance: scrapped.body.ncNumber, disposition: 'scrap' },
      ]);
      // Nothing more happens to a rejected lot: no bar, no step, no submission for release.
      expect(
        (await post('engineer', `/api/lots/${opened.body.id}/material-issues`, { tag: tags[0], lengthMm: '10' }))
          .status,
      ).toBe(422);
      expect((await post('engineer', `/api/lots/${opened.body.id}/release-submissions`, {})).status).toBe(422);
    },
  );

  it(
    '[SHIP-RELEASED-ONLY] when a lot is not released, then it cannot ship; the material reconciliation explains ' +
      'the bar used',
    async () => {
      const consignee = await post('engineer', '/api/consignees', {
        name: 'Test Orthopaedic Centre',
        kind: 'hospital',
        country: 'Ireland',
        contactEmail: null,
      });
      expect(consignee.status).toBe(201);
      const before = await count('shipment');
      const refused = await post('engineer', `/api/lots/${lots[0]!.id}/shipments`, {
        consigneeId: consignee.body.id,
        qty: 1,
        shippedOn: '2026-11-20',
        documentNumber: 'DN-1',
      });
      expect(refused.status).toBe(422);
      expect(refused.body.error.message).toBe(`Lot ${lots[0]!.lotNumber} is open; only released lots ship`);
      expect(await count('shipment')).toBe(before);
      expect(
        (await post('engineer', `/api/lots/${lots[0]!.id}/material-returns`, { tag: tags[0], lengthMm: '60' })).status,
      ).toBe(201);
      const lot = await detail(lots[0]!.id);
      // 1800 + 60 issued − 60 returned = 1800 mm; 40 units × (42 + 3) mm = 1800 mm.
      expect(lot.materialReconciliation).toMatchObject({
        verdict: 'reconciled',
        consumedMm: '1800.00',
        expectedMm: '1800.00',
        differenceMm: '0.00',
      });
      expect(lot.unitChain).toMatchObject({ consistent: true, started: 40, scrapped: 2, onHand: 38 });
      expect(lot.timeline.map((entry) => entry.kind)).toEqual(
        expect.arrayContaining(['opened', 'material', 'operation', 'run', 'nonconformance']),
      );
    },
  );
});
