import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp } from '../helpers/test-app';
import { csrfTokenOf, reauthenticate, SamlTestDriver } from '../helpers/saml-round-trip';

describe('new specification revisions', () => {
  const running = createTestApp();
  let saml: SamlTestDriver;
  const people: Record<string, { agent: Awaited<ReturnType<SamlTestDriver['signIn']>>['agent']; csrf: string }> = {};
  beforeAll(async () => {
    saml = await SamlTestDriver.create(running.config);
    for (const [name, subject] of [
      ['reviewer', 'kiw-0201'],
      ['approver', 'kiw-0301'],
      ['engineer', 'kiw-0101'],
    ] as const) {
      const { agent } = await saml.signIn(running.app, subject);
      people[name] = { agent, csrf: await csrfTokenOf(agent) };
    }
  });
  afterAll(() => running.close());

  const sign = async (name: string, subject: string, recordId: string, meaning: string, reason?: string) => {
    const { agent, csrf } = people[name]!;
    const intent = { recordType: 'specification-draft', recordId, meaning };
    const prepared = await agent.post('/api/signatures/preparations').set('X-CSRF-Token', csrf).send(intent);
    if (prepared.status !== 200) return prepared;
    const preparation = prepared.body;
    return agent
      .post('/api/signatures')
      .set('X-CSRF-Token', csrf)
      .send({
        ...intent,
        reason,
        contentHash: preparation.contentHash,
        reauthenticationId: await reauthenticate(saml, agent, subject, preparation.bindingHash),
      });
  };

  it(
    '[SPEC-REVISION] when a QA reviewer drafts F1537 L3 and a QA approver signs it, then new heats use L3 while ' +
      'L2 stays stored',
    async () => {
      const { agent, csrf } = people.reviewer!;
      const draft = await agent
        .post('/api/specification-drafts')
        .set('X-CSRF-Token', csrf)
        .send({
          specId: 'ASTM F1537',
          revision: 'L3',
          edition: 'F1537 edition as in our licensed copy',
          note: 'Nitrogen limit checked against the licensed copy',
          limits: [
            {
              grade: '1',
              element: 'N',
              max: '0.20',
              reference: 'Licensed copy of ASTM F1537, Table 1, checked by QA',
              confidence: 'published',
            },
          ],
        });
      expect(draft.status).toBe(201);
      expect(draft.body.changes).toEqual([
        {
          grade: '1',
          element: 'N',
          from: '≤ 0.25',
          to: '≤ 0.20',
          reference: 'Licensed copy of ASTM F1537, Table 1, checked by QA',
        },
      ]);

      // A QA reviewer may draft but not approve a revision.
      const reviewerApproval = await agent
        .post('/api/signatures/preparations')
        .set('X-CSRF-Token', csrf)
        .send({ recordType: 'specification-draft', recordId: String(draft.body.id), meaning: 'approved' });
      expect(reviewerApproval.status).toBe(403);

      const approved = await sign('approver', 'kiw-0301', String(draft.body.id), 'approved');
      expect(approved.status).toBe(201);
      const stored = await running.database.dataSource.query(
        "SELECT revision FROM specification_revision WHERE spec_id = 'ASTM F1537' ORDER BY revision",
      );
      expect(stored).toEqual([{ revision: 'L2' }, { revision: 'L3' }]);

      const { agent: engineer, csrf: engineerCsrf } = people.engineer!;
      const [supplier] = await running.database.dataSource.query(
        "SELECT id FROM supplier WHERE approval <> 'disqualified' ORDER BY id LIMIT 1",
      );
      const heat = await engineer.post('/api/heats').set('X-CSRF-Token', engineerCsrf).send({
        heatNumber: 'REV-L3-1',
        supplierId: supplier.id,
        specId: 'ASTM F1537',
        meltRoute: 'VIM + VAR',
        productForm: 'bar',
        condition: 'annealed',
        sizeMm: '20',
      });
      expect(heat.body.spec).toEqual({ id: 'ASTM F1537', revision: 'L3', grade: '1' });
      const [definition] = await running.database.dataSource.query(
        "SELECT definition_json FROM specification_revision WHERE spec_id = 'ASTM F1537' AND revision = 'L3'",
      );
      const nitrogen = JSON.parse(definition.definition_json).grades[0].chemistry.find(
        (limit: { element: string }) => limit.element === 'N',
      );
      expect(nitrogen.source).toEqual({
        reference: 'Licensed copy of ASTM F1537, Table 1, checked by QA',
        confidence: 'published',
      });
    },
  );

  it('when the author of a draft is also an approver, then separation of duties refuses their approval', async () => {
    const { agent, csrf } = people.approver!;
    const draft = await agent
      .post('/api/specification-drafts')
      .set('X-CSRF-Token', csrf)
      .send({
        specId: 'ASTM F2063',
        revision: 'L3',
        edition: 'F2063-18',
        note: 'Grade 4 iron',
        limits: [
          {
            grade: null,
            element: 'Fe',
            max: '0.050',
            reference: 'Licensed copy of ASTM F2063, Table 1',
            confidence: 'published',
          },
        ],
      });
    expect(draft.status).toBe(201);
    const refused = await sign('approver', 'kiw-0301', String(draft.body.id), 'approved');
    expect(refused.status).toBe(422);
    expect(refused.body.error.message).toBe('You authored this record, so you cannot approve it');
  });

  it('when the draft is wrong, then the fields are named', async () => {
    const { agent, csrf } = people.reviewer!;
    const used = await agent
      .post('/api/specification-drafts')
      .set('X-CSRF-Token', csrf)
      .send({
        specId: 'ASTM F136',
        revision: 'L2',
        edition: 'x edition',
        note: 'again',
        limits: [{ grade: null, element: 'O', max: '0.13', reference: 'copy', confidence: 'firm' }],
      });
    expect(used.status).toBe(409);
    const inverted = await agent
      .post('/api/specification-drafts')
      .set('X-CSRF-Token', csrf)
      .send({
        specId: 'ASTM F136',
        revision: 'L9',
        edition: 'x edition',
        note: 'test',
        limits: [{ grade: null, element: 'Al', min: '6.5', max: '5.5', reference: 'copy', confidence: 'firm' }],
      });
    expect(inverted.status).toBe(400);
    expect(inverted.body.error.fields).toEqual({ 'limits.0': 'The minimum is above the maximum' });
    const unsure = await agent
      .post('/api/specification-drafts')
      .set('X-CSRF-Token', csrf)
      .send({
        specId: 'ASTM F136',
        revision: 'L9',
        edition: 'x edition',
        note: 'test',
        limits: [{ grade: null, element: 'O', max: '0.12', reference: 'copy' }],
      });
    expect(unsure.status).toBe(400);
    expect(Object.keys(unsure.body.error.fields)).toEqual(['limits.0.confidence']);
  });

  it(
    '[SPEC-DRAFT-TOLERANCE] when a limit with a product-analysis tolerance changes, then its tolerance must be ' +
      'entered again (F67 Fe: 0.10 up to 0.25 %, 0.15 above)',
    async () => {
      const { agent, csrf } = people.reviewer!;
      const draft = (limits: unknown[]) =>
        agent
          .post('/api/specification-drafts')
          .set('X-CSRF-Token', csrf)
          .send({ specId: 'ASTM F67', revision: 'L9', edition: 'F67-13', note: 'Grade 2 iron', limits });
      const kept = await draft([
        { grade: '2', element: 'Fe', max: '0.25', reference: 'Firm decision', confidence: 'firm' },
      ]);
      expect(kept.status).toBe(400);
      expect(kept.body.error.fields).toEqual({
        'limits.0.tolerance': 'The limit changes, so re-enter its product-analysis tolerance (was 0.15 over)',
      });
      const reentered = await draft([
        {
          grade: '2',
          element: 'Fe',
          max: '0.25',
          reference: 'Firm decision',
          confidence: 'firm',
          tolerance: { over: '0.10' },
        },
      ]);
      expect(reentered.status).toBe(201);
      const [row] = await running.database.dataSource.query(
        'SELECT definition_json FROM specification_draft WHERE id = ?',
        [reentered.body.id],
      );
      const iron = JSON.parse(row.definition_json)
        .grades.find((grade: { grade: string }) => grade.grade === '2')
        .chemistry.find((limit: { element: string }) => limit.element === 'Fe');
      expect(iron).toEqual({
        element: 'Fe',
        max: '0.25',
        source: { reference: 'Firm decision', confidence: 'firm' },
        tolerance: { over: '0.10' },
      });
    },
  );
});
