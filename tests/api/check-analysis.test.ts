// The independent check analysis schedule in the running product: a rule set for one supplier and
// specification marks heats, a due check blocks acceptance, a check beyond the ASTM F136
// product-analysis tolerance (O ≤ 0.13 + 0.02, DOMAIN.md S5) blocks it too, a conforming one frees it.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { heatDetailSchema } from '@shared/schemas/materials';
import { createTestApp } from '../helpers/test-app';
import { csrfTokenOf, SamlTestDriver } from '../helpers/saml-round-trip';
import { signThroughApi } from '../helpers/signing';

type Agent = Awaited<ReturnType<SamlTestDriver['signIn']>>['agent'];
type Who = 'engineer' | 'reviewer' | 'approver';

const pdf = (text: string) =>
  Buffer.from(`%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\n% ${text}\ntrailer << /Root 1 0 R >>\n%%EOF\n`);

describe('check analysis schedule', () => {
  const running = createTestApp();
  let saml: SamlTestDriver;
  const people = {} as Record<Who, { agent: Agent; csrf: string; subject: string }>;
  let supplierId: number;
  const heatIds: number[] = [];

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
  });
  afterAll(() => running.close());

  const post = (who: Who, path: string, body: object) =>
    people[who].agent.post(path).set('X-CSRF-Token', people[who].csrf).send(body);
  const detail = async (id: number) =>
    heatDetailSchema.parse((await people.reviewer.agent.get(`/api/heats/${id}`)).body);
  const accept = (id: number) =>
    signThroughApi(saml, people.reviewer, { recordType: 'heat', recordId: String(id), meaning: 'accepted' });
  const rule = (body: object) =>
    post('approver', '/api/check-analysis-rules', {
      supplierId,
      specId: 'ASTM F136',
      everyHeatWhenConditional: true,
      reason: 'Supplier control procedure',
      ...body,
    });

  it(
    'when a QA approver sets every 2nd heat for a mill and specification, then the rule is in force and in the ' +
      'ledger; nobody else may set it',
    async () => {
      const supplier = await post('approver', '/api/suppliers', {
        name: `Check Mill ${Date.now()}`,
        country: 'Austria',
        approval: 'approved',
        reason: 'Audited on site',
      });
      supplierId = supplier.body.id;
      expect(
        (
          await post('engineer', '/api/check-analysis-rules', {
            supplierId,
            specId: 'ASTM F136',
            everyNthHeat: 2,
            everyHeatWhenConditional: false,
            reason: 'Sampling',
          })
        ).status,
      ).toBe(403);
      const set = await rule({ specId: 'astm f136', everyNthHeat: 2 });
      expect(set.status).toBe(201);
      const mine = set.body.rules.find(
        (candidate: { supplierId: number | null }) => candidate.supplierId === supplierId,
      );
      expect(mine).toMatchObject({
        specId: 'ASTM F136',
        everyNthHeat: 2,
        everyHeatWhenConditional: true,
        setBy: expect.any(String),
      });
      const [event] = await running.database.dataSource.query(
        "SELECT after_json FROM audit_event WHERE action = 'check-analysis-rule.set' AND entity_id = ?",
        [String(mine.id)],
      );
      expect(JSON.parse(event.after_json)).toEqual({
        supplierId,
        specId: 'ASTM F136',
        everyNthHeat: 2,
        everyHeatWhenConditional: true,
      });
      expect((await people.reviewer.agent.get('/api/check-analysis-rules')).body.rules).toContainEqual(mine);
    },
  );

  it('when the rule input is wrong, then the fields are named and nothing is stored', async () => {
    const before = await running.database.dataSource.query('SELECT COUNT(*) AS n FROM check_analysis_rule');
    const zero = await rule({ everyNthHeat: 0 });
    expect(zero.status).toBe(400);
    expect(zero.body.error.fields).toEqual({ everyNthHeat: 'At least 1' });
    const short = await rule({ everyNthHeat: 3, reason: 'x' });
    expect(short.body.error.fields).toEqual({ reason: 'Give a reason of at least 3 characters' });
    const unknownSupplier = await rule({ supplierId: 999999, everyNthHeat: 3 });
    expect(unknownSupplier.status).toBe(422);
    expect(unknownSupplier.body.error.fields).toEqual({ supplierId: 'Unknown supplier' });
    const unknownSpec = await rule({ specId: 'ASTM X999', everyNthHeat: 3 });
    expect(unknownSpec.body.error.fields).toEqual({ specId: 'Not in the specification library' });
    expect(await running.database.dataSource.query('SELECT COUNT(*) AS n FROM check_analysis_rule')).toEqual(before);
  });

  it(
    'when three heats arrive, then the 1st and 3rd are due ' + 'for a check and listed as awaiting, the 2nd is not',
    async () => {
      for (const [index, oxygen] of ['0.11', '0.10', '0.12'].entries()) {
        const heat = await post('engineer', '/api/heats', {
          heatNumber: `CK-${Date.now()}-${index}`,
          supplierId,
          specId: 'ASTM F136',
          meltRoute: 'VAR ×3',
          productForm: 'bar',
          condition: 'annealed',
          sizeMm: '25.4',
        });
        expect(heat.status).toBe(201);
        heatIds.push(heat.body.id);
        const certificate = await people.engineer.agent
          .post(`/api/heats/${heat.body.id}/certificates`)
          .set('X-CSRF-Token', people.engineer.csrf)
          .attach('certificate', pdf(`check ${heat.body.id}`), 'certificate.pdf');
        expect(certificate.status).toBe(201);
        const results = await people.engineer.agent
          .put(`/api/heats/${heat.body.id}/results`)
          .set('X-CSRF-Token', people.engineer.csrf)
          .send({
            chemistry: { Al: `6.1${index}`, V: '4.05', Fe: '0.16', O: oxygen, C: '0.02', N: '0.01', H: '45 ppm' },
            mechanical: { utsMPa: String(940 + index), ysMPa: '870', elongationPct: '15', reductionOfAreaPct: '42' },
          });
        expect(results.body.evaluation.verdict).toBe('conforms');
      }
      const [first, second, third] = await Promise.all(heatIds.map(detail));
      expect(first!.checkAnalysis).toMatchObject({ status: 'awaiting', required: true, position: 1 });
      expect(second!.checkAnalysis).toMatchObject({
        status: 'not-required',
        required: false,
        position: 2,
        why: expect.stringMatching(/the next is the 3rd$/),
      });
      expect(third!.checkAnalysis).toMatchObject({ status: 'awaiting', position: 3 });
      expect(first!.checkAnalysis.elements.find((element) => element.element === 'O')).toEqual({
        element: 'O',
        heatLimit: '≤ 0.13',
        checkLimit: '≤ 0.15',
      });
      const due = (await people.reviewer.agent.get('/api/check-analyses/due')).body.heats.map(
        (heat: { heatId: number }) => heat.heatId,
      );
      expect(due).toEqual(expect.arrayContaining([heatIds[0], heatIds[2]]));
      expect(due).not.toContain(heatIds[1]);
    },
  );

  it(
    '[CHECK-DUE] when the check is due, then acceptance ' + 'is refused; a heat the rule skips can be accepted',
    async () => {
      const refused = await accept(heatIds[0]!);
      expect(refused.status).toBe(422);
      expect(refused.body.error.message).toBe(
        'A check analysis of this heat is due (The first heat and every 2nd after it are checked; this is the ' +
          '1st heat from this supplier to this specification); record its results before accepting the heat',
      );
      expect((await accept(heatIds[1]!)).status).toBe(201);
    },
  );

  it(
    'when check results are wrong or not allowed, then ' + 'they are refused field by field and nothing is stored',
    async () => {
      const path = `/api/heats/${heatIds[0]}/check-analyses`;
      expect(
        (await post('reviewer', path, { laboratory: 'Lab', reportReference: 'R-1', chemistry: { O: '0.12' } })).status,
      ).toBe(403);
      const missing = await post('engineer', path, { laboratory: '', reportReference: '', chemistry: {} });
      expect(missing.status).toBe(400);
      expect(Object.keys(missing.body.error.fields).sort()).toEqual(['laboratory', 'reportReference']);
      const empty = await post('engineer', path, { laboratory: 'Lab', reportReference: 'R-1', chemistry: {} });
      expect(empty.status).toBe(400);
      expect(empty.body.error.fields).toEqual({ chemistry: 'No element measured' });
      const unreadable = await post('engineer', path, {
        laboratory: 'Lab',
        reportReference: 'R-1',
        chemistry: { O: 'high', Nb: '0.1' },
      });
      expect(unreadable.status).toBe(400);
      expect(unreadable.body.error.fields).toEqual({
        'chemistry.O': '"high" is not a decimal number (write e.g. 0.12 or 40 ppm)',
        'chemistry.Nb': 'The specification sets no limit for this element',
      });
      expect(
        (
          await post('engineer', '/api/heats/999999/check-analyses', {
            laboratory: 'Lab',
            reportReference: 'R-1',
            chemistry: { O: '0.12' },
          })
        ).status,
      ).toBe(404);
      expect(
        await running.database.dataSource.query('SELECT id FROM check_analysis WHERE heat_id = ?', [heatIds[0]]),
      ).toEqual([]);
    },
  );

  it(
    '[CHECK-TOLERANCE] when the check finds oxygen beyond the tolerance, then it does not conform and ' +
      'acceptance is refused; a later conforming check frees it',
    async () => {
      const path = `/api/heats/${heatIds[0]}/check-analyses`;
      const failing = await post('engineer', path, {
        laboratory: 'Tarnbridge materials laboratory',
        reportReference: 'TML-1',
        chemistry: { O: '0.16', Fe: '0.18', H: '60 ppm' },
      });
      expect(failing.status).toBe(201);
      expect(failing.body.status).toBe('does-not-conform');
      expect(
        failing.body.analyses[0].evaluation.items.find((item: { element: string }) => item.element === 'O'),
      ).toMatchObject({ rounded: '0.16', verdict: 'beyond-tolerance' });
      const refused = await accept(heatIds[0]!);
      expect(refused.body.error.message).toBe(
        'The latest check analysis does not conform (O 0.16 outside ≤ 0.15); the heat cannot be accepted',
      );
      const retest = await post('engineer', path, {
        laboratory: 'Second laboratory',
        reportReference: 'SL-7',
        chemistry: { O: '0.14', Fe: '0.18' },
      });
      expect(retest.body).toMatchObject({ status: 'conforms' });
      expect(retest.body.analyses.map((analysis: { reportReference: string }) => analysis.reportReference)).toEqual([
        'SL-7',
        'TML-1',
      ]);
      const events = await running.database.dataSource.query(
        "SELECT after_json FROM audit_event WHERE action = 'heat.check-analysis-recorded' AND entity_id = ? " +
          'ORDER BY seq',
        [String(heatIds[0])],
      );
      expect(events.map((event: { after_json: string }) => JSON.parse(event.after_json).verdict)).toEqual([
        'does-not-conform',
        'conforms',
      ]);
      const accepted = await accept(heatIds[0]!);
      expect(accepted.status).toBe(201);
      const [signed] = await running.database.dataSource.query(
        "SELECT content_json FROM electronic_signature WHERE record_type = 'heat' AND record_id = ?",
        [String(heatIds[0])],
      );
      expect(JSON.parse(signed.content_json).checkAnalyses).toEqual([
        'conforms: Second laboratory report SL-7',
        'does-not-conform: Tarnbridge materials laboratory report TML-1',
      ]);
      expect((await detail(heatIds[0]!)).status).toBe('accepted');
      expect(
        (await post('engineer', path, { laboratory: 'Lab', reportReference: 'late', chemistry: { O: '0.12' } })).status,
      ).toBe(422);
    },
  );

  it(
    'when the supplier becomes conditional, then every heat is due; a later rule for the scope replaces the ' +
      'earlier and both stay on record',
    async () => {
      await people.approver.agent
        .put(`/api/suppliers/${supplierId}/approval`)
        .set('X-CSRF-Token', people.approver.csrf)
        .send({ approval: 'conditional', reason: 'Findings at surveillance audit' });
      const heat = await post('engineer', '/api/heats', {
        heatNumber: `CK-${Date.now()}-4`,
        supplierId,
        specId: 'ASTM F136',
        meltRoute: 'VAR ×3',
        productForm: 'bar',
        condition: 'annealed',
        sizeMm: '25.4',
      });
      expect((await detail(heat.body.id)).checkAnalysis).toMatchObject({
        status: 'awaiting',
        position: 4,
        why: 'Every heat from a conditionally approved supplier is checked',
      });
      // Heat 2, accepted while the rule skipped it, would now be due; a heat accepted earlier keeps an intact
      // signature: what it signed does not move with the rules.
      const signatures = (await people.reviewer.agent.get(`/api/signatures?recordType=heat&recordId=${heatIds[1]}`))
        .body as Array<{ meaning: string; changedAfterSigning: boolean }>;
      expect(signatures.map((signature) => [signature.meaning, signature.changedAfterSigning])).toEqual([
        ['accepted', false],
      ]);
      expect(
        (
          await rule({
            everyNthHeat: null,
            everyHeatWhenConditional: false,
            reason: 'Exempted: the mill’s lab is accredited for us',
          })
        ).status,
      ).toBe(201);
      expect((await detail(heat.body.id)).checkAnalysis).toMatchObject({
        status: 'not-required',
        why: 'The rule selects no heats',
      });
      const rows = await running.database.dataSource.query(
        'SELECT every_nth_heat FROM check_analysis_rule WHERE supplier_id = ? ORDER BY id',
        [supplierId],
      );
      expect(rows).toEqual([{ every_nth_heat: 2 }, { every_nth_heat: null }]);
    },
  );
});
