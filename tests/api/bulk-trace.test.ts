import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bulkTraceReplySchema } from '@shared/schemas/bulk-trace';
import { buildDigitalLink } from '@shared/domain/gs1/element-string';
import { createTestApp } from '../helpers/test-app';
import { lotToRecallPeople, SamlTestDriver, signInPeople } from '../helpers/saml-round-trip';
import { readyLotOf, twoStepPart } from '../helpers/two-step-part';

const part = twoStepPart({
  partNumber: 'TST-BLK-01',
  description: 'Bulk trace test pin',
  gtin: '09521230000161',
  lotPattern: 'B{SEQ:4}',
});

type Agent = Awaited<ReturnType<SamlTestDriver['signIn']>>['agent'];

// UDI forms as the GS1 General Specifications and GS1 Digital Link write them; outcomes are the
// product's own words (no published source).
describe('tracing many UDIs or lots at once', () => {
  const running = createTestApp();
  const people: Record<string, { agent: Agent; csrf: string; subject: string }> = {};
  const send = (who: string, text: string, type = 'text/plain') =>
    people[who]!.agent.post('/api/trace/bulk')
      .set('X-CSRF-Token', people[who]!.csrf)
      .set('Content-Type', type)
      .send(text);
  let held: { lot_number: string; gtin: string; heat_number: string };
  let other: { lot_number: string; gtin: string };
  let recallNumber: string;

  beforeAll(async () => {
    Object.assign(
      people,
      await signInPeople(await SamlTestDriver.create(running.config), running.app, lotToRecallPeople),
    );
    const db = running.database.dataSource;
    const post = (who: string, path: string, body: unknown) =>
      people[who]!.agent.post(path)
        .set('X-CSRF-Token', people[who]!.csrf)
        .send(body as object);
    // Its own bar, part and lot, so that the recall it opens holds nothing another suite relies on.
    const [heat] = await db.query(
      "SELECT id, heat_number FROM heat WHERE status = 'accepted' AND spec_id = 'ASTM F136' ORDER BY id LIMIT 1",
    );
    const piece = await post('engineer', '/api/bar-pieces', {
      heatId: heat.id,
      markedHeatNumber: heat.heat_number,
      tag: 'TST-BLK-BAR',
      diameterMm: '25.4',
      lengthMm: '3000',
      location: 'Test rack',
    });
    const partId = (await post('engineer', '/api/parts', part)).body.id;
    const lot = await readyLotOf((path, body) => post('engineer', path, body), partId, 'TST-BLK-BAR');
    held = { lot_number: lot.lotNumber, gtin: part.gtin, heat_number: heat.heat_number };
    const opened = await post('coordinator', '/api/recalls', {
      trigger: { pieceId: piece.body.id },
      mode: 'recall',
      reason: 'Bulk trace test: a bar under recall',
    });
    expect(opened.status).toBe(201);
    recallNumber = opened.body.recallNumber;
    [other] = await db.query(
      `SELECT l.lot_number, p.gtin FROM production_lot l JOIN part p ON p.id = l.part_id
        WHERE NOT EXISTS (SELECT 1 FROM lot_hold x WHERE x.lot_id = l.id AND x.lifted_at IS NULL)
          AND p.gtin <> ? ORDER BY l.id DESC LIMIT 1`,
      [held.gtin],
    );
  });
  afterAll(() => running.close());

  it('[BULK-TRACE] when a list mixes forms, then each line is found, unknown or malformed, with lot, hold, recall and heats', async () => {
    const list = [
      'udi',
      `(01)${held.gtin}(10)${held.lot_number}`,
      buildDigitalLink({ gtin: other.gtin, lot: other.lot_number, serial: null, expiry: null, productionDate: null }),
      other.lot_number,
      // The right lot number under another part's GTIN names no lot.
      `(01)${other.gtin}(10)${held.lot_number}`,
      'NO-SUCH-LOT-9',
      '(01)09521230000155(10)X1',
      '',
    ].join('\n');
    const reply = await send('auditor', list);
    expect(reply.status).toBe(200);
    const { summary, lines } = bulkTraceReplySchema.parse(reply.body);
    expect(summary).toEqual({ lines: 6, found: 3, unknown: 2, malformed: 1, onHold: 1, inOpenRecall: 1 });
    expect(lines.map((line) => [line.line, line.outcome])).toEqual([
      [2, 'found'],
      [3, 'found'],
      [4, 'found'],
      [5, 'unknown'],
      [6, 'unknown'],
      [7, 'malformed'],
    ]);
    const first = lines[0]!;
    expect(first.outcome === 'found' && first.lot).toMatchObject({
      lotNumber: held.lot_number,
      onHold: true,
      openRecalls: [recallNumber],
      heats: expect.arrayContaining([held.heat_number]),
    });
    const second = lines[1]!;
    expect(second.outcome === 'found' && second.lot).toMatchObject({
      lotNumber: other.lot_number,
      onHold: false,
      openRecalls: [],
    });
    expect(lines[3]).toMatchObject({ reason: 'No lot with this GTIN and lot number' });
    expect(lines[5]).toMatchObject({ reason: expect.stringMatching(/check digit/i) });
    const [event] = await running.database.dataSource.query(
      "SELECT after_json FROM audit_event WHERE action = 'trace.bulk' ORDER BY seq DESC LIMIT 1",
    );
    expect(JSON.parse(event.after_json)).toMatchObject({ lines: 6, found: 3 });
  });

  it('when the list is empty or longer than 100,000 lines, then it is refused with the reason', async () => {
    const empty = await send('auditor', '\n\n');
    expect(empty.status).toBe(422);
    expect(empty.body.error.message).toBe('Give at least one UDI or lot number, one a line');
    const tooLong = await send('auditor', Array.from({ length: 100_001 }, (_, index) => `L${index}`).join('\n'));
    expect(tooLong.status).toBe(422);
    expect(tooLong.body.error.message).toBe('Trace at most 100,000 lines at once; split the list');
    // GS1 AI 10 values are case-sensitive (CSET 82 has both cases): the lot in the other case names no lot.
    const otherCase = bulkTraceReplySchema.parse((await send('auditor', held.lot_number.toLowerCase())).body);
    expect(otherCase.lines[0]).toMatchObject({ outcome: 'unknown', reason: 'No lot with this number' });
    const asJson = await people
      .auditor!.agent.post('/api/trace/bulk')
      .set('X-CSRF-Token', people.auditor!.csrf)
      .send({ lines: ['L1'] });
    expect(asJson.status).toBe(400);
  });

  it('when exactly 100,000 lines are sent, then every one is answered in one reply', async () => {
    const list = Array.from({ length: 100_000 }, (_, index) => (index % 2 ? other.lot_number : `ZZ${index}`)).join(
      '\n',
    );
    const reply = await send('auditor', list, 'text/csv');
    expect(reply.status).toBe(200);
    expect(reply.body.summary).toMatchObject({ lines: 100_000, found: 50_000, unknown: 50_000 });
  });
});
