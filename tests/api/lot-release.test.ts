import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp } from '../helpers/test-app';
import { mailWithSubject } from '../helpers/mail-catcher';
import { SamlTestDriver, signInPeople } from '../helpers/saml-round-trip';
import { signThroughApi } from '../helpers/signing';
import { adminSql } from '../helpers/admin-sql';
import { readPdf } from '../helpers/document-readers';
import { buildBarcodeData } from '@shared/domain/gs1/element-string';
import { packetData, renderReleasePacket } from '../../server/src/modules/release/release-packet';
import request from 'supertest';
import { releaseQueuePageSchema } from '@shared/schemas/release';
import { createHash } from 'node:crypto';
import { twoStepPart } from '../helpers/two-step-part';

type Agent = Awaited<ReturnType<SamlTestDriver['signIn']>>['agent'];

const part = twoStepPart({
  partNumber: 'TST-PIN-02',
  description: 'Test pin 2.0 × 30',
  gtin: '09521230000024',
  lotPattern: 'R{YY}{SEQ:4}',
});

describe('lot release: readiness, submission, two signatures, shipment', () => {
  const running = createTestApp();
  let saml: SamlTestDriver;
  const people: Record<string, { agent: Agent; csrf: string; subject: string }> = {};
  const lots: number[] = [];

  beforeAll(async () => {
    saml = await SamlTestDriver.create(running.config);
    Object.assign(
      people,
      await signInPeople(saml, running.app, {
        engineer: 'kiw-0102',
        reviewer: 'kiw-0201',
        approver: 'kiw-0301',
        auditor: 'kiw-0401',
      }),
    );
    const db = await running.database.connect();
    // A heat no other test file picks (they take the first two or the last): the packet prints the
    // heat's signatures and nonconformances, and its bytes are compared across two renders.
    const [heat] = await db.query(
      "SELECT id, heat_number FROM heat WHERE status = 'accepted' AND spec_id = 'ASTM F136' ORDER BY id LIMIT " +
        '1 OFFSET 2',
    );
    await post('engineer', '/api/bar-pieces', {
      heatId: heat.id,
      markedHeatNumber: heat.heat_number,
      tag: 'TST-REL-BAR',
      diameterMm: '25.4',
      lengthMm: '3000',
      location: 'Test rack',
    });
    const created = await post('engineer', '/api/parts', part);
    for (let index = 0; index < 3; index++) {
      const lot = await post('engineer', '/api/lots', { partId: created.body.id, plannedQty: 20 });
      lots.push(lot.body.id);
      await post('engineer', `/api/lots/${lot.body.id}/material-issues`, { tag: 'TST-REL-BAR', lengthMm: '672' });
      await post('engineer', `/api/lots/${lot.body.id}/material-returns`, { tag: 'TST-REL-BAR', lengthMm: '32' });
      const times = {
        operatorName: 'Test',
        workCentre: 'Cell 1',
        startedAt: '2026-11-20T08:00:00Z',
        endedAt: '2026-11-20T09:00:00Z',
      };
      await post('engineer', `/api/lots/${lot.body.id}/operations`, {
        ...times,
        stepNo: 10,
        qtyIn: 20,
        qtyGood: 20,
        qtyScrap: 0,
      });
      await post('engineer', `/api/lots/${lot.body.id}/operations`, {
        ...times,
        stepNo: 20,
        qtyIn: 20,
        qtyGood: 20,
        qtyScrap: 0,
        inspected: 5,
        defectsFound: 0,
      });
    }
  });
  afterAll(() => running.close());

  function post(who: string, path: string, body: unknown) {
    return people[who]!.agent.post(path)
      .set('X-CSRF-Token', people[who]!.csrf)
      .send(body as object);
  }
  const view = async (lotId: number) => (await people.auditor!.agent.get(`/api/lots/${lotId}/release`)).body;

  it(
    '[RELEASE-NOT-READY] when labels are not yet printed, then the lot is not ready and submission is refused ' +
      'with the reason',
    async () => {
      const before = await view(lots[0]!);
      expect(before.readiness.ready).toBe(false);
      expect(
        before.readiness.items
          .filter((item: { verdict: string }) => item.verdict === 'fail')
          .map((item: { key: string; why: string }) => [item.key, item.why]),
      ).toEqual([['labels', '0 labels printed (net of voided) for 20 units']]);
      const refused = await post('engineer', `/api/lots/${lots[0]}/release-submissions`, {});
      expect(refused.status).toBe(422);
      expect(refused.body.error.fields).toEqual({ labels: '0 labels printed (net of voided) for 20 units' });
    },
  );

  it(
    'when labels are printed and spoiled ones voided, ' + 'then the count reconciles and the engineer submits',
    async () => {
      for (const lotId of lots)
        expect((await post('engineer', `/api/lots/${lotId}/labels`, { kind: 'print', qty: 22 })).status).toBe(201);
      const noReason = await post('engineer', `/api/lots/${lots[0]}/labels`, { kind: 'void', qty: 2 });
      expect(noReason.body.error.fields).toEqual({ reason: 'Say why the labels are voided' });
      for (const lotId of lots)
        expect(
          (await post('engineer', `/api/lots/${lotId}/labels`, { kind: 'void', qty: 2, reason: 'Smudged print' })).body,
        ).toEqual({ netLabels: 20 });
      expect((await view(lots[0]!)).readiness.ready).toBe(true);
      expect((await post('reviewer', `/api/lots/${lots[0]}/release-submissions`, {})).status).toBe(403);
      const submitted = await post('engineer', `/api/lots/${lots[0]}/release-submissions`, {});
      expect(submitted.status).toBe(201);
      expect(submitted.body.status).toBe('submitted');
      const queue = releaseQueuePageSchema.parse(
        (await people.reviewer!.agent.get('/api/release-queue?queue=review')).body,
      );
      expect(queue.items.map((item) => item.lotId)).toContain(lots[0]);
      // Each tab's count is the number of lots in that state, as the database holds them.
      const [counted] = await running.database.dataSource.query(
        "SELECT SUM(status = 'submitted') AS review, SUM(status = 'reviewed') AS approval, SUM(status = " +
          "'released') AS released FROM production_lot",
      );
      expect(queue.counts).toMatchObject({
        review: Number(counted.review),
        approval: Number(counted.approval),
        released: Number(counted.released),
      });
      expect(queue.total).toBe(queue.counts.review);
      // The QA reviewers are told, through the outbox and the real SMTP catcher.
      const lotNumber = (await view(lots[0]!)).lotNumber as string;
      const mail = await mailWithSubject(running.config.MAIL_WEB_PORT, `Lot ${lotNumber} awaits your review`);
      expect(mail.to.map((address: { address: string }) => address.address)).toContain(
        'aisling.nibhriain@kestrelmoor.example',
      );
      expect(mail.text).toContain(`${running.config.PUBLIC_URL}/lots/${lots[0]}`);
    },
  );

  it(
    '[RELEASE-SIGNED] when the reviewer and a different approver sign, then the lot is released; shipping is ' +
      'limited to the released units',
    async () => {
      const early = await signThroughApi(saml, people.approver!, {
        recordType: 'lot-release',
        recordId: String(lots[0]),
        meaning: 'approved-for-release',
      });
      expect(early.body.error.message).toBe('The lot is submitted, not reviewed');
      expect(
        (
          await signThroughApi(saml, people.engineer!, {
            recordType: 'lot-release',
            recordId: String(lots[0]),
            meaning: 'reviewed',
          })
        ).status,
      ).toBe(403);
      expect(
        (
          await signThroughApi(saml, people.reviewer!, {
            recordType: 'lot-release',
            recordId: String(lots[0]),
            meaning: 'reviewed',
          })
        ).status,
      ).toBe(201);
      // Awaiting approval shows who reviewed the lot, not only who submitted it.
      const awaiting = releaseQueuePageSchema.parse(
        (await people.approver!.agent.get('/api/release-queue?queue=approval&pageSize=100')).body,
      );
      expect(awaiting.items.find((item) => item.lotId === lots[0])).toMatchObject({
        submittedBy: 'Tobiasz Wierzchlas',
        reviewedBy: 'Aisling Ní Bhriain',
      });
      expect(
        (
          await signThroughApi(saml, people.approver!, {
            recordType: 'lot-release',
            recordId: String(lots[0]),
            meaning: 'approved-for-release',
          })
        ).status,
      ).toBe(201);
      expect((await view(lots[0]!)).status).toBe('released');
      // The status changes the signatures made are recorded under each signer's acting role and the
      // request that carried the signature (its id and address), like any other change.
      const changes: Array<{ action: string; actor_name: string; actor_role: string; request_id: string | null }> =
        await running.database.dataSource.query(
          `SELECT action, actor_name, actor_role, request_id FROM audit_event
          WHERE entity_type = 'lot' AND entity_id = ? AND action IN ('lot.reviewed', 'lot.released') ORDER BY seq`,
          [String(lots[0])],
        );
      expect(changes.map(({ request_id: _id, ...change }) => change)).toEqual([
        { action: 'lot.reviewed', actor_name: 'Aisling Ní Bhriain', actor_role: 'qa-reviewer' },
        { action: 'lot.released', actor_name: 'Joaquín Ferreira', actor_role: 'qa-approver' },
      ]);
      for (const change of changes) expect(change.request_id).toMatch(/\S/);
      const consignee = await post('engineer', '/api/consignees', {
        name: 'Test Release Clinic',
        kind: 'hospital',
        country: 'Norway',
        contactEmail: null,
      });
      const shipped = await post('engineer', `/api/lots/${lots[0]}/shipments`, {
        consigneeId: consignee.body.id,
        qty: 15,
        shippedOn: '2026-11-25',
        documentNumber: 'DN-7001',
      });
      expect(shipped.status).toBe(201);
      const over = await post('engineer', `/api/lots/${lots[0]}/shipments`, {
        consigneeId: consignee.body.id,
        qty: 6,
        shippedOn: '2026-11-26',
        documentNumber: 'DN-7002',
      });
      expect(over.body.error.message).toMatch(/has 5 released units not yet shipped; 6 cannot ship$/);
      const late = await post('engineer', `/api/lots/${lots[0]}/labels`, { kind: 'print', qty: 1 });
      expect(late.status).toBe(422);
    },
  );

  it(
    '[RELEASE-PACKET] when the released lot’s packet is requested, then a PDF with every section, a decodable ' +
      'UDI and a QR that the resolver opens is stored once',
    async () => {
      const lotNumber = (await view(lots[0]!)).lotNumber as string;
      const response = await people
        .auditor!.agent.get(`/api/lots/${lots[0]}/release-packet`)
        .buffer(true)
        .parse((res, callback) => {
          const chunks: Buffer[] = [];
          res.on('data', (chunk: Buffer) => chunks.push(chunk));
          res.on('end', () => callback(null, Buffer.concat(chunks)));
        });
      expect(response.status).toBe(200);
      expect(response.headers['content-type']).toBe('application/pdf');
      const pdf = response.body as Buffer;
      const sha256 = createHash('sha256').update(pdf).digest('hex');
      expect(response.headers['x-packet-sha256']).toBe(sha256);
      const { text, qrCodes, dataMatrix } = readPdf(pdf);
      for (const section of [
        'Release packet',
        'Release signatures',
        'Genealogy',
        'Material certificates and their evaluation',
        'Operations',
        'Passivation and cleaning runs',
        'Inspections',
        'Nonconformances',
        'Release checklist as evaluated',
        'Audit trail reviewed before release',
        'Every signature in this record',
        'Packet content SHA-256',
      ]) {
        expect(text, section).toContain(section);
      }
      expect(text).toContain('Regulated release rests with the firm’s quality system');
      expect(text).toContain('Aisling Ní Bhriain — Reviewed —');
      expect(text).toContain('Joaquín Ferreira — Approved for release —');
      // The trail the reviewer's signature recorded is printed with the packet, event by event.
      const { auditTrail } = await view(lots[0]!);
      const reviewed = auditTrail.events.filter((event: { seq: number }) => event.seq <= auditTrail.reviewedThroughSeq);
      expect(text).toContain(`The QA review covered ${reviewed.length} audit trail event(s) on this lot`);
      // Events are named in words in the packet, never by their stored code.
      expect(text).toContain('Lot opened');
      expect(text).not.toContain('lot.opened');
      expect(text).toContain('Bar issued to lot');
      expect(text).toContain('TST-REL-BAR');
      const [certificate] = await running.database.dataSource.query(
        'SELECT d.sha256 FROM bar_piece b JOIN heat_certificate c ON c.heat_id = b.heat_id JOIN ' +
          "certificate_document d ON d.id = c.document_id WHERE b.tag = 'TST-REL-BAR' LIMIT 1",
      );
      expect(text.replace(/\s+/g, '')).toContain(certificate.sha256);
      const digitalLink = `${running.config.PUBLIC_URL}/01/09521230000024/10/${lotNumber}`;
      expect(qrCodes).toEqual([digitalLink]);
      // The DataMatrix carries the GS1 element string (dmtxread prints the data without the FNC1 start).
      expect(dataMatrix[0]).toBe(
        buildBarcodeData({ gtin: '09521230000024', lot: lotNumber, serial: null, expiry: null, productionDate: null }),
      );
      const resolved = await people.auditor!.agent.get(new URL(digitalLink).pathname);
      expect(resolved.status).toBe(302);
      // The QR opens the lot itself.
      expect(resolved.headers.location).toBe(`/lots/${lots[0]}`);
      // The same key traced back finds exactly that lot.
      const traced = await people.auditor!.agent.get(
        `/api/trace/backward?udi=${encodeURIComponent(`(01)09521230000024(10)${lotNumber}`)}`,
      );
      expect(traced.body.lots.map((entry: { id: number }) => entry.id)).toEqual([lots[0]]);
      const anonymous = await request(running.app).get(new URL(digitalLink).pathname);
      expect(anonymous.headers.location).toBe(`/sign-in?returnTo=${encodeURIComponent(new URL(digitalLink).pathname)}`);
      expect((await people.auditor!.agent.get('/01/09521230000024/10/NO-SUCH-LOT')).status).toBe(404);
      expect((await people.auditor!.agent.get('/01/09521230000025/10/X')).text).toContain(
        'The check digit should be 4',
      );
      // Stored once: the second request returns the same bytes; rendering again from the data gives the same bytes too.
      const again = await people.auditor!.agent.get(`/api/lots/${lots[0]}/release-packet`);
      expect(again.headers['x-packet-sha256']).toBe(sha256);
      const rerendered = await renderReleasePacket(
        await packetData(running.database.dataSource.manager, lots[0]!, running.config.PUBLIC_URL),
      );
      expect(createHash('sha256').update(rerendered).digest('hex')).toBe(sha256);
      const [{ packets }] = await running.database.dataSource.query(
        'SELECT COUNT(*) AS packets FROM release_packet WHERE lot_id = ?',
        [lots[0]],
      );
      expect(Number(packets)).toBe(1);
      // Storing it was recorded once, by the request that stored it, not by the one that read it back.
      const [{ stored }] = await running.database.dataSource.query(
        "SELECT COUNT(*) AS stored FROM audit_event WHERE action = 'lot.release-packet-stored' AND entity_type " +
          "= 'lot' AND entity_id = ?",
        [String(lots[0])],
      );
      expect(Number(stored)).toBe(1);
      expect((await people.auditor!.agent.get(`/api/lots/${lots[1]}/release-packet`)).status).toBe(422);
    },
  );

  it(
    '[RELEASE-LABELS] when labels are printed, then each page is one label at the chosen size whose DataMatrix ' +
      'scans to the lot’s UDI',
    async () => {
      const lotNumber = (await view(lots[0]!)).lotNumber as string;
      const response = await people
        .engineer!.agent.get(`/api/lots/${lots[0]}/labels.pdf?count=2&widthMm=100&heightMm=50`)
        .buffer(true)
        .parse((res, callback) => {
          const chunks: Buffer[] = [];
          res.on('data', (chunk: Buffer) => chunks.push(chunk));
          res.on('end', () => callback(null, Buffer.concat(chunks)));
        });
      expect(response.status).toBe(200);
      const { text, dataMatrix } = readPdf(response.body as Buffer);
      expect(text).toContain(`LOT ${lotNumber}`);
      expect(text).toContain(`(01)09521230000024(10)${lotNumber}`);
      expect(text.split('\f').filter((page) => page.trim()).length).toBe(2);
      expect(dataMatrix[0]).toBe(
        buildBarcodeData({ gtin: '09521230000024', lot: lotNumber, serial: null, expiry: null, productionDate: null }),
      );
      const tooMany = await people.engineer!.agent.get(`/api/lots/${lots[0]}/labels.pdf?count=5000`);
      expect(tooMany.status).toBe(400);
      expect(tooMany.body.error.fields).toEqual({ 'query.count': 'At most 2,000 labels at once' });
      expect((await people.auditor!.agent.get(`/api/lots/${lots[0]}/labels.pdf?count=1`)).status).toBe(403);
    },
  );

  it(
    '[RELEASE-REREVIEW] when the lot changes after review, ' + 'then approval is refused until it is reviewed again',
    async () => {
      await post('engineer', `/api/lots/${lots[1]}/release-submissions`, {});
      expect(
        (
          await signThroughApi(saml, people.reviewer!, {
            recordType: 'lot-release',
            recordId: String(lots[1]),
            meaning: 'reviewed',
          })
        ).status,
      ).toBe(201);
      const raised = await post('reviewer', '/api/nonconformances', {
        subjectType: 'lot',
        subjectId: lots[1],
        description: 'Scratch on two parts seen at packing',
        containment: 'Lot held',
      });
      expect(raised.status).toBe(201);
      const refused = await signThroughApi(saml, people.approver!, {
        recordType: 'lot-release',
        recordId: String(lots[1]),
        meaning: 'approved-for-release',
      });
      expect(refused.status).toBe(422);
      expect(refused.body.error.message).toBe('The lot changed after it was reviewed; it must be reviewed again');
      const signatures = (await people.auditor!.agent.get(`/api/signatures?recordType=lot-release&recordId=${lots[1]}`))
        .body;
      expect(signatures).toEqual([expect.objectContaining({ meaning: 'reviewed', changedAfterSigning: true })]);
      // Sending it back is "returned to engineering"; "rejected" is not a meaning of a release signature.
      const wrongWord = await signThroughApi(
        saml,
        people.approver!,
        { recordType: 'lot-release', recordId: String(lots[1]), meaning: 'rejected' },
        'Open nonconformance on the lot',
      );
      expect(wrongWord.status).toBe(422);
      const returned = await signThroughApi(
        saml,
        people.approver!,
        { recordType: 'lot-release', recordId: String(lots[1]), meaning: 'returned-to-engineering' },
        'Open nonconformance on the lot',
      );
      expect(returned.status).toBe(201);
      expect((await view(lots[1]!)).status).toBe('open');
      expect((await view(lots[1]!)).submissions[0]).toMatchObject({ outcome: 'returned' });
      const mail = await mailWithSubject(
        running.config.MAIL_WEB_PORT,
        `Lot ${(await view(lots[1]!)).lotNumber} was returned to engineering`,
      );
      expect(mail.text).toContain('was returned to engineering for correction');
    },
  );

  it(
    '[RELEASE-SOD] when the approver authored part of the lot’s record, then separation of duties refuses the ' +
      'approval',
    async () => {
      await post('engineer', `/api/lots/${lots[2]}/release-submissions`, {});
      expect(
        (
          await signThroughApi(saml, people.reviewer!, {
            recordType: 'lot-release',
            recordId: String(lots[2]),
            meaning: 'reviewed',
          })
        ).status,
      ).toBe(201);
      // The approver is made the recorder of one step, as if they had entered it.
      await adminSql(
        `UPDATE lot_operation SET recorded_by = (SELECT id FROM person WHERE subject = 'kiw-0301') WHERE lot_id ` +
          `= ${lots[2]} AND routing_step_id = (SELECT id FROM routing_step WHERE step_no = 10 AND part_id = ` +
          `(SELECT part_id FROM production_lot WHERE id = ${lots[2]}))`,
      );
      const refused = await signThroughApi(saml, people.approver!, {
        recordType: 'lot-release',
        recordId: String(lots[2]),
        meaning: 'approved-for-release',
      });
      expect(refused.status).toBe(422);
      expect(refused.body.error.message).toBe('You authored this record, so you cannot approve it');
    },
  );
});
