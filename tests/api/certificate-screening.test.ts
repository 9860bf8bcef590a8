// Certificate screening in the running product, on the demo scenario's mill whose oxygen results
// bunch at the ASTM F67 grade 4 limit (0.40 wt %): 11 heats at 0.39–0.40, none at 0.37–0.38.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { heatDetailSchema } from '@shared/schemas/materials';
import { createTestApp } from '../helpers/test-app';
import { csrfTokenOf, SamlTestDriver } from '../helpers/saml-round-trip';
import { signThroughApi } from '../helpers/signing';

type Agent = Awaited<ReturnType<SamlTestDriver['signIn']>>['agent'];

describe('certificate screening', () => {
  const running = createTestApp();
  let saml: SamlTestDriver;
  const people: Record<'engineer' | 'reviewer', { agent: Agent; csrf: string; subject: string }> = {} as never;
  let flagged: number;
  let plain: number;

  beforeAll(async () => {
    saml = await SamlTestDriver.create(running.config);
    for (const [name, subject] of [
      ['engineer', 'kiw-0101'],
      ['reviewer', 'kiw-0201'],
    ] as const) {
      const { agent } = await saml.signIn(running.app, subject);
      people[name] = { agent, csrf: await csrfTokenOf(agent), subject };
    }
    const db = await running.database.connect();
    const rows: Array<{ id: number; heat_number: string }> = await db.query(
      "SELECT id, heat_number FROM heat WHERE heat_number IN ('BAW-7905', 'BAW-7710')",
    );
    flagged = rows.find((row) => row.heat_number === 'BAW-7905')!.id;
    plain = rows.find((row) => row.heat_number === 'BAW-7710')!.id;
  });
  afterAll(() => running.close());

  const detail = async (id: number) =>
    heatDetailSchema.parse((await people.reviewer.agent.get(`/api/heats/${id}`)).body);
  const acknowledge = (who: 'engineer' | 'reviewer', body: object) =>
    people[who].agent
      .post(`/api/heats/${flagged}/screening-acknowledgements`)
      .set('X-CSRF-Token', people[who].csrf)
      .send(body);

  it(
    '[SCREEN-FLAG] when QA opens a heat reported just inside the oxygen limit, then the bunching finding is ' +
      'there with its statistic',
    async () => {
      const { screening } = await detail(flagged);
      expect(screening.heatsScreened).toBe(16);
      expect(screening.findings).toHaveLength(1);
      const [finding] = screening.findings;
      expect(finding).toMatchObject({
        kind: 'bunched-at-limit',
        key: 'bunched-at-limit:O:max',
        property: 'O',
        acknowledgement: null,
      });
      expect(finding!.heatNumbers).toHaveLength(11);
      // 11 in the near band and none in the next two steps: P(Bin(11, ½) ≥ 11) = 2^-11, by hand.
      expect(finding!.statistic!.value).toBeCloseTo(1 / 2048, 12);
      expect(finding!.explanation).toMatch(
        /^11 of 16 heats report O at or one reporting step \(0\.01\) inside the max limit 0\.40, against 0 in the next two steps/,
      );
    },
  );

  it('when a heat of the same mill lies well inside the limit, then it has no finding', async () => {
    expect((await detail(plain)).screening.findings).toEqual([]);
  });

  it(
    'when QA looks at the supplier, then every specification and grade is screened and each finding lists its ' +
      'heats',
    async () => {
      const db = await running.database.connect();
      const [{ id }] = await db.query("SELECT id FROM supplier WHERE name = 'Brannock Alloy Works'");
      const response = await people.engineer.agent.get(`/api/suppliers/${id}/screening`);
      expect(response.status).toBe(200);
      expect(response.body.supplier).toMatchObject({ name: 'Brannock Alloy Works', approval: 'conditional' });
      expect(response.body.groups).toEqual([
        expect.objectContaining({
          specId: 'ASTM F67',
          grade: '4',
          heatsScreened: 16,
          findings: [expect.objectContaining({ key: 'bunched-at-limit:O:max' })],
        }),
      ]);
      expect(response.body.groups[0].findings[0].heats).toHaveLength(11);
      expect((await people.engineer.agent.get('/api/suppliers/999999/screening')).status).toBe(404);
    },
  );

  it('when a heat has a finding nobody acknowledged, then acceptance is refused and says why', async () => {
    const refused = await signThroughApi(saml, people.reviewer, {
      recordType: 'heat',
      recordId: String(flagged),
      meaning: 'accepted',
    });
    expect(refused.status).toBe(422);
    expect(refused.body.error.message).toMatch(
      /^Acknowledge the certificate screening finding on this heat first \(1 open\): 11 of 16 heats/,
    );
  });

  it(
    'when the acknowledgement is not allowed or not complete, then it is refused with the field named and ' +
      'nothing is stored',
    async () => {
      expect(
        (await acknowledge('engineer', { findingKey: 'bunched-at-limit:O:max', reason: 'Looked at it and it is fine' }))
          .status,
      ).toBe(403);
      const short = await acknowledge('reviewer', { findingKey: 'bunched-at-limit:O:max', reason: 'ok' });
      expect(short.status).toBe(400);
      expect(short.body.error.fields).toEqual({ reason: 'Say what you checked, in at least 10 characters' });
      const unknown = await acknowledge('reviewer', {
        findingKey: 'bunched-at-limit:Fe:max',
        reason: 'Check analysis ordered from the lab',
      });
      expect(unknown.status).toBe(422);
      expect(unknown.body.error.fields).toEqual({ findingKey: 'Unknown finding' });
      expect((await detail(flagged)).screening.findings[0]!.acknowledgement).toBeNull();
    },
  );

  it(
    '[SCREEN-ACKNOWLEDGE] when a QA reviewer acknowledges the finding with a reason, then it is recorded once ' +
      'and in the ledger, and the heat can be accepted',
    async () => {
      const reason = 'Independent check analysis of this heat found O 0.38 %; supplier asked for its lab records';
      const acknowledged = await acknowledge('reviewer', { findingKey: 'bunched-at-limit:O:max', reason });
      expect(acknowledged.status).toBe(201);
      expect(acknowledged.body.findings[0].acknowledgement).toMatchObject({ by: expect.any(String), reason });
      const again = await acknowledge('reviewer', { findingKey: 'bunched-at-limit:O:max', reason });
      expect(again.status).toBe(409);
      const db = await running.database.connect();
      const events = await db.query(
        "SELECT reason FROM audit_event WHERE action = 'heat.screening-finding-acknowledged' AND entity_id = ?",
        [String(flagged)],
      );
      expect(events).toEqual([{ reason }]);
      // The mill is conditionally approved: the demo's plant-wide rule wants our own check analysis first.
      const due = await signThroughApi(saml, people.reviewer, {
        recordType: 'heat',
        recordId: String(flagged),
        meaning: 'accepted',
      });
      expect(due.status).toBe(422);
      expect(due.body.error.message).toMatch(
        /^A check analysis of this heat is due \(Every heat from a conditionally approved supplier is checked\)/,
      );
      const checked = await people.engineer.agent
        .post(`/api/heats/${flagged}/check-analyses`)
        .set('X-CSRF-Token', people.engineer.csrf)
        .send({
          laboratory: 'Tarnbridge materials laboratory',
          reportReference: 'TML-API-1',
          chemistry: { O: '0.38', Fe: '0.25' },
        });
      expect(checked.status).toBe(201);
      expect(checked.body.status).toBe('conforms');
      const accepted = await signThroughApi(saml, people.reviewer, {
        recordType: 'heat',
        recordId: String(flagged),
        meaning: 'accepted',
      });
      expect(accepted.status).toBe(201);
      expect((await detail(flagged)).status).toBe('accepted');
      expect((await acknowledge('reviewer', { findingKey: 'bunched-at-limit:O:max', reason })).status).toBe(422);
    },
  );
});
