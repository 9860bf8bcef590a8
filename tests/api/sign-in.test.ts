import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { meSchema } from '@shared/schemas/people';
import { demoPeople } from '../../scripts/stand-in-idp/demo-people';
import { rolesFromGroups } from '../../server/src/modules/people/people.domain';
import { createTestApp } from '../helpers/test-app';
import { SamlTestDriver } from '../helpers/saml-round-trip';

describe('sign-in through the identity provider', () => {
  const running = createTestApp();
  let saml: SamlTestDriver;
  beforeAll(async () => {
    saml = await SamlTestDriver.create(running.config);
  });
  afterAll(() => running.close());

  it('when nobody is signed in, then /api/me answers 401', async () => {
    const response = await request(running.app).get('/api/me');
    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('UNAUTHENTICATED');
  });

  it(
    'when sign-in starts, then the app redirects to the ' + 'identity provider with an AuthnRequest for its own ACS',
    async () => {
      const response = await request(running.app).get('/auth/login?returnTo=/heats');
      expect(response.status).toBe(302);
      expect(String(response.headers.location).startsWith(running.config.SAML_IDP_SSO_URL)).toBe(true);
      const { request: authnRequest } = SamlTestDriver.authnRequestFrom(response.headers.location);
      expect(authnRequest.assertionConsumerServiceUrl).toBe(`${running.config.PUBLIC_URL}/auth/saml/acs`);
      expect(authnRequest.issuer).toBe(running.config.SAML_SP_ENTITY_ID);
      expect(authnRequest.forceAuthn).toBe(false);
      expect(new URL(String(response.headers.location)).searchParams.get('RelayState')).toBe('/heats');
    },
  );

  for (const demo of demoPeople.filter((candidate) => !candidate.note)) {
    it(
      `[SIGNIN-ROLES] when ${demo.name} signs in, then the session carries the roles from the groups ` +
        `${demo.groups.join(', ')}`,
      async () => {
        const { agent, location } = await saml.signIn(running.app, demo.subject, '/lots');
        expect(location).toBe('/lots');
        const me = meSchema.parse((await agent.get('/api/me')).body);
        expect(me.person).toMatchObject({ name: demo.name, email: demo.email });
        expect(me.person.roles).toEqual(rolesFromGroups(demo.groups, running.config.roleMap));
        expect(me.csrfToken.length).toBeGreaterThan(10);
      },
    );
  }

  it(
    '[SIGNIN-WRONG-PASSWORD] when the wrong password is given, then the identity provider refuses and nothing ' +
      'reaches the app',
    async () => {
      const login = await request(running.app).get('/auth/login');
      const { query } = SamlTestDriver.authnRequestFrom(login.headers.location);
      const answer = await saml.answerAtIdentityProvider(saml.idpAgent(), query, demoPeople[0]!, 'not-the-password');
      expect(answer.status).toBe(401);
      expect(answer.html).toContain('That password is not right for this person.');
      expect(answer.samlResponse).toBeUndefined();
    },
  );
});
