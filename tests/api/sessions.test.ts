import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MariaDbSessionStore } from '../../server/src/modules/auth/session-store.repository';
import { createTestApp } from '../helpers/test-app';
import { csrfTokenOf, person, SamlTestDriver } from '../helpers/saml-round-trip';

function sessionCookie(setCookie: string[] | string | undefined): string | undefined {
  const all = Array.isArray(setCookie) ? setCookie : setCookie ? [setCookie] : [];
  return all.find((cookie) => cookie.startsWith('ingotrace_session='))?.split(';')[0];
}

describe('sessions', () => {
  const running = createTestApp();
  let saml: SamlTestDriver;
  beforeAll(async () => {
    saml = await SamlTestDriver.create(running.config);
  });
  afterAll(() => running.close());

  it(
    '[SESSION-ROTATE] when a person signs in again, then the session id changes and the old one no longer works ' +
      '(no fixation)',
    async () => {
      // The cookie is issued once, at sign-in (it does not roll with every response).
      const first = await saml.signIn(running.app, 'kiw-0101');
      const firstCookie = sessionCookie(first.setCookie);
      expect(sessionCookie((await first.agent.get('/api/me')).headers['set-cookie'])).toBeUndefined();
      expect(firstCookie).toBeDefined();
      const again = await first.agent.get('/auth/login');
      const { query } = SamlTestDriver.authnRequestFrom(again.headers.location);
      const answer = await saml.answerAtIdentityProvider(saml.idpAgent(), query, person('kiw-0101'));
      const acs = await first.agent
        .post('/auth/saml/acs')
        .type('form')
        .send({ SAMLResponse: answer.samlResponse, RelayState: '/' });
      const secondCookie = sessionCookie(acs.headers['set-cookie']);
      expect(secondCookie).toBeDefined();
      expect(secondCookie).not.toBe(firstCookie);
      const withOld = await request(running.app).get('/api/me').set('Cookie', firstCookie!);
      expect(withOld.status).toBe(401);
    },
  );

  it('[SESSION-COOKIE] when the session cookie is issued, then it is HttpOnly and SameSite=Lax', async () => {
    const { setCookie } = await saml.signIn(running.app, 'kiw-0401');
    const cookie = setCookie.find((value) => value.startsWith('ingotrace_session='));
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
  });

  it(
    '[SESSION-CSRF] when a state-changing request has no CSRF token, then it is refused with 403, and with the ' +
      'token it goes through',
    async () => {
      const { agent } = await saml.signIn(running.app, 'kiw-0601');
      const token = await csrfTokenOf(agent);
      const body = { roles: ['auditor'], reason: 'covering audit week' };
      const refused = await agent.put('/api/people/1/roles').send(body);
      expect(refused.status).toBe(403);
      expect(refused.body.error).toMatchObject({
        code: 'FORBIDDEN',
        message: 'This request lacks a valid CSRF token; reload the page and try again',
      });
      const wrong = await agent.put('/api/people/1/roles').set('X-CSRF-Token', 'forged').send(body);
      expect(wrong.status).toBe(403);
      const accepted = await agent
        .put('/api/people/1/roles')
        .set('X-CSRF-Token', token)
        .send({ roles: [], reason: 'x' });
      expect(accepted.status).toBe(400);
      expect(accepted.body.error.fields).toEqual({ reason: 'Give a reason of at least 3 characters' });
    },
  );

  it(
    '[SESSION-IDLE] when a signed-in person stays idle longer than the idle time-out, then the session ends ' +
      'with a clear message',
    async () => {
      const shortIdle = createTestApp({ SESSION_IDLE_MINUTES: '0.05' });
      try {
        const { agent } = await saml.signIn(shortIdle.app, 'kiw-0401');
        expect((await agent.get('/api/me')).status).toBe(200);
        await new Promise((done) => setTimeout(done, 3_300));
        const expired = await agent.get('/api/me');
        expect(expired.status).toBe(401);
        expect(expired.body.error.message).toBe(
          'Your session ended after 0.05 minutes without activity; sign in again',
        );
        expect((await agent.get('/api/me')).status).toBe(401);
      } finally {
        await shortIdle.close();
      }
    },
  );

  it(
    "when a session is stored, then it holds the person's id only, their roles are read afresh with it, and a " +
      'session past its limit is neither read nor kept',
    async () => {
      const { agent, setCookie } = await saml.signIn(running.app, 'kiw-0401');
      const sid = decodeURIComponent(sessionCookie(setCookie)!.split('=')[1]!).replace(/^s:/, '').split('.')[0]!;
      const db = running.database.dataSource;
      const [{ data }] = await db.query('SELECT data FROM http_session WHERE session_id = ?', [sid]);
      const [{ id }] = await db.query("SELECT id FROM person WHERE subject = 'kiw-0401'");
      expect(JSON.parse(data).passport).toEqual({ user: id });
      // A role granted directly in the database is seen at the next request, without signing in again.
      await db.query("INSERT INTO person_role (person_id, role, source) VALUES (?, 'qa-reviewer', 'administrator')", [
        id,
      ]);
      try {
        expect((await agent.get('/api/me')).body.person.roles).toContain('qa-reviewer');
      } finally {
        await db.query(
          "DELETE FROM person_role WHERE person_id = ? AND role = 'qa-reviewer' AND source = 'administrator'",
          [id],
        );
      }
      expect((await agent.get('/api/me')).body.person.roles).not.toContain('qa-reviewer');
      await db.query('UPDATE http_session SET expires = UNIX_TIMESTAMP() - 1 WHERE session_id = ?', [sid]);
      expect((await agent.get('/api/me')).status).toBe(401);
      const store = new MariaDbSessionStore(async () => db, { expirationMs: 60_000, sweepIntervalMs: 3_600_000 });
      await store.sweep();
      store.close();
      expect(await db.query('SELECT session_id FROM http_session WHERE session_id = ?', [sid])).toEqual([]);
    },
  );

  it(
    'when two app instances share the database, then a session begun on one is served by the other, and signing ' +
      'out on one ends it on both',
    async () => {
      const other = createTestApp();
      try {
        const { cookie } = await saml.signIn(running.app, 'kiw-0201');
        const onOther = await request(other.app).get('/api/me').set('Cookie', cookie);
        expect(onOther.status).toBe(200);
        expect(onOther.body.person.roles).toEqual(['qa-reviewer']);
        // A state-changing request on the second instance with the token the session holds.
        const logout = await request(other.app)
          .post('/auth/logout')
          .set('Cookie', cookie)
          .set('X-CSRF-Token', onOther.body.csrfToken);
        expect(logout.status).toBe(200);
        expect((await request(running.app).get('/api/me').set('Cookie', cookie)).status).toBe(401);
      } finally {
        await other.close();
      }
    },
  );

  it(
    '[SESSION-SIGN-OUT] when a person signs out, then the session ends and the browser is sent to the identity ' +
      'provider with a LogoutRequest',
    async () => {
      const { agent } = await saml.signIn(running.app, 'kiw-0501');
      const token = await csrfTokenOf(agent);
      const out = await agent.post('/auth/logout').set('X-CSRF-Token', token);
      expect(out.status).toBe(200);
      const redirect = new URL(out.body.redirectUrl);
      expect(`${redirect.origin}${redirect.pathname}`).toBe(running.config.SAML_IDP_SLO_URL);
      expect(redirect.searchParams.get('SAMLRequest')).toBeTruthy();
      expect(redirect.searchParams.get('RelayState')).toBe(`${running.config.PUBLIC_URL}/signed-out`);
      expect((await agent.get('/api/me')).status).toBe(401);
      const idp = await saml.idpAgent().get(`${redirect.pathname}${redirect.search}`);
      expect(idp.status).toBe(303);
      expect(idp.headers.location).toBe(`${running.config.PUBLIC_URL}/signed-out`);
    },
  );
});
