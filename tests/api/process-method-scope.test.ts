import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp } from '../helpers/test-app';
import { SamlTestDriver, signInPeople } from '../helpers/saml-round-trip';

type Agent = Awaited<ReturnType<SamlTestDriver['signIn']>>['agent'];

const times = {
  operatorName: 'Test',
  workCentre: 'Cell 1',
  startedAt: '2026-11-20T08:00:00Z',
  endedAt: '2026-11-20T09:00:00Z',
};
const passivation = {
  bath: 'Tank S-1',
  acidConcentration: '50',
  temperature: '50',
  immersionTime: '35',
  rinseConductivity: '1.2',
};
const cleaning = (endotoxin: string) => ({
  detergent: 'D-1 lot 9',
  detergentConcentration: '2',
  washTemperature: '55',
  washTime: '15',
  rinseTemperature: '30',
  rinseTime: '6',
  rinseConductivity: '1.1',
  toc: '150',
  endotoxin,
});

const part = (
  own: { partNumber: string; gtin: string; lotPattern: string; contactCategory: string; specId?: string },
  routing: unknown[],
) => ({
  partNumber: own.partNumber,
  revision: 'A',
  description: `Scope test part ${own.partNumber}`,
  gtin: own.gtin,
  unitLengthMm: '30',
  cutoffAllowanceMm: '2',
  lotPattern: own.lotPattern,
  contactCategory: own.contactCategory,
  specifications: [{ specId: own.specId ?? 'ASTM F136' }],
  routing,
});

