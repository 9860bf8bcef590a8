import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { heatDetailSchema } from '@shared/schemas/materials';
import { createTestApp } from '../helpers/test-app';
import { csrfTokenOf, SamlTestDriver } from '../helpers/saml-round-trip';
import { signThroughApi } from '../helpers/signing';

type Agent = Awaited<ReturnType<SamlTestDriver['signIn']>>['agent'];

const pdf = (text: string) =>
  Buffer.from(`%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\n% ${text}\ntrailer << /Root 1 0 R >>\n%%EOF\n`);
// ISO 5832-1 composition D inside every limit (BSSA, ISO 5832-1:1997); the library holds no
// mechanical minima for ISO 5832-1, so such a heat can never be judged complete by the library.
const iso58321 = {
  chemistry: {
    C: '0.020',
    Si: '0.5',
    Mn: '1.5',
    P: '0.015',
    S: '0.002',
    Cr: '18.0',
    Mo: '2.80',
    Ni: '14.0',
    N: '0.05',
    Cu: '0.10',
  },
  mechanical: { utsMPa: '620', ysMPa: '300', elongationPct: '45' },
};

describe('heats whose evaluation cannot be completed', () => {
  const running = createTestApp();
  let saml: SamlTestDriver;
  const people: Record<string, { agent: Agent; csrf: string; subject: string }> = {};
  let supplierId: number;

  beforeAll(async () => {
    saml = await SamlTestDriver.create(running.config);
    for (const [name, subject] of [
      ['engineer', 'kiw-0101'],
      ['reviewer', 'kiw-0201'],
      ['approver', 'kiw-0301'],
    ] as const) {
      const { agent } = await saml.signIn(running.app, subject);
      people[name] = { agent, csrf: await csrfTokenOf(agent), subject };
    }
    const supplier = await people
      .approver!.agent.post('/api/suppliers')
      .set('X-CSRF-Token', people.approver!.csrf)
      .send({ name: 'Justification Test Mill', country: 'Austria', approval: 'approved', reason: 'Audited on site' });
    supplierId = supplier.body.id;
  });
  afterAll(() => running.close());

  const engineer = () => people.engineer!;
  const receive = (body: Record<string, unknown>) =>
    engineer()
      .agent.post('/api/heats')
      .set('X-CSRF-Token', engineer().csrf)
      .send({ supplierId, meltRoute: 'VIM + ESR', sizeMm: '12', ...body });

  it(
    '[HEAT-FORM-CONDITION] when a heat states a form or condition its specification revision does not cover, or ' +
      'none, then receipt is refused with the field named',
    async () => {
      const plate = await receive({
        heatNumber: 'JT-100',
        specId: 'ASTM F136',
        productForm: 'plate',
        condition: 'annealed',
      });
      expect(plate.status).toBe(422);
      expect(plate.body.error.fields).toEqual({ productForm: 'One of bar, wire, forging' });
      const coldWorked = await receive({
        heatNumber: 'JT-101',
        specId: 'ASTM F136',
        productForm: 'bar',
        condition: 'cold-worked',
      });
      expect(coldWorked.status).toBe(422);
      expect(coldWorked.body.error.fields).toEqual({ condition: 'One of annealed' });
      const typed = await receive({
        heatNumber: 'JT-102',
        specId: 'ASTM F138',
        productForm: 'bar',
        condition: 'Annealed',
      });
      expect(typed.status).toBe(400);
      expect(Object.keys(typed.body.error.fields)).toEqual(['condition']);
      const none = await receive({ heatNumber: 'JT-103', specId: 'ASTM F138', productForm: 'bar' });
      expect(none.status).toBe(400);
      const coldWorkedSteel = await receive({
        heatNumber: 'JT-104',
        specId: 'ASTM F138',
        productForm: 'bar',
        condition: 'cold-worked',
      });
      expect(coldWorkedSteel.status).toBe(201);
      expect(coldWorkedSteel.body).toMatchObject({ condition: 'cold-worked', spec: { revision: 'L2' } });
    },
  );

  it(
    '[HEAT-CANNOT-EVALUATE] when items cannot be evaluated, then acceptance waits for a QA approver’s signed ' +
      'justification of this very evaluation, which the heat then shows',
    async () => {
      const received = await receive({
        heatNumber: 'JT-200',
        specId: 'ISO 5832-1',
        grade: 'D',
        productForm: 'bar',
        condition: 'annealed',
      });
      expect(received.status).toBe(201);
      const heatId = received.body.id as number;
      const recorded = await engineer()
        .agent.put(`/api/heats/${heatId}/results`)
        .set('X-CSRF-Token', engineer().csrf)
        .send(iso58321);
      expect(recorded.body.verdict).toBe('cannot-be-evaluated');
      expect(recorded.body.evaluation.items.at(-1)).toMatchObject({
        kind: 'selection',
        verdict: 'cannot-be-evaluated',
        reason: 'no-requirement',
      });
      await engineer()
        .agent.post(`/api/heats/${heatId}/certificates`)
        .set('X-CSRF-Token', engineer().csrf)
        .attach('certificate', pdf('JT-200'), 'c.pdf');
      const accept = { recordType: 'heat', recordId: String(heatId), meaning: 'accepted' };
      const justify = { recordType: 'heat-evaluation', recordId: String(heatId), meaning: 'justified' };

      const early = await signThroughApi(saml, people.reviewer!, accept);
      expect(early.status).toBe(422);
      expect(early.body.error.message).toMatch(/^Some items of this heat cannot be evaluated/);
      // Only a QA approver justifies; the engineer who recorded the results may not, nor may a reviewer.
      expect((await signThroughApi(saml, people.reviewer!, justify, 'Mill test report covers it')).status).toBe(403);
      expect((await signThroughApi(saml, people.engineer!, justify, 'Mill test report covers it')).status).toBe(403);
      const withoutReason = await signThroughApi(saml, people.approver!, justify);
      expect(withoutReason.status).toBe(422);
      expect(withoutReason.body.error.fields).toEqual({ reason: 'A reason of at least 3 characters is required' });
      const justified = await signThroughApi(
        saml,
        people.approver!,
        justify,
        'Mechanical minima checked against our licensed ISO 5832-1:2024, table 3',
      );
      expect(justified.status).toBe(201);
      const detail = heatDetailSchema.parse((await people.reviewer!.agent.get(`/api/heats/${heatId}`)).body);
      expect(detail.justification).toMatchObject({
        reason: 'Mechanical minima checked against our licensed ISO 5832-1:2024, table 3',
      });
      expect(detail.justification?.manifestation).toMatch(/Justified for acceptance/);

      // New results make a new evaluation: the justification no longer covers it.
      await engineer()
        .agent.put(`/api/heats/${heatId}/results`)
        .set('X-CSRF-Token', engineer().csrf)
        .send({ ...iso58321, chemistry: { ...iso58321.chemistry, Mo: '2.75' }, reason: 'typing error on Mo' });
      expect(
        heatDetailSchema.parse((await people.reviewer!.agent.get(`/api/heats/${heatId}`)).body).justification,
      ).toBeNull();
      expect((await signThroughApi(saml, people.reviewer!, accept)).status).toBe(422);
      expect(
        (
          await signThroughApi(
            saml,
            people.approver!,
            justify,
            'Re-checked the corrected Mo against the licensed table',
          )
        ).status,
      ).toBe(201);
      const accepted = await signThroughApi(saml, people.reviewer!, accept);
      expect(accepted.status).toBe(201);
      expect(accepted.body.reason).toBeNull();
      const preparation = await people.reviewer!.agent.get(`/api/signatures?recordType=heat&recordId=${heatId}`);
      expect(preparation.status).toBe(200);
    },
  );

  it('when a heat does not conform, then no justification can cover it', async () => {
    const received = await receive({
      heatNumber: 'JT-300',
      specId: 'ISO 5832-1',
      grade: 'D',
      productForm: 'bar',
      condition: 'annealed',
    });
    await engineer()
      .agent.put(`/api/heats/${received.body.id}/results`)
      .set('X-CSRF-Token', engineer().csrf)
      .send({ ...iso58321, chemistry: { ...iso58321.chemistry, Cr: '16.8' } });
    const refused = await signThroughApi(
      saml,
      people.approver!,
      { recordType: 'heat-evaluation', recordId: String(received.body.id), meaning: 'justified' },
      'Please accept it anyway',
    );
    expect(refused.status).toBe(422);
    expect(refused.body.error.message).toBe(
      'The heat does not conform: a justification cannot cover a failed requirement',
    );
  });
});
