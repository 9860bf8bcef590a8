import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { createTestApp } from '../helpers/test-app';
import { person, SamlTestDriver } from '../helpers/saml-round-trip';

/** The directives of a Content-Security-Policy header, by name. */
function directives(header: string | undefined): Map<string, string[]> {
  return new Map(
    (header ?? '')
      .split(';')
      .map((part) => part.trim().split(/\s+/))
      .filter((words) => words[0])
      .map(([name, ...values]) => [name!, values]),
  );
}

describe('security headers and cookies', () => {
  const plain = createTestApp();
  const behindTls = createTestApp({ PUBLIC_URL: 'https://ingotrace.example.test', TRUST_PROXY: 'loopback' });
  afterAll(async () => {
    await plain.close();
    await behindTls.close();
  });

  it(
    '[SEC-CSP] when any answer is sent, then it carries a strict content security policy without inline script, ' +
      'and no framework banner',
    async () => {
      for (const path of ['/api/organisation', '/api/nothing-here', '/auth/login']) {
        const response = await request(plain.app).get(path);
        const policy = directives(response.headers['content-security-policy']);
        expect(policy.get('default-src'), path).toEqual(["'self'"]);
        expect(policy.get('script-src'), path).toEqual(["'self'"]);
        expect(policy.get('object-src'), path).toEqual(["'none'"]);
        expect(policy.get('frame-ancestors'), path).toEqual(["'none'"]);
        expect(response.headers['x-content-type-options'], path).toBe('nosniff');
        expect(response.headers['referrer-policy'], path).toBe('no-referrer');
        expect(response.headers['x-powered-by'], path).toBeUndefined();
        // Served over plain HTTP (local use), the browser is not told to insist on HTTPS.
        expect(response.headers['strict-transport-security'], path).toBeUndefined();
      }
    },
  );

  it(
    '[SEC-TLS-COOKIE] when served behind TLS (a proxy on loopback forwarding https), then HSTS is sent and the ' +
      'session cookie is Secure, HttpOnly and SameSite',
    async () => {
      expect((await request(behindTls.app).get('/api/organisation')).headers['strict-transport-security']).toMatch(
        /max-age=\d+/,
      );
      const saml = await SamlTestDriver.create(behindTls.config);
      const agent = request.agent(behindTls.app);
      const login = await agent.get('/auth/login').set('X-Forwarded-Proto', 'https');
      // The sign-in binding cookie comes back with the identity provider's cross-site POST only as SameSite=None, hence
      // Secure.
      const binding = ([] as string[])
        .concat(login.headers['set-cookie'] ?? [])
        .find((line) => line.startsWith('ingotrace_signin='));
      expect(binding).toMatch(/;\s*Secure/i);
      expect(binding).toMatch(/;\s*HttpOnly/i);
      expect(binding).toMatch(/;\s*SameSite=None/i);
      const { query } = SamlTestDriver.authnRequestFrom(login.headers.location);
      const answer = await saml.answerAtIdentityProvider(saml.idpAgent(), query, person('kiw-0401'));
      // The test agent does not send Secure cookies over its plain connection to the app; the browser behind TLS would.
      const acs = await agent
        .post('/auth/saml/acs')
        .set('X-Forwarded-Proto', 'https')
        .set('Cookie', binding!.split(';')[0]!)
        .type('form')
        .send({ SAMLResponse: answer.samlResponse, RelayState: answer.relayState });
      expect(acs.status).toBe(303);
      const cookie = ([] as string[])
        .concat(acs.headers['set-cookie'] ?? [])
        .find((line) => line.startsWith('ingotrace_session='));
      expect(cookie).toMatch(/;\s*Secure/i);
      expect(cookie).toMatch(/;\s*HttpOnly/i);
      expect(cookie).toMatch(/;\s*SameSite=Lax/i);
    },
  );
});
