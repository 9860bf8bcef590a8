import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { peoplePageSchema, roleChangeOutcomeSchema } from '@shared/schemas/people';
import { createTestApp } from '../helpers/test-app';
import { csrfTokenOf, SamlTestDriver } from '../helpers/saml-round-trip';
import { signThroughApi } from '../helpers/signing';
import { spawnSync } from 'node:child_process';

function ingotrace(...args: string[]) {
  const result = spawnSync(process.execPath, ['bin/ingotrace.mjs', ...args], { encoding: 'utf8', env: process.env });
  return { code: result.status, stdout: result.stdout, stderr: result.stderr };
}

describe('people administration', () => {
  const running = createTestApp();
  let saml: SamlTestDriver;
  let admin: Awaited<ReturnType<SamlTestDriver['signIn']>>['agent'];
  let csrf: string;
  let second: { agent: typeof admin; csrf: string; subject: string };
  let first: { agent: typeof admin; csrf: string; subject: string };
  const idOf = async (subject: string) =>
    Number((await running.database.dataSource.query('SELECT id FROM person WHERE subject = ?', [subject]))[0].id);
  const lastEvent = async (action: string) =>
    (
      await running.database.dataSource.query('SELECT * FROM audit_event WHERE action = ? ORDER BY seq DESC LIMIT 1', [
        action,
      ])
    )[0];

  beforeAll(async () => {
    saml = await SamlTestDriver.create(running.config);
    admin = (await saml.signIn(running.app, 'kiw-0601')).agent;
    csrf = await csrfTokenOf(admin);
    first = { agent: admin, csrf, subject: 'kiw-0601' };
    const other = (await saml.signIn(running.app, 'kiw-0602')).agent;
    second = { agent: other, csrf: await csrfTokenOf(other), subject: 'kiw-0602' };
  });
  afterAll(async () => {
    // Leave the shared test database as the seed made it, for the other test files: asked by one administrator,
    // confirmed by the other.
    const restore = [
      ['kiw-0102', ['manufacturing-engineer']],
      ['kiw-0701', ['qa-reviewer', 'recall-coordinator']],
    ] as const;
    for (const [subject, roles] of restore) {
      const asked = await admin
        .put(`/api/people/${await idOf(subject)}/roles`)
        .set('X-CSRF-Token', csrf)
        .send({ roles, reason: 'restore the seed after the test' });
      if (asked.status === 202)
        await signThroughApi(saml, second, {
          recordType: 'role-change',
          recordId: String(asked.body.pending.id),
          meaning: 'confirmed',
        });
    }
    await running.close();
  });
  const askRoles = (who: typeof first, personId: number, roles: string[], reason: string) =>
    who.agent.put(`/api/people/${personId}/roles`).set('X-CSRF-Token', who.csrf).send({ roles, reason });

  it('when listing people, then they come sorted by name with server-side paging and search', async () => {
    const firstPage = peoplePageSchema.parse((await admin.get('/api/people?page=1&pageSize=3')).body);
    expect(firstPage.items.map((item) => item.name)).toEqual(['Aisling Ní Bhriain', 'Chiara Bellandi', 'Dieter Kranz']);
    expect(firstPage.total).toBeGreaterThanOrEqual(9);
    const secondPage = peoplePageSchema.parse((await admin.get('/api/people?page=2&pageSize=3')).body);
    expect(secondPage.items[0]?.name).toBe('Helmer Dalvang');
    const search = peoplePageSchema.parse((await admin.get('/api/people?search=wierzchlas')).body);
    expect(search.items.map((item) => item.subject)).toEqual(['kiw-0102']);
    const deactivated = peoplePageSchema.parse((await admin.get('/api/people?status=deactivated')).body);
    expect(deactivated.items.map((item) => item.subject)).toEqual(['kiw-0901']);
  });

  it('when the query is malformed, then 400 names the fields', async () => {
    const response = await admin.get('/api/people?page=0&pageSize=1000&status=maybe');
    expect(response.status).toBe(400);
    expect(Object.keys(response.body.error.fields).sort()).toEqual(['query.page', 'query.pageSize', 'query.status']);
  });

  it(
    '[PEOPLE-ROLES] when an administrator changes roles that sign nothing, then they take effect at once and ' +
      'the ledger records before, after and reason',
    async () => {
      const id = await idOf('kiw-0102');
      const response = await askRoles(
        first,
        id,
        ['manufacturing-engineer', 'auditor'],
        'Covers the internal audit in December',
      );
      expect(response.status).toBe(200);
      const outcome = roleChangeOutcomeSchema.parse(response.body);
      expect(outcome).toMatchObject({ applied: true, pending: null });
      expect(outcome.person.roles).toEqual(['auditor', 'manufacturing-engineer']);
      const event = await lastEvent('person.roles-changed');
      expect(JSON.parse(event.before_json)).toEqual({ roles: ['manufacturing-engineer'] });
      expect(JSON.parse(event.after_json)).toEqual({ roles: ['auditor', 'manufacturing-engineer'] });
      expect(event).toMatchObject({
        reason: 'Covers the internal audit in December',
        actor_name: 'Helmer Dalvang',
        actor_role: 'administrator',
        entity_id: String(id),
      });
      expect((await askRoles(first, id, ['manufacturing-engineer'], 'Audit done')).status).toBe(200);
    },
  );

  it(
    '[PEOPLE-SIGNING-ROLE-CONFIRM] when an administrator grants a signing role, then it waits until a second ' +
      'administrator confirms it with a signature; the one who asked cannot confirm',
    async () => {
      const id = await idOf('kiw-0102');
      const asked = await askRoles(
        first,
        id,
        ['manufacturing-engineer', 'recall-coordinator'],
        'Backs up the recall team in December',
      );
      expect(asked.status).toBe(202);
      const outcome = roleChangeOutcomeSchema.parse(asked.body);
      expect(outcome.applied).toBe(false);
      expect(outcome.pending).toMatchObject({
        personName: 'Tobiasz Wierzchlas',
        rolesBefore: ['manufacturing-engineer'],
        rolesAfter: ['manufacturing-engineer', 'recall-coordinator'],
        requestedBy: 'Helmer Dalvang',
      });
      expect((await lastEvent('person.role-change-requested')).reason).toBe('Backs up the recall team in December');
      // Not in effect yet: the person's next sign-in still carries the old roles.
      expect((await (await saml.signIn(running.app, 'kiw-0102')).agent.get('/api/me')).body.person.roles).toEqual([
        'manufacturing-engineer',
      ]);
      const settings = await admin.get('/api/people/settings');
      expect(settings.body).toMatchObject({
        administratorsMayApprove: false,
        pendingRoleChanges: [expect.objectContaining({ id: outcome.pending!.id })],
      });
      expect((await askRoles(second, id, ['manufacturing-engineer', 'qa-reviewer'], 'Another change')).status).toBe(
        409,
      );

      const record = { recordType: 'role-change', recordId: String(outcome.pending!.id), meaning: 'confirmed' };
      const byRequester = await signThroughApi(saml, first, record);
      expect(byRequester.status).toBe(422);
      expect(byRequester.body.error.message).toBe('You authored this record, so you cannot approve it');
      const confirmed = await signThroughApi(saml, second, record);
      expect(confirmed.status).toBe(201);
      const changed = await lastEvent('person.roles-changed');
      expect(changed).toMatchObject({
        actor_name: 'Mirela Vasilescu',
        actor_role: 'administrator',
        reason: 'Backs up the recall team in December',
      });
      expect(JSON.parse(changed.after_json)).toMatchObject({
        roles: ['manufacturing-engineer', 'recall-coordinator'],
        requestedBy: 'Helmer Dalvang',
      });
      expect((await (await saml.signIn(running.app, 'kiw-0102')).agent.get('/api/me')).body.person.roles).toEqual([
        'manufacturing-engineer',
        'recall-coordinator',
      ]);
      expect((await signThroughApi(saml, second, record)).status).toBe(422);
    },
  );

  it(
    '[PEOPLE-OWN-ROLES] when an administrator gives himself a signing role, or changes his own roles at all, ' +
      'then it is refused with 403 and nothing changes',
    async () => {
      const id = await idOf('kiw-0601');
      for (const roles of [
        ['administrator', 'qa-approver'],
        ['administrator', 'qa-reviewer'],
        ['administrator', 'auditor'],
        ['auditor'],
      ]) {
        const response = await askRoles(first, id, roles, 'I need to approve the backlog');
        expect(response.status).toBe(403);
        expect(response.body.error.message).toBe('Nobody changes their own roles; ask another administrator');
      }
      expect((await admin.get('/api/me')).body.person.roles).toEqual(['administrator']);
      expect(
        Number(
          (
            await running.database.dataSource.query(
              'SELECT COUNT(*) AS n FROM role_change_request WHERE person_id = ?',
              [id],
            )
          )[0].n,
        ),
      ).toBe(0);
    },
  );

  it(
    '[PEOPLE-ADMIN-APPROVER] when one administrator asks to make another a QA approver, then it is refused: the ' +
      'two roles are not held together unless the organisation allows it',
    async () => {
      const response = await askRoles(
        second,
        await idOf('kiw-0601'),
        ['administrator', 'qa-approver'],
        'Extra approver for the audit',
      );
      expect(response.status).toBe(422);
      expect(response.body.error.fields).toEqual({
        roles: 'Administrator and QA approver cannot be held together (organisation setting)',
      });
    },
  );

  it(
    '[PEOPLE-ADMIN-APPROVER-SETTING] when the organisation allows administrators to approve, then such a change ' +
      'may be asked; turned off again, its confirmation is refused',
    async () => {
      expect(ingotrace('organisation', 'administrators-may-approve', 'maybe', '--reason', 'x').code).toBe(2);
      const on = ingotrace(
        'organisation',
        'administrators-may-approve',
        'yes',
        '--reason',
        'Two-person site during the audit week',
      );
      expect(on.stdout).toBe('administrators may now also be QA approvers\n');
      expect((await lastEvent('organisation.setting-changed')).reason).toBe('Two-person site during the audit week');
      expect((await admin.get('/api/people/settings')).body.administratorsMayApprove).toBe(true);
      const asked = await askRoles(
        second,
        await idOf('kiw-0601'),
        ['administrator', 'qa-approver'],
        'Extra approver for the audit',
      );
      expect(asked.status).toBe(202);
      try {
        expect(ingotrace('organisation', 'administrators-may-approve', 'no', '--reason', 'Audit week over').code).toBe(
          0,
        );
        const confirm = await signThroughApi(saml, first, {
          recordType: 'role-change',
          recordId: String(asked.body.pending.id),
          meaning: 'confirmed',
        });
        // Helmer is the person concerned (an author), and the combination is refused again besides.
        expect(confirm.status).toBe(422);
      } finally {
        await signThroughApi(
          saml,
          second,
          { recordType: 'role-change', recordId: String(asked.body.pending.id), meaning: 'refused' },
          'Setting turned off',
        );
      }
      expect((await admin.get('/api/people/settings')).body).toMatchObject({
        administratorsMayApprove: false,
        pendingRoleChanges: [],
      });
    },
  );

  it(
    'when an administrator withdraws a signing role the identity provider grants, then once confirmed it stays ' +
      'withdrawn at the next sign-in',
    async () => {
      const id = await idOf('kiw-0701');
      const asked = await askRoles(first, id, ['qa-reviewer'], 'Recall duty moved to another person');
      expect(asked.status).toBe(202);
      expect(
        (
          await signThroughApi(saml, second, {
            recordType: 'role-change',
            recordId: String(asked.body.pending.id),
            meaning: 'confirmed',
          })
        ).status,
      ).toBe(201);
      const { agent } = await saml.signIn(running.app, 'kiw-0701');
      expect((await agent.get('/api/me')).body.person.roles).toEqual(['qa-reviewer']);
    },
  );

  it(
    'when a second administrator refuses a requested change with a reason, then nothing changes and the refusal ' +
      'is in the ledger',
    async () => {
      const id = await idOf('kiw-0102');
      const asked = await askRoles(
        first,
        id,
        ['manufacturing-engineer', 'qa-reviewer', 'recall-coordinator'],
        'Wants to review as well',
      );
      expect(asked.status).toBe(202);
      const refused = await signThroughApi(
        saml,
        second,
        { recordType: 'role-change', recordId: String(asked.body.pending.id), meaning: 'refused' },
        'Reviewer must not be the engineer of these lots',
      );
      expect(refused.status).toBe(201);
      expect((await lastEvent('person.role-change-refused')).reason).toBe(
        'Reviewer must not be the engineer of these lots',
      );
      expect((await admin.get('/api/people/settings')).body.pendingRoleChanges).toEqual([]);
    },
  );

  it(
    '[PEOPLE-DEACTIVATE] when a person is deactivated, then their open session ends and they cannot sign in ' + 'again',
    async () => {
      const { agent: auditor } = await saml.signIn(running.app, 'kiw-0401');
      expect((await auditor.get('/api/me')).status).toBe(200);
      const id = await idOf('kiw-0401');
      const response = await admin
        .put(`/api/people/${id}/activation`)
        .set('X-CSRF-Token', csrf)
        .send({ active: false, reason: 'Left the company' });
      expect(response.status).toBe(200);
      expect((await auditor.get('/api/me')).status).toBe(401);
      const again = await saml.signIn(running.app, 'kiw-0401');
      expect(again.location).toMatch(/^\/sign-in\?refused=/);
      expect((await lastEvent('person.deactivated')).reason).toBe('Left the company');
      await admin
        .put(`/api/people/${id}/activation`)
        .set('X-CSRF-Token', csrf)
        .send({ active: true, reason: 'Rehired' });
    },
  );

  it(
    '[PEOPLE-LOCKOUT] when an administrator would lock themselves out, then it is refused with 422 and nothing ' +
      'changes',
    async () => {
      const id = await idOf('kiw-0601');
      const deactivate = await admin
        .put(`/api/people/${id}/activation`)
        .set('X-CSRF-Token', csrf)
        .send({ active: false, reason: 'testing' });
      expect(deactivate.status).toBe(422);
      expect(deactivate.body.error.message).toBe('You cannot deactivate yourself');
      const demote = await admin
        .put(`/api/people/${id}/roles`)
        .set('X-CSRF-Token', csrf)
        .send({ roles: ['auditor'], reason: 'testing' });
      expect(demote.status).toBe(403);
      expect((await admin.get('/api/me')).body.person.roles).toEqual(['administrator']);
    },
  );

  it('when the person does not exist, then 404', async () => {
    const response = await admin
      .put('/api/people/999999/roles')
      .set('X-CSRF-Token', csrf)
      .send({ roles: ['auditor'], reason: 'nobody' });
    expect(response.status).toBe(404);
    expect(response.body.error).toMatchObject({ code: 'NOT_FOUND', message: 'Person not found' });
  });
});
