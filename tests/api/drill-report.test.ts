// The recall drill report on a hand-built scenario: one bar, two lots of 20. Lot A is released and
// ships 5 units to one consignee and 7 to another; lot B stays open with its 20 units in work.
// Worked by hand: 2 lots, 40 started, 20 released, 12 shipped, 8 + 20 = 28 in plant, 2 consignees.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parse } from 'csv-parse/sync';
import type { DrillReport, RecallDetail } from '@shared/schemas/recall';
import { createTestApp } from '../helpers/test-app';
import { lotToRecallPeople, SamlTestDriver, signInPeople } from '../helpers/saml-round-trip';
import { signThroughApi } from '../helpers/signing';
import { readPdf } from '../helpers/document-readers';
import { readyLotOf, twoStepPart } from '../helpers/two-step-part';

type Agent = Awaited<ReturnType<SamlTestDriver['signIn']>>['agent'];

const part = twoStepPart({
  partNumber: 'TST-DRL-01',
  description: 'Drill test screw',
  gtin: '09521230000055',
  lotPattern: 'DRL{SEQ:4}',
});

describe('recall drill report', () => {
  const running = createTestApp();
  let saml: SamlTestDriver;
  const people: Record<string, { agent: Agent; csrf: string; subject: string }> = {};
  let pieceId: number;
  let partId: number;
  let lotA: { id: number; lotNumber: string };
  let lotB: { id: number; lotNumber: string };
  let consignees: Array<{ id: number; name: string }>;
  let drill: RecallDetail;

  const post = (who: string, path: string, body: unknown) =>
    people[who]!.agent.post(path)
      .set('X-CSRF-Token', people[who]!.csrf)
      .send(body as object);
  const report = async () =>
    (await people.auditor!.agent.get(`/api/recalls/${drill.id}/drill-report`)).body as DrillReport;
  const binary = (path: string) =>
    people
      .auditor!.agent.get(path)
      .buffer(true)
      .parse((response, done) => {
        const chunks: Buffer[] = [];
        response.on('data', (chunk: Buffer) => chunks.push(chunk));
        response.on('end', () => done(null, Buffer.concat(chunks)));
      });
  const madeLot = () => readyLotOf((path, body) => post('engineer', path, body), partId, 'TST-DRL-BAR');

  beforeAll(async () => {
    saml = await SamlTestDriver.create(running.config);
    Object.assign(people, await signInPeople(saml, running.app, lotToRecallPeople));
    const [heat] = await running.database.dataSource.query(
      "SELECT id, heat_number FROM heat WHERE status = 'accepted' AND spec_id = 'ASTM F136' ORDER BY id DESC LIMIT 1",
    );
    pieceId = (
      await post('engineer', '/api/bar-pieces', {
        heatId: heat.id,
        markedHeatNumber: heat.heat_number,
        tag: 'TST-DRL-BAR',
        diameterMm: '25.4',
        lengthMm: '3000',
        location: 'Test rack',
      })
    ).body.id;
    partId = (await post('engineer', '/api/parts', part)).body.id;
    lotA = await madeLot();
    lotB = await madeLot();
    expect((await post('engineer', `/api/lots/${lotA.id}/release-submissions`, {})).status).toBe(201);
    expect(
      (
        await signThroughApi(saml, people.reviewer!, {
          recordType: 'lot-release',
          recordId: String(lotA.id),
          meaning: 'reviewed',
        })
      ).status,
    ).toBe(201);
    expect(
      (
        await signThroughApi(saml, people.approver!, {
          recordType: 'lot-release',
          recordId: String(lotA.id),
          meaning: 'approved-for-release',
        })
      ).status,
    ).toBe(201);
    consignees = (await people.engineer!.agent.get('/api/consignees')).body;
    for (const [index, qty] of [5, 7].entries()) {
      expect(
        (
          await post('engineer', `/api/lots/${lotA.id}/shipments`, {
            consigneeId: consignees[index]!.id,
            qty,
            shippedOn: '2026-11-25',
            documentNumber: `DN-DRL-${index}`,
          })
        ).status,
      ).toBe(201);
    }
    drill = (
      await post('coordinator', '/api/recalls', {
        trigger: { pieceId },
        mode: 'drill',
        reason: 'Quarterly rehearsal: one bar to its consignees',
      })
    ).body;
  });
  afterAll(() => running.close());

  it(
    '[DRILL-COUNTS] when a drill is opened, then its report counts the hand-built scope and every completeness ' +
      'check passes',
    async () => {
      const body = await report();
      expect(body.drill).toMatchObject({
        recallNumber: drill.recallNumber,
        status: 'open',
        trigger: 'bar TST-DRL-BAR',
        closedAt: null,
      });
      expect(body.assessment.totals).toEqual({
        lots: 2,
        made: 40,
        released: 20,
        shipped: 12,
        onHand: 28,
        consignees: 2,
      });
      expect(body.consignees.map((consignee) => [consignee.name, consignee.units]).sort()).toEqual(
        [
          [consignees[0]!.name, 5],
          [consignees[1]!.name, 7],
        ].sort(),
      );
      expect(body.assessment.checks.filter((check) => !check.passed)).toEqual([]);
      expect(body.assessment.complete).toBe(true);
      expect(body.lots.every((lot) => lot.heats.length === 1)).toBe(true);
      expect(body.assessment.timing.toFirstScopeMs).toBeGreaterThanOrEqual(0);
      expect(body.assessment.timing.tracedInMs).toBeGreaterThanOrEqual(0);
      expect(body.assessment.timing.toConfirmedScopeMs).toBeNull();
    },
  );

  it(
    'when units ship after the scope was traced, then the report says the scope is not current until the trace ' +
      'is re-run',
    async () => {
      expect(
        (
          await post('engineer', `/api/lots/${lotA.id}/shipments`, {
            consigneeId: consignees[0]!.id,
            qty: 3,
            shippedOn: '2026-11-27',
            documentNumber: 'DN-DRL-9',
          })
        ).status,
      ).toBe(201);
      const stale = await report();
      expect(stale.assessment.complete).toBe(false);
      expect(stale.assessment.checks.find((check) => check.id === 'scope-current')!.offenders).toEqual([
        `${lotA.lotNumber}: 12 shipped when traced, 15 now`,
      ]);
      expect((await post('coordinator', `/api/recalls/${drill.id}/reruns`, {})).status).toBe(201);
      const fresh = await report();
      expect(fresh.assessment.complete).toBe(true);
      expect(fresh.assessment.totals).toMatchObject({ shipped: 15, onHand: 25 });
      expect(fresh.assessment.timing).toMatchObject({ reruns: 1, scopeChanged: false });
      expect(fresh.scope.snapshot.kind).toBe('rerun');
    },
  );

  it(
    '[DRILL-REPORT] when the drill is closed, then the report times the confirmed scope, and the CSV and PDF ' +
      'state it; each export is in the ledger',
    async () => {
      expect(
        (
          await signThroughApi(
            saml,
            people.approver!,
            { recordType: 'recall-investigation', recordId: String(drill.id), meaning: 'closed' },
            'Scope confirmed with shipping records',
          )
        ).status,
      ).toBe(201);
      const closed = await report();
      expect(closed.drill.closedAt).not.toBeNull();
      expect(closed.assessment.timing.toConfirmedScopeMs).toBe(
        Date.parse(closed.drill.closedAt!) - Date.parse(closed.drill.openedAt),
      );

      const csv = await people.auditor!.agent.get(`/api/recalls/${drill.id}/drill-report?format=csv`);
      expect(csv.headers['content-type']).toBe('text/csv; charset=utf-8');
      const rows = parse(csv.text, { columns: true }) as Array<{
        section: string;
        name: string;
        value: string;
        detail: string;
      }>;
      expect(
        Object.fromEntries(rows.filter((row) => row.section === 'totals').map((row) => [row.name, row.value])),
      ).toEqual({ lots: '2', started: '40', released: '20', shipped: '15', 'in plant': '25', consignees: '2' });
      expect(rows.filter((row) => row.section === 'check').map((row) => row.value)).toEqual([
        'passed',
        'passed',
        'passed',
        'passed',
        'passed',
      ]);
      expect(
        rows
          .filter((row) => row.section === 'lot')
          .map((row) => row.name)
          .sort(),
      ).toEqual([lotA.lotNumber, lotB.lotNumber].sort());

      const pdf = await binary(`/api/recalls/${drill.id}/drill-report?format=pdf`);
      expect(pdf.headers['content-type']).toBe('application/pdf');
      const { text } = readPdf(pdf.body as Buffer);
      expect(text).toContain(`Recall drill report ${drill.recallNumber}`);
      expect(text).toContain('Scope complete: every check passed.');
      expect(text).toContain('Every shipped unit is accounted for');
      expect(text).toContain('rest with the firm');
      expect(text).toContain(lotB.lotNumber);
      const events = await running.database.dataSource.query(
        "SELECT after_json FROM audit_event WHERE action = 'recall.drill-report-exported' AND entity_id = ? " +
          'ORDER BY seq',
        [String(drill.id)],
      );
      expect(events.map((event: { after_json: string }) => JSON.parse(event.after_json).format)).toEqual([
        'csv',
        'pdf',
      ]);
    },
  );

  it(
    'when asked for a recall, an unknown drill or a format ' + 'it does not make, then it answers with the reason',
    async () => {
      const recall = (
        await post('coordinator', '/api/recalls', {
          trigger: { pieceId },
          mode: 'recall',
          reason: 'A real recall is not a drill',
        })
      ).body as RecallDetail;
      const refused = await people.auditor!.agent.get(`/api/recalls/${recall.id}/drill-report`);
      expect(refused.status).toBe(422);
      expect(refused.body.error.message).toBe(
        `${recall.recallNumber} is a recall, not a drill; export its affected set instead`,
      );
      expect((await people.auditor!.agent.get('/api/recalls/999999/drill-report')).status).toBe(404);
      expect((await people.auditor!.agent.get(`/api/recalls/${drill.id}/drill-report?format=xlsx`)).status).toBe(400);
      expect((await people.engineer!.agent.get(`/api/recalls/${drill.id}/drill-report`)).status).toBe(403);
    },
  );
});
