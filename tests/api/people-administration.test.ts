import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { peoplePageSchema, personSchema } from '@shared/schemas/people';
import { createTestApp } from '../helpers/test-app';
import { csrfTokenOf, SamlTestDriver } from '../helpers/saml-round-trip';

describe('people administration', () => {
  const running = createTestApp();
  let saml: SamlTestDriver;
  let admin: Awaited<ReturnType<SamlTestDriver['signIn']>>['agent'];
  let csrf: string;
  const idOf = async (subject: string) => Number((await running.database.dataSource.query('SELECT id FROM person WHERE subject = ?', [subject]))[0].id);
  const lastEvent = async (action: string) => (await running.database.dataSource.query('SELECT * FROM audit_event WHERE action = ? ORDER BY seq DESC LIMIT 1', [action]))[0];

  beforeAll(async () => {
    saml = await SamlTestDriver.create(running.config);
    admin = (await saml.signIn(running.app, 'kiw-0601')).agent;
    csrf = await csrfTokenOf(admin);
  });
  afterAll(async () => {
    // Leave the shared test database as the seed made it, for the other test files.
    const restore = [
      ['kiw-0102', ['manufacturing-engineer']],
      ['kiw-0701', ['qa-reviewer', 'recall-coordinator']],
    ] as const;
    for (const [subject, roles] of restore) {
      await admin.put(`/api/people/${await idOf(subject)}/roles`).set('X-CSRF-Token', csrf).send({ roles, reason: 'restore the seed after the test' });
    }
    await running.close();
  });

  it('when listing people, then they come sorted by name with server-side paging and search', async () => {
    const firstPage = peoplePageSchema.parse((await admin.get('/api/people?page=1&pageSize=3')).body);
    expect(firstPage.items.map((item) => item.name)).toEqual(['Aisling Ní Bhriain', 'Chiara Bellandi', 'Dieter Kranz']);
    expect(firstPage.total).toBeGreaterThanOrEqual(9);
    const secondPage = peoplePageSchema.parse((await admin.get('/api/people?page=2&pageSize=3')).body);
    expect(secondPage.items[0]?.name).toBe('Henrik Dahl');
    const search = peoplePageSchema.parse((await admin.get('/api/people?search=wiśniewski')).body);
    expect(search.items.map((item) => item.subject)).toEqual(['kiw-0102']);
    const deactivated = peoplePageSchema.parse((await admin.get('/api/people?status=deactivated')).body);
    expect(deactivated.items.map((item) => item.subject)).toEqual(['kiw-0901']);
  });

  it('when the query is malformed, then 400 names the fields', async () => {
    const response = await admin.get('/api/people?page=0&pageSize=1000&status=maybe');
    expect(response.status).toBe(400);
    expect(Object.keys(response.body.error.fields).sort()).toEqual(['query.page', 'query.pageSize', 'query.status']);
  });

  it('[PEOPLE-ROLES] when an administrator changes roles with a reason, then they take effect and the ledger records before, after and reason', async () => {
    const id = await idOf('kiw-0102');
    const response = await admin.put(`/api/people/${id}/roles`).set('X-CSRF-Token', csrf).send({ roles: ['manufacturing-engineer', 'recall-coordinator'], reason: 'Backs up the recall team in December' });
    expect(response.status).toBe(200);
    expect(personSchema.parse(response.body).roles).toEqual(['manufacturing-engineer', 'recall-coordinator']);
    const event = await lastEvent('person.roles-changed');
    expect(JSON.parse(event.before_json)).toEqual({ roles: ['manufacturing-engineer'] });
    expect(JSON.parse(event.after_json)).toEqual({ roles: ['manufacturing-engineer', 'recall-coordinator'] });
    expect(event).toMatchObject({ reason: 'Backs up the recall team in December', actor_name: 'Henrik Dahl', actor_role: 'administrator', entity_id: String(id) });

    const { agent } = await saml.signIn(running.app, 'kiw-0102');
    expect((await agent.get('/api/me')).body.person.roles).toEqual(['manufacturing-engineer', 'recall-coordinator']);
  });

  it('when an administrator withdraws a role the identity provider grants, then it stays withdrawn at the next sign-in', async () => {
    const id = await idOf('kiw-0701');
    const response = await admin.put(`/api/people/${id}/roles`).set('X-CSRF-Token', csrf).send({ roles: ['qa-reviewer'], reason: 'Recall duty moved to another person' });
    expect(response.body.roles).toEqual(['qa-reviewer']);
    expect(response.body.identityProviderRoles).toEqual(['qa-reviewer', 'recall-coordinator']);
    const { agent } = await saml.signIn(running.app, 'kiw-0701');
    expect((await agent.get('/api/me')).body.person.roles).toEqual(['qa-reviewer']);
  });

  it('[PEOPLE-DEACTIVATE] when a person is deactivated, then their open session ends and they cannot sign in again', async () => {
    const { agent: auditor } = await saml.signIn(running.app, 'kiw-0401');
    expect((await auditor.get('/api/me')).status).toBe(200);
    const id = await idOf('kiw-0401');
    const response = await admin.put(`/api/people/${id}/activation`).set('X-CSRF-Token', csrf).send({ active: false, reason: 'Left the company' });
    expect(response.status).toBe(200);
    expect((await auditor.get('/api/me')).status).toBe(401);
    const again = await saml.signIn(running.app, 'kiw-0401');
    expect(again.location).toMatch(/^\/sign-in\?refused=/);
    expect((await lastEvent('person.deactivated')).reason).toBe('Left the company');
    await admin.put(`/api/people/${id}/activation`).set('X-CSRF-Token', csrf).send({ active: true, reason: 'Rehired' });
  });

  it('[PEOPLE-LOCKOUT] when an administrator would lock themselves out, then it is refused with 422 and nothing changes', async () => {
    const id = await idOf('kiw-0601');
    const deactivate = await admin.put(`/api/people/${id}/activation`).set('X-CSRF-Token', csrf).send({ active: false, reason: 'testing' });
    expect(deactivate.status).toBe(422);
    expect(deactivate.body.error.message).toBe('You cannot deactivate yourself');
    const demote = await admin.put(`/api/people/${id}/roles`).set('X-CSRF-Token', csrf).send({ roles: ['auditor'], reason: 'testing' });
    expect(demote.status).toBe(422);
    expect((await admin.get('/api/me')).body.person.roles).toEqual(['administrator']);
  });

  it('when the person does not exist, then 404', async () => {
    const response = await admin.put('/api/people/999999/roles').set('X-CSRF-Token', csrf).send({ roles: ['auditor'], reason: 'nobody' });
    expect(response.status).toBe(404);
    expect(response.body.error).toMatchObject({ code: 'NOT_FOUND', message: 'Person not found' });
  });
});
