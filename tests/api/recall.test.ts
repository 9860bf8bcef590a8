import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RecallDetail, RecallRerun } from '@shared/schemas/recall';
import { createTestApp } from '../helpers/test-app';
import { adminSql } from '../helpers/admin-sql';
import { mailWithSubject } from '../helpers/mail-catcher';
import { lotToRecallPeople, SamlTestDriver, signInPeople } from '../helpers/saml-round-trip';
import { signThroughApi } from '../helpers/signing';
import { readPdf } from '../helpers/document-readers';
import { parse } from 'csv-parse/sync';
import { createHash } from 'node:crypto';
import canonicalize from 'canonicalize';
import { readyLotOf, twoStepPart } from '../helpers/two-step-part';

type Agent = Awaited<ReturnType<SamlTestDriver['signIn']>>['agent'];

const part = twoStepPart({
  partNumber: 'TST-RCL-01',
  description: 'Recall test pin',
  gtin: '09521230000048',
  lotPattern: 'Q{SEQ:4}',
});

describe(
  'recall investigations: frozen snapshot, holds, re-run ' + 'difference, exports, mail, closing signature, drills',
  () => {
    const running = createTestApp();
    let saml: SamlTestDriver;
    const people: Record<string, { agent: Agent; csrf: string; subject: string }> = {};
    let partId: number;
    let pieceId: number;
    const lots: Array<{ id: number; lotNumber: string }> = [];
    let recall: RecallDetail;

    function post(who: string, path: string, body: unknown) {
      return people[who]!.agent.post(path)
        .set('X-CSRF-Token', people[who]!.csrf)
        .send(body as object);
    }
    const readyLot = () => readyLotOf((path, body) => post('engineer', path, body), partId, 'TST-RCL-BAR');
    const detail = async (id: number) => (await people.auditor!.agent.get(`/api/recalls/${id}`)).body as RecallDetail;
    const readiness = async (lotId: number) =>
      (await people.auditor!.agent.get(`/api/lots/${lotId}/release`)).body.readiness;

    beforeAll(async () => {
      saml = await SamlTestDriver.create(running.config);
      Object.assign(people, await signInPeople(saml, running.app, lotToRecallPeople));
      const db = await running.database.connect();
      const [heat] = await db.query(
        "SELECT id, heat_number FROM heat WHERE status = 'accepted' AND spec_id = 'ASTM F136' ORDER BY id LIMIT 1",
      );
      pieceId = (
        await post('engineer', '/api/bar-pieces', {
          heatId: heat.id,
          markedHeatNumber: heat.heat_number,
          tag: 'TST-RCL-BAR',
          diameterMm: '25.4',
          lengthMm: '3000',
          location: 'Test rack',
        })
      ).body.id;
      partId = (await post('engineer', '/api/parts', part)).body.id;
      lots.push(await readyLot());
    });
    afterAll(() => running.close());

    it(
      'when the input is wrong or the person may not, then ' + 'nothing is opened and the reason is given per field',
      async () => {
        const db = await running.database.connect();
        const [before] = await db.query('SELECT COUNT(*) AS n FROM recall_investigation');
        const twoStarts = await post('coordinator', '/api/recalls', {
          trigger: { heatId: 1, pieceId },
          mode: 'recall',
          reason: 'Suspected inclusion in the bar',
        });
        expect(twoStarts.status).toBe(400);
        expect(twoStarts.body.error.fields['trigger.heatId']).toBe(
          'Start from exactly one of a heat, a bar piece, a run, a supplier or a part',
        );
        const noReason = await post('coordinator', '/api/recalls', {
          trigger: { pieceId },
          mode: 'drill',
          reason: 'bad',
        });
        expect(noReason.status).toBe(400);
        expect(noReason.body.error.fields.reason).toBe('Say in a sentence why the investigation is opened');
        const unknown = await post('coordinator', '/api/recalls', {
          trigger: { heatId: 4_000_000 },
          mode: 'recall',
          reason: 'Suspected inclusion in the bar',
        });
        expect(unknown.status).toBe(404);
        expect(
          (
            await post('engineer', '/api/recalls', {
              trigger: { pieceId },
              mode: 'recall',
              reason: 'Suspected inclusion in the bar',
            })
          ).status,
        ).toBe(403);
        const [after] = await db.query('SELECT COUNT(*) AS n FROM recall_investigation');
        expect(after).toEqual(before);
      },
    );

    it('when a drill is opened, then the affected set is frozen but no lot is held and no one is mailed', async () => {
      const opened = await post('coordinator', '/api/recalls', {
        trigger: { pieceId },
        mode: 'drill',
        reason: 'Quarterly recall rehearsal from one bar',
      });
      expect(opened.status).toBe(201);
      const drill = opened.body as RecallDetail;
      expect(drill.recallNumber).toMatch(/^DR-\d{4}-\d{4}$/);
      expect(drill.opening.content.trace.lots.map((lot) => lot.lotNumber)).toEqual([lots[0]!.lotNumber]);
      expect(drill.holds).toEqual([]);
      expect((await readiness(lots[0]!.id)).items.find((item: { key: string }) => item.key === 'holds').verdict).toBe(
        'pass',
      );
      expect(
        (await readiness(lots[0]!.id)).items.find((item: { key: string }) => item.key === 'held-material').verdict,
      ).toBe('pass');
      const db = await running.database.connect();
      expect(
        await db.query("SELECT id FROM mail_outbox WHERE entity_type = 'recall' AND entity_id = ?", [String(drill.id)]),
      ).toEqual([]);
    });

    it(
      '[RECALL-SNAPSHOT] when a recall is opened, then its snapshot is stored with its hash, the unshipped lot is ' +
        'held and the recall team is mailed',
      async () => {
        const opened = await post('coordinator', '/api/recalls', {
          trigger: { pieceId },
          mode: 'recall',
          reason: 'Mill reports a possible mix-up of bars in this heat',
        });
        expect(opened.status).toBe(201);
        recall = opened.body as RecallDetail;
        expect(recall.recallNumber).toMatch(/^RC-\d{4}-\d{4}$/);
        expect(recall.opening.content.takenBy).toBe('Oluwaseun Adeyemi');
        // The stored hash is the SHA-256 of the RFC 8785 canonical JSON of what the snapshot states (canonicalize, from
        // the registry).
        expect(recall.opening.sha256).toBe(
          createHash('sha256').update(canonicalize(recall.opening.content)!).digest('hex'),
        );
        expect(recall.holds.map((hold) => [hold.lotNumber, hold.liftedAt])).toEqual([[lots[0]!.lotNumber, null]]);
        const checklist = await readiness(lots[0]!.id);
        expect(checklist.items.find((item: { key: string }) => item.key === 'holds')).toMatchObject({
          verdict: 'fail',
          why: `on hold by recall investigation ${recall.recallNumber}`,
        });
        // The bar issued to it is named too, with the recall that holds it (the drill on the same bar holds nothing).
        expect(checklist.items.find((item: { key: string }) => item.key === 'held-material')).toMatchObject({
          verdict: 'fail',
          why: `bar TST-RCL-BAR: recall investigation ${recall.recallNumber} is open (bar TST-RCL-BAR)`,
        });
        const refused = await post('engineer', `/api/lots/${lots[0]!.id}/release-submissions`, {});
        expect(refused.status).toBe(422);
        expect(refused.body.error.fields).toEqual({
          holds: `on hold by recall investigation ${recall.recallNumber}`,
          'held-material': `bar TST-RCL-BAR: recall investigation ${recall.recallNumber} is open (bar TST-RCL-BAR)`,
        });
        const mail = await mailWithSubject(
          running.config.MAIL_WEB_PORT,
          `Recall investigation ${recall.recallNumber} opened: bar TST-RCL-BAR`,
        );
        expect(mail.to.map((to) => to.address).sort()).toEqual(
          expect.arrayContaining(['joaquin.ferreira@kestrelmoor.example', 'oluwaseun.adeyemi@kestrelmoor.example']),
        );
        expect(mail.text).toContain(`Lots placed on hold (not yet shipped): ${lots[0]!.lotNumber}`);
      },
    );

    it(
      'when records change after opening, then the opening snapshot stays as it was and a re-run shows the ' +
        'difference and holds the new lot',
      async () => {
        const before = await detail(recall.id);
        // Bar under an open recall can no longer be issued, so a lot that reaches the affected set after opening is one
        // whose
        // issue is recorded late, behind the product's back: the database administrator sets the recall aside for that
        // moment.
        await adminSql(`UPDATE recall_investigation SET status = 'closed' WHERE id = ${recall.id}`);
        try {
          lots.push(await readyLot());
        } finally {
          await adminSql(`UPDATE recall_investigation SET status = 'open' WHERE id = ${recall.id}`);
        }
        const again = await detail(recall.id);
        expect(again.opening).toEqual(before.opening);
        const rerun = await post('coordinator', `/api/recalls/${recall.id}/reruns`, {});
        expect(rerun.status).toBe(201);
        const result = rerun.body as RecallRerun;
        expect(result.diff.unchanged).toBe(false);
        expect(result.diff.lotsAdded.map((lot) => lot.lotNumber)).toEqual([lots[1]!.lotNumber]);
        expect(result.diff.lotsRemoved).toEqual([]);
        expect(result.heldNow).toEqual([lots[1]!.lotNumber]);
        const after = await detail(recall.id);
        expect(after.opening).toEqual(before.opening);
        expect(after.reruns.map((snapshot) => snapshot.sha256)).toEqual([result.snapshot.sha256]);
        expect(after.holds.map((hold) => hold.lotNumber).sort()).toEqual(
          [lots[0]!.lotNumber, lots[1]!.lotNumber].sort(),
        );
        await mailWithSubject(
          running.config.MAIL_WEB_PORT,
          `Recall investigation ${recall.recallNumber}: the affected set changed`,
        );
        // The app's database account may not rewrite a snapshot.
        const db = await running.database.connect();
        await expect(
          db.query("UPDATE recall_snapshot SET content = '{}' WHERE recall_id = ?", [recall.id]),
        ).rejects.toThrow(/UPDATE command denied/);
      },
    );

    it(
      '[RECALL-EXPORT] when exported, then the CSV and the PDF state the frozen set with its hash, opening and ' +
        're-run apart',
      async () => {
        const csv = await people.auditor!.agent.get(`/api/recalls/${recall.id}/export?format=csv`);
        expect(csv.status).toBe(200);
        expect(csv.headers['content-type']).toBe('text/csv; charset=utf-8');
        expect(csv.headers['x-snapshot-sha256']).toBe(recall.opening.sha256);
        const rows = parse(csv.text, { columns: true }) as Array<Record<string, string>>;
        expect(rows.filter((row) => row.row === 'lot').map((row) => row.lot)).toEqual([lots[0]!.lotNumber]);
        expect(
          rows.every(
            (row) => row.snapshot_sha256 === recall.opening.sha256 && row.investigation === recall.recallNumber,
          ),
        ).toBe(true);
        expect(rows.find((row) => row.row === 'lot')).toMatchObject({
          lot_status: 'open',
          units_started: '20',
          units_shipped: '0',
        });
        const rerunId = (await detail(recall.id)).reruns[0]!.id;
        const rerunCsv = parse(
          (await people.auditor!.agent.get(`/api/recalls/${recall.id}/export?format=csv&snapshot=${rerunId}`)).text,
          { columns: true },
        ) as Array<Record<string, string>>;
        expect(
          rerunCsv
            .filter((row) => row.row === 'lot')
            .map((row) => row.lot)
            .sort(),
        ).toEqual(lots.map((lot) => lot.lotNumber).sort());
        const pdf = await people
          .auditor!.agent.get(`/api/recalls/${recall.id}/export?format=pdf`)
          .buffer(true)
          .parse((response, done) => {
            const chunks: Buffer[] = [];
            response.on('data', (chunk: Buffer) => chunks.push(chunk));
            response.on('end', () => done(null, Buffer.concat(chunks)));
          });
        expect(pdf.headers['content-type']).toBe('application/pdf');
        const { text } = readPdf(pdf.body as Buffer);
        expect(text).toContain(`Recall investigation ${recall.recallNumber}`);
        expect(text).toContain(recall.opening.sha256.slice(0, 32));
        expect(text).toContain(lots[0]!.lotNumber);
        expect(text).not.toContain(lots[1]!.lotNumber);
        expect(text).toContain('rest with the firm');
        expect((await people.auditor!.agent.get(`/api/recalls/${recall.id}/export?format=xls`)).status).toBe(400);
      },
    );

    it(
      '[RECALL-HOLD] when a lot is held, then it can be neither shipped, split nor released until a QA approver ' +
        'lifts the hold with a signature',
      async () => {
        const hold = (await detail(recall.id)).holds.find((entry) => entry.lotNumber === lots[0]!.lotNumber)!;
        const split = await post('engineer', `/api/lots/${lots[0]!.id}/splits`, {
          quantities: [5],
          reason: 'try to move units',
        });
        expect(split.status).toBe(422);
        expect(split.body.error.message).toBe(
          `Lot ${lots[0]!.lotNumber} is on hold by recall investigation ${recall.recallNumber}; it cannot be ` +
            `split until a QA approver lifts the hold`,
        );
        // The coordinator placed it and may not lift it; an engineer has no right to.
        expect(
          (
            await signThroughApi(
              saml,
              people.coordinator!,
              { recordType: 'lot-hold', recordId: String(hold.id), meaning: 'lifted' },
              'Bar confirmed correct',
            )
          ).status,
        ).toBe(403);
        const noReason = await signThroughApi(saml, people.approver!, {
          recordType: 'lot-hold',
          recordId: String(hold.id),
          meaning: 'lifted',
        });
        expect(noReason.status).toBe(422);
        expect(noReason.body.error.fields).toEqual({ reason: 'A reason of at least 3 characters is required' });
        const lifted = await signThroughApi(
          saml,
          people.approver!,
          { recordType: 'lot-hold', recordId: String(hold.id), meaning: 'lifted' },
          'Mill confirmed by re-test that this bar is from the stated heat',
        );
        expect(lifted.status).toBe(201);
        expect((await detail(recall.id)).holds.find((entry) => entry.id === hold.id)!.liftedBy).toBe(
          'Joaquín Ferreira',
        );
        expect((await readiness(lots[0]!.id)).items.find((item: { key: string }) => item.key === 'holds').verdict).toBe(
          'pass',
        );
        expect(
          (
            await signThroughApi(
              saml,
              people.approver!,
              { recordType: 'lot-hold', recordId: String(hold.id), meaning: 'lifted' },
              'again',
            )
          ).status,
        ).toBe(422);
      },
    );

    it('when a released lot is held, then its remaining units cannot ship', async () => {
      const lot = lots[0]!;
      const submitted = await post('engineer', `/api/lots/${lot.id}/release-submissions`, {});
      expect(submitted.status).toBe(201);
      expect(
        (
          await signThroughApi(saml, people.reviewer!, {
            recordType: 'lot-release',
            recordId: String(lot.id),
            meaning: 'reviewed',
          })
        ).status,
      ).toBe(201);
      expect(
        (
          await signThroughApi(saml, people.approver!, {
            recordType: 'lot-release',
            recordId: String(lot.id),
            meaning: 'approved-for-release',
          })
        ).status,
      ).toBe(201);
      const consignees = (await people.engineer!.agent.get('/api/consignees')).body as Array<{ id: number }>;
      expect(
        (
          await post('engineer', `/api/lots/${lot.id}/shipments`, {
            consigneeId: consignees[0]!.id,
            qty: 5,
            shippedOn: '2026-11-25',
            documentNumber: 'DN-RCL-1',
          })
        ).status,
      ).toBe(201);
      const second = await post('coordinator', '/api/recalls', {
        trigger: { pieceId },
        mode: 'recall',
        reason: 'Second finding on the same bar from the customer',
      });
      expect(second.status).toBe(201);
      const opened = second.body as RecallDetail;
      expect(opened.opening.content.trace.lots.find((entry) => entry.id === lot.id)).toMatchObject({
        status: 'released',
        released: 20,
        shipped: 5,
        onHand: 15,
      });
      expect(opened.opening.content.trace.consignees).toHaveLength(1);
      expect(opened.holds.map((hold) => hold.lotNumber).sort()).toEqual(lots.map((entry) => entry.lotNumber).sort());
      const refused = await post('engineer', `/api/lots/${lot.id}/shipments`, {
        consigneeId: consignees[0]!.id,
        qty: 5,
        shippedOn: '2026-11-26',
        documentNumber: 'DN-RCL-2',
      });
      expect(refused.status).toBe(422);
      expect(refused.body.error.fields).toEqual({ qty: 'Lot on hold' });
    });

    it(
      '[RECALL-CLOSE] when closing, then the opener may not, open holds block it, and a QA approver signs it ' +
        'closed with a reason',
      async () => {
        const bySelf = await signThroughApi(
          saml,
          people.coordinator!,
          { recordType: 'recall-investigation', recordId: String(recall.id), meaning: 'closed' },
          'Done',
        );
        expect(bySelf.status).toBe(422);
        expect(bySelf.body.error.message).toBe('You authored this record, so you cannot approve it');
        const blocked = await signThroughApi(
          saml,
          people.approver!,
          { recordType: 'recall-investigation', recordId: String(recall.id), meaning: 'closed' },
          'Done',
        );
        expect(blocked.status).toBe(422);
        expect(blocked.body.error.message).toBe(
          '1 lot(s) are still held by this investigation; a QA approver lifts each hold (after its disposition) ' +
            'before it closes',
        );
        const hold = (await detail(recall.id)).holds.find((entry) => entry.liftedAt === null)!;
        expect(
          (
            await signThroughApi(
              saml,
              people.approver!,
              { recordType: 'lot-hold', recordId: String(hold.id), meaning: 'lifted' },
              'Lot scrapped under its nonconformance',
            )
          ).status,
        ).toBe(201);
        const closed = await signThroughApi(
          saml,
          people.approver!,
          { recordType: 'recall-investigation', recordId: String(recall.id), meaning: 'closed' },
          'Mill re-test cleared the bar; no field action',
        );
        expect(closed.status).toBe(201);
        const after = await detail(recall.id);
        expect(after.status).toBe('closed');
        expect(after.closedAt).not.toBeNull();
        expect((await post('coordinator', `/api/recalls/${recall.id}/reruns`, {})).status).toBe(422);
        const list = (await people.auditor!.agent.get('/api/recalls?status=closed')).body;
        expect(list.items.map((item: { recallNumber: string }) => item.recallNumber)).toContain(recall.recallNumber);
        await mailWithSubject(running.config.MAIL_WEB_PORT, `Recall investigation ${recall.recallNumber} closed`);
      },
    );
  },
);
