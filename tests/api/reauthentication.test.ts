import { createHash } from 'node:crypto';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildSignedResponse, encodeForPost } from '../../scripts/stand-in-idp/saml-response';
import { consumeReauthentication } from '../../server/src/modules/auth/reauthentication.service';
import { createTestApp } from '../helpers/test-app';
import { csrfTokenOf, person, SamlTestDriver } from '../helpers/saml-round-trip';

const bindingHash = createHash('sha256').update('{"record":"heat 7","meaning":"accepted"}').digest('hex');

describe('re-authentication before an electronic signature', () => {
  const running = createTestApp();
  let saml: SamlTestDriver;
  beforeAll(async () => {
    saml = await SamlTestDriver.create(running.config);
  });
  afterAll(() => running.close());

  /** Signs in a reviewer at the identity provider (keeping its session) and starts a re-authentication. */
  async function start(subject = 'kiw-0201') {
    const idp = saml.idpAgent();
    const agent = request.agent(running.app);
    const login = await agent.get('/auth/login');
    const first = await saml.answerAtIdentityProvider(
      idp,
      SamlTestDriver.authnRequestFrom(login.headers.location).query,
      person(subject),
    );
    await agent.post('/auth/saml/acs').type('form').send({ SAMLResponse: first.samlResponse, RelayState: '/' });
    const csrf = await csrfTokenOf(agent);
    const started = await agent
      .post('/api/reauthentications')
      .set('X-CSRF-Token', csrf)
      .send({ purpose: 'accept heat 7', bindingHash, returnTo: '/heats/7' });
    expect(started.status).toBe(201);
    const redirect = await agent.get(String(started.body.url));
    expect(redirect.status).toBe(302);
    const { request: authnRequest, query } = SamlTestDriver.authnRequestFrom(redirect.headers.location);
    return {
      agent,
      idp,
      id: started.body.id as string,
      authnRequest,
      query,
      personId: (await agent.get('/api/me')).body.person.id as number,
    };
  }

  const status = async (agent: Awaited<ReturnType<typeof start>>['agent'], id: string) =>
    (await agent.get(`/api/reauthentications/${id}`)).body;

  it(
    '[REAUTH-SAME-PERSON] when the same person enters the password again, then a one-time signing ticket is ' +
      'confirmed',
    async () => {
      const { agent, idp, id, authnRequest, query, personId } = await start();
      expect(authnRequest.forceAuthn).toBe(true);
      expect(authnRequest.assertionConsumerServiceUrl).toBe(`${running.config.PUBLIC_URL}/auth/saml/reauth-acs`);
      const answer = await saml.answerAtIdentityProvider(idp, query, person('kiw-0201'));
      const back = await agent
        .post('/auth/saml/reauth-acs')
        .type('form')
        .send({ SAMLResponse: answer.samlResponse, RelayState: answer.relayState });
      expect(back.status).toBe(303);
      expect(back.headers.location).toBe(`/heats/7?reauthentication=${id}`);
      expect(await status(agent, id)).toMatchObject({ status: 'confirmed', reason: null });

      const dataSource = running.database.dataSource;
      await expect(
        dataSource.transaction((manager) =>
          consumeReauthentication(manager, { id, personId, bindingHash: 'f'.repeat(64) }),
        ),
      ).rejects.toThrow('the record changed after you re-authenticated');
      const used = await dataSource.transaction((manager) =>
        consumeReauthentication(manager, { id, personId, bindingHash }),
      );
      expect(used.authnInstant.getTime()).toBeLessThanOrEqual(Date.now());
      await expect(
        dataSource.transaction((manager) => consumeReauthentication(manager, { id, personId, bindingHash })),
      ).rejects.toThrow('was already used for a signature');
    },
  );

  it(
    '[REAUTH-FORCE] when ForceAuthn is asked, then the identity provider asks for the password even though its ' +
      'session is open',
    async () => {
      const { idp, query } = await start();
      const page = await idp.get(`/sso${query}`);
      expect(page.text).toContain('Confirm it is you');
      expect(page.text).toContain('name="password"');
    },
  );

  it(
    '[REAUTH-OTHER-PERSON] when a different person re-authenticates, then it is refused and the ticket cannot ' +
      'be used',
    async () => {
      const { agent, idp, id, query, personId } = await start();
      const answer = await saml.answerAtIdentityProvider(idp, query, person('kiw-0301'));
      await agent
        .post('/auth/saml/reauth-acs')
        .type('form')
        .send({ SAMLResponse: answer.samlResponse, RelayState: answer.relayState });
      expect(await status(agent, id)).toMatchObject({
        status: 'refused',
        reason: 'Re-authentication was by a different person than the one signing',
      });
      await expect(
        running.database.dataSource.transaction((manager) =>
          consumeReauthentication(manager, { id, personId, bindingHash }),
        ),
      ).rejects.toThrow(/was refused/);
    },
  );

  it(
    '[REAUTH-STALE] when the identity provider answers with an old authentication instant, then it is refused ' +
      'as stale',
    async () => {
      const { agent, id, authnRequest } = await start();
      const reviewer = person('kiw-0201');
      const acs = `${running.config.PUBLIC_URL}/auth/saml/reauth-acs`;
      const xml = buildSignedResponse({
        issuer: running.config.SAML_IDP_ENTITY_ID,
        destination: acs,
        audience: running.config.SAML_SP_ENTITY_ID,
        inResponseTo: authnRequest.id,
        subject: reviewer.subject,
        attributes: { displayName: [reviewer.name], email: [reviewer.email], groups: reviewer.groups },
        authnInstant: new Date(Date.now() - 10 * 60_000),
        privateKeyPem: saml.key.privateKeyPem,
        certificatePem: saml.key.certificatePem,
      });
      await agent
        .post('/auth/saml/reauth-acs')
        .type('form')
        .send({ SAMLResponse: encodeForPost(xml), RelayState: id });
      expect(await status(agent, id)).toMatchObject({
        status: 'refused',
        reason: 'The identity provider did not ask for your password again (stale authentication)',
      });
    },
  );

  it('when someone else asks for the re-authentication of another person, then it is not found', async () => {
    const { id } = await start();
    const { agent: other } = await saml.signIn(running.app, 'kiw-0401');
    expect((await other.get(`/api/reauthentications/${id}`)).status).toBe(404);
    expect((await other.get(`/auth/reauth/${id}`)).status).toBe(404);
  });
});