describe('process methods within their material scope, endotoxin limits by contact category', () => {
  const running = createTestApp();
  let saml: SamlTestDriver;
  const people: Record<string, { agent: Agent; csrf: string; subject: string }> = {};
  const tag = 'TST-SCOPE-BAR';

  beforeAll(async () => {
    saml = await SamlTestDriver.create(running.config);
    Object.assign(people, await signInPeople(saml, running.app, { engineer: 'kiw-0102', approver: 'kiw-0301' }));
    const [heat]: Array<{ id: number; heat_number: string }> = await running.database.dataSource.query(
      "SELECT id, heat_number FROM heat WHERE status = 'accepted' AND spec_id = 'ASTM F136' ORDER BY id DESC LIMIT 1",
    );
    const received = await post('engineer', '/api/bar-pieces', {
      heatId: heat!.id,
      markedHeatNumber: heat!.heat_number,
      tag,
      diameterMm: '25.4',
      lengthMm: '3000',
      location: 'Test rack',
    });
    if (received.status !== 201) throw new Error(`receiving test bar answered ${received.status}`);
  });
  afterAll(() => running.close());

  const post = (who: string, path: string, body: unknown) =>
    people[who]!.agent.post(path)
      .set('X-CSRF-Token', people[who]!.csrf)
      .send(body as object);
  const events = async (action: string) =>
    Number(
      (await running.database.dataSource.query('SELECT COUNT(*) AS n FROM audit_event WHERE action = ?', [action]))[0]
        .n,
    );
  /**
   * Opens a lot of five from the test bar and records its first (machining) step, so that its next step is the one
   * after.
   */
  async function lotAfterTurning(partId: number): Promise<{ id: number; lotNumber: string }> {
    const lot = (await post('engineer', '/api/lots', { partId, plannedQty: 5 })).body as {
      id: number;
      lotNumber: string;
    };
    expect((await post('engineer', `/api/lots/${lot.id}/material-issues`, { tag, lengthMm: '160' })).status).toBe(201);
    expect(
      (
        await post('engineer', `/api/lots/${lot.id}/operations`, {
          ...times,
          stepNo: 10,
          qtyIn: 5,
          qtyGood: 5,
          qtyScrap: 0,
        })
      ).status,
    ).toBe(201);
    return lot;
  }
  const validation = (materialFamily: string, stands = true) => ({
    materialFamily,
    stands,
    reference: 'VR-TEST-001',
    reason: 'Worst-case lots passed water immersion after treatment',
  });

  it(
    '[PART-METHOD-SCOPE] when an engineer routes a titanium part through an A967 (stainless steel) method, then ' +
      'registration is refused at that step; a stainless part or F86 is accepted',
    async () => {
      const titaniumA967 = await post(
        'engineer',
        '/api/parts',
        part(
          {
            partNumber: 'TST-SCOPE-01',
            gtin: '09521230000062',
            lotPattern: 'SA{SEQ:4}',
            contactCategory: 'general-tissue',
          },
          [
            { kind: 'machining', name: 'Turn' },
            { kind: 'passivation', name: 'Passivate', processMethod: 'A967-NITRIC-2' },
          ],
        ),
      );
      expect(titaniumA967.status).toBe(422);
      expect(titaniumA967.body.error.fields['routing.1.processMethod']).toBe(
        "The part's material is titanium alloy; A967-NITRIC-2's scope covers stainless steel. Use a method " +
          "whose scope covers it, or have QA record the firm's own validation of A967-NITRIC-2 for titanium " +
          'alloy.',
      );
      const steel = await post(
        'engineer',
        '/api/parts',
        part(
          {
            partNumber: 'TST-SCOPE-02',
            gtin: '09521230000079',
            lotPattern: 'SB{SEQ:4}',
            contactCategory: 'general-tissue',
            specId: 'ASTM F138',
          },
          [
            { kind: 'machining', name: 'Turn' },
            { kind: 'passivation', name: 'Passivate', processMethod: 'A967-NITRIC-2' },
          ],
        ),
      );
      expect(steel.status).toBe(201);
      expect(steel.body.contactCategory).toBe('general-tissue');
      const noCategory = await post('engineer', '/api/parts', {
        ...part(
          {
            partNumber: 'TST-SCOPE-03',
            gtin: '09521230000086',
            lotPattern: 'SC{SEQ:4}',
            contactCategory: 'general-tissue',
          },
          [{ kind: 'machining', name: 'Turn' }],
        ),
        contactCategory: undefined,
      });
      expect(noCategory.status).toBe(400);
      expect(noCategory.body.error.fields.contactCategory).toBe('Choose where the finished device touches the body');
    },
  );

  it(
    '[RUN-METHOD-SCOPE] when the firm’s validation of a method for titanium is withdrawn, then a titanium lot ' +
      'is refused from a run under it; recorded again, the run goes through and the method shows it as the ' +
      'firm’s own',
    async () => {
      expect(
        (await post('engineer', '/api/process-methods/A967-NITRIC-4/validations', validation('titanium-alloy'))).status,
      ).toBe(403);
      const inScope = await post(
        'approver',
        '/api/process-methods/A967-NITRIC-4/validations',
        validation('stainless-steel'),
      );
      expect(inScope.status).toBe(422);
      expect(inScope.body.error.fields).toEqual({ materialFamily: 'Already in the method’s scope' });
      const unknown = await post('approver', '/api/process-methods/NO-SUCH/validations', validation('titanium-alloy'));
      expect(unknown.status).toBe(404);
      const short = await post('approver', '/api/process-methods/A967-NITRIC-4/validations', {
        ...validation('titanium-alloy'),
        reason: 'ok',
      });
      expect(short.status).toBe(400);

      const recorded = await post(
        'approver',
        '/api/process-methods/A967-NITRIC-4/validations',
        validation('titanium-alloy'),
      );
      expect(recorded.status).toBe(201);
      expect(recorded.body.firmValidations).toEqual([
        expect.objectContaining({ family: 'titanium-alloy', reference: 'VR-TEST-001', recordedBy: expect.any(String) }),
      ]);
      expect(
        (await post('approver', '/api/process-methods/A967-NITRIC-4/validations', validation('titanium-alloy'))).status,
      ).toBe(409);
      const registered = await post(
        'engineer',
        '/api/parts',
        part(
          {
            partNumber: 'TST-SCOPE-04',
            gtin: '09521230000093',
            lotPattern: 'SD{SEQ:4}',
            contactCategory: 'general-tissue',
          },
          [
            { kind: 'machining', name: 'Turn' },
            { kind: 'passivation', name: 'Passivate', processMethod: 'A967-NITRIC-4' },
          ],
        ),
      );
      expect(registered.status).toBe(201);
      const lot = await lotAfterTurning(registered.body.id);

      const withdrawnBefore = await events('process-method.validation-withdrawn');
      expect(
        (await post('approver', '/api/process-methods/A967-NITRIC-4/validations', validation('titanium-alloy', false)))
          .status,
      ).toBe(201);
      expect(await events('process-method.validation-withdrawn')).toBe(withdrawnBefore + 1);
      const runs = Number((await running.database.dataSource.query('SELECT COUNT(*) AS n FROM process_run'))[0].n);
      const refused = await post('engineer', '/api/process-runs', {
        kind: 'passivation',
        methodId: 'A967-NITRIC-4',
        equipment: 'Tank S',
        operatorName: 'Test',
        runAt: '2026-11-21T08:00:00Z',
        parameters: passivation,
        lotIds: [lot.id],
      });
      expect(refused.status).toBe(422);
      expect(refused.body.error.fields).toEqual({ lotIds: `${lot.lotNumber} is outside A967-NITRIC-4's scope` });
      expect(Number((await running.database.dataSource.query('SELECT COUNT(*) AS n FROM process_run'))[0].n)).toBe(
        runs,
      );

      expect(
        (await post('approver', '/api/process-methods/A967-NITRIC-4/validations', validation('titanium-alloy'))).status,
      ).toBe(201);
      const accepted = await post('engineer', '/api/process-runs', {
        kind: 'passivation',
        methodId: 'A967-NITRIC-4',
        equipment: 'Tank S',
        operatorName: 'Test',
        runAt: '2026-11-21T08:00:00Z',
        parameters: passivation,
        lotIds: [lot.id],
      });
      expect(accepted.status).toBe(201);
      expect(accepted.body.inWindow).toBe(true);
      const methods = (await people.engineer!.agent.get('/api/process-methods')).body as Array<{
        id: string;
        firmValidations: unknown[];
        materialScope: { families: string[] };
      }>;
      expect(methods.find((method) => method.id === 'A967-NITRIC-4')).toMatchObject({
        materialScope: { families: ['stainless-steel'] },
        firmValidations: [expect.objectContaining({ family: 'titanium-alloy' })],
      });
    },
  );

  it(
    '[RUN-ENDOTOXIN-CONTACT] when a cleaning run reads 4 EU/device, then a tissue-contact lot is in window and ' +
      'a cerebrospinal-fluid lot is not (FDA Q&A guidance / USP <161>: 20 vs 2.15 EU/device)',
    async () => {
      const routing = [
        { kind: 'machining', name: 'Turn' },
        { kind: 'cleaning', name: 'Final clean', processMethod: 'KIW-CLEAN-AQ' },
      ];
      const tissue = await post(
        'engineer',
        '/api/parts',
        part(
          {
            partNumber: 'TST-SCOPE-05',
            gtin: '09521230000109',
            lotPattern: 'SE{SEQ:4}',
            contactCategory: 'general-tissue',
          },
          routing,
        ),
      );
      const csf = await post(
        'engineer',
        '/api/parts',
        part(
          {
            partNumber: 'TST-SCOPE-06',
            gtin: '09521230000116',
            lotPattern: 'SF{SEQ:4}',
            contactCategory: 'cerebrospinal-fluid',
          },
          routing,
        ),
      );
      expect([tissue.status, csf.status]).toEqual([201, 201]);
      expect(csf.body.contactCategory).toBe('cerebrospinal-fluid');
      const run = (lotIds: number[], endotoxin: string) =>
        post('engineer', '/api/process-runs', {
          kind: 'cleaning',
          methodId: 'KIW-CLEAN-AQ',
          equipment: 'U1',
          operatorName: 'Test',
          runAt: '2026-11-21T10:00:00Z',
          parameters: cleaning(endotoxin),
          lotIds,
        });
      const item = (body: { windowCheck: { items: Array<{ key: string }> } }) =>
        body.windowCheck.items.find((entry) => entry.key === 'endotoxin');

      const tissueRun = await run([(await lotAfterTurning(tissue.body.id)).id], '4');
      expect(tissueRun.status).toBe(201);
      expect(item(tissueRun.body)).toMatchObject({
        verdict: 'in-window',
        window: '≤ 20 EU/device (blood, lymph, bone or other tissue contact)',
      });
      const csfRun = await run([(await lotAfterTurning(csf.body.id)).id], '4');
      expect(csfRun.body.inWindow).toBe(false);
      expect(item(csfRun.body)).toMatchObject({
        verdict: 'out-of-window',
        why: '4 EU/device is above the maximum 2.15 EU/device',
      });
      expect(csfRun.body.nonconformances).toHaveLength(1);
      const boundary = await run([(await lotAfterTurning(csf.body.id)).id], '2.15');
      expect(item(boundary.body)).toMatchObject({ verdict: 'in-window' });
      const mixed = await run(
        [(await lotAfterTurning(tissue.body.id)).id, (await lotAfterTurning(csf.body.id)).id],
        '3',
      );
      expect(mixed.body.inWindow).toBe(false);
      expect(mixed.body.nonconformances).toHaveLength(2);
    },
  );
});
