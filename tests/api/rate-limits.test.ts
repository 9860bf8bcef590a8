import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { errorResponseSchema } from '@shared/errors';
import { createTestApp } from '../helpers/test-app';
import { csrfTokenOf, SamlTestDriver } from '../helpers/saml-round-trip';

// Limits of 3 sign-in attempts and 2 signatures begun per 15 minutes (the defaults are 30 and 60;
// common practice for interactive sign-in, no source).
describe('rate limits on sign-in and signing', () => {
  const running = createTestApp({ SIGN_IN_ATTEMPTS_PER_15_MIN: '3', TRUST_PROXY: 'loopback' });
  const unproxied = createTestApp({ SIGN_IN_ATTEMPTS_PER_15_MIN: '3', TRUST_PROXY: '' });
  // Its own app: the other suites' sign-ins from 127.0.0.1 count against the low sign-in limit above.
  const signing = createTestApp({ SIGNING_ATTEMPTS_PER_15_MIN: '2' });
  afterAll(async () => {
    await running.close();
    await unproxied.close();
    await signing.close();
  });
  // Addresses from TEST-NET-3 (RFC 5737), each run its own, forwarded by a proxy on loopback (which the app trusts).
  const address = () => `203.0.113.${1 + Math.floor(Math.random() * 254)}`;

  it(
    '[RATE-SIGN-IN] when one address sends more answers from the identity provider than the limit, then it is ' +
      'sent to the sign-in page with the reason and Retry-After; another address is not',
    async () => {
      const from = address();
      const attempt = (ip: string) =>
        request(running.app)
          .post('/auth/saml/acs')
          .set('X-Forwarded-For', ip)
          .type('form')
          .send({ SAMLResponse: 'bm90IGEgcmVzcG9uc2U=', RelayState: '/' });
      for (let index = 0; index < 3; index += 1) {
        const refused = await attempt(from);
        expect(refused.status).toBe(303);
        expect(refused.headers.location ?? '').not.toContain('too-many-attempts');
      }
      const limited = await attempt(from);
      expect(limited.status).toBe(303);
      expect(limited.headers.location ?? '').toMatch(/^\/sign-in\?refused=too-many-attempts&minutes=(\d+)$/);
      expect(Number(limited.headers['retry-after'])).toBeGreaterThan(0);
      expect(Number(limited.headers['retry-after'])).toBeLessThanOrEqual(15 * 60);
      let other = address();
      while (other === from) other = address();
      expect((await attempt(other)).headers.location ?? '').not.toContain('too-many-attempts');
    },
  );

  it(
    '[RATE-NO-PROXY] when no proxy is configured, then X-Forwarded-For is not believed: changing it does not ' +
      'escape the sign-in limit',
    async () => {
      let last = '';
      for (let index = 0; index < 4; index += 1) {
        const answer = await request(unproxied.app)
          .post('/auth/saml/acs')
          .set('X-Forwarded-For', address())
          .type('form')
          .send({ SAMLResponse: 'bm90IGEgcmVzcG9uc2U=', RelayState: '/' });
        last = answer.headers.location ?? '';
      }
      expect(last).toMatch(/^\/sign-in\?refused=too-many-attempts/);
    },
  );

  it(
    '[RATE-SIGNING] when a person begins more signatures than the limit, then the next is refused with 429 in ' +
      'the one error shape',
    async () => {
      const saml = await SamlTestDriver.create(signing.config);
      const { agent } = await saml.signIn(signing.app, 'kiw-0701');
      const csrf = await csrfTokenOf(agent);
      await signing.database.dataSource.query("DELETE FROM rate_limit_window WHERE bucket LIKE 'signing:%'");
      const answers: number[] = [];
      let limited;
      for (let index = 0; index < 3 && !limited; index += 1) {
        // An empty intent: refused by validation, but it counts as a signature begun.
        const response = await agent.post('/api/signatures/preparations').set('X-CSRF-Token', csrf).send({});
        answers.push(response.status);
        if (response.status === 429) limited = response;
      }
      expect(answers.slice(0, -1).every((status) => status === 400)).toBe(true);
      expect(limited?.status).toBe(429);
      const body = errorResponseSchema.parse(limited!.body);
      expect(body.error.code).toBe('RATE_LIMITED');
      expect(body.error.message).toMatch(/^Too many signatures begun in a short time; try again in \d+ minutes?$/);
      expect(Number(limited!.headers['retry-after'])).toBeGreaterThan(0);
    },
  );

  it(
    '[RATE-REAUTH-START] when a person starts more password confirmations than the limit, then the next is ' +
      'refused with 429',
    async () => {
      const saml = await SamlTestDriver.create(signing.config);
      const { agent } = await saml.signIn(signing.app, 'kiw-0201');
      const csrf = await csrfTokenOf(agent);
      await signing.database.dataSource.query(
        "DELETE FROM rate_limit_window WHERE bucket LIKE 'reauthentication-start:%'",
      );
      const statuses: number[] = [];
      for (let index = 0; index < 3; index += 1) {
        statuses.push(
          (
            await agent
              .post('/api/reauthentications')
              .set('X-CSRF-Token', csrf)
              .send({ purpose: 'sign a test record', bindingHash: 'a'.repeat(64) })
          ).status,
        );
      }
      expect(statuses).toEqual([201, 201, 429]);
    },
  );

  it(
    '[RATE-REAUTH-REFUND] when a person stops waiting for the password window, then that start is given back ' +
      'and does not count against the limit',
    async () => {
      const saml = await SamlTestDriver.create(signing.config);
      const { agent } = await saml.signIn(signing.app, 'kiw-0301');
      const csrf = await csrfTokenOf(agent);
      await signing.database.dataSource.query(
        "DELETE FROM rate_limit_window WHERE bucket LIKE 'reauthentication-start:%'",
      );
      const start = () =>
        agent
          .post('/api/reauthentications')
          .set('X-CSRF-Token', csrf)
          .send({ purpose: 'sign a test record', bindingHash: 'b'.repeat(64) });
      const first = await start();
      expect((await start()).status).toBe(201);
      const cancelled = await agent.post(`/api/reauthentications/${first.body.id}/cancel`).set('X-CSRF-Token', csrf);
      expect(cancelled.body).toMatchObject({ status: 'refused', reason: 'Cancelled by the person signing' });
      expect((await start()).status).toBe(201);
      expect((await start()).status).toBe(429);
      // Another person cannot cancel it.
      const other = await saml.signIn(signing.app, 'kiw-0201');
      expect(
        (
          await other.agent
            .post(`/api/reauthentications/${first.body.id}/cancel`)
            .set('X-CSRF-Token', await csrfTokenOf(other.agent))
        ).status,
      ).toBe(404);
    },
  );
});
