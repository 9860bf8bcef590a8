import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildSignedResponse, encodeForPost, type SamlResponseInput } from '../../scripts/stand-in-idp/saml-response';
import { createSigningKey } from '../../scripts/stand-in-idp/signing-key';
import { createTestApp } from '../helpers/test-app';
import { person, SamlTestDriver } from '../helpers/saml-round-trip';

// Every refusal must leave no session behind: no session cookie, no new row in http_session,
// /api/me still 401, and a refused sign-in in the ledger with the reason.
describe('sign-in refusals', () => {
  const running = createTestApp();
  let saml: SamlTestDriver;
  beforeAll(async () => {
    saml = await SamlTestDriver.create(running.config);
  });
  afterAll(() => running.close());

  const acs = () => `${running.config.PUBLIC_URL}/auth/saml/acs`;
  const sessionRows = async () =>
    Number((await running.database.dataSource.query('SELECT COUNT(*) AS n FROM http_session'))[0].n);

  /** Starts a real sign-in and returns the agent and the AuthnRequest id the app is waiting for. */
  async function startSignIn() {
    const agent = request.agent(running.app);
    const login = await agent.get('/auth/login');
    const { request: authnRequest, query } = SamlTestDriver.authnRequestFrom(login.headers.location);
    return { agent, requestId: authnRequest.id, query };
  }

  function validInput(requestId: string | undefined, overrides: Partial<SamlResponseInput> = {}): SamlResponseInput {
    const auditor = person('kiw-0401');
    return {
      issuer: running.config.SAML_IDP_ENTITY_ID,
      destination: acs(),
      audience: running.config.SAML_SP_ENTITY_ID,
      inResponseTo: requestId,
      subject: auditor.subject,
      attributes: { displayName: [auditor.name], email: [auditor.email], groups: auditor.groups },
      authnInstant: new Date(),
      privateKeyPem: saml.key.privateKeyPem,
      certificatePem: saml.key.certificatePem,
      ...overrides,
    };
  }

  async function expectRefused(
    agent: ReturnType<typeof request.agent>,
    samlResponseXml: string,
    reason: RegExp,
    code = 'not-confirmed',
  ) {
    const before = await sessionRows();
    const response = await agent
      .post('/auth/saml/acs')
      .type('form')
      .send({ SAMLResponse: encodeForPost(samlResponseXml), RelayState: '/' });
    expect(response.status).toBe(303);
    const location = new URL(String(response.headers.location), 'http://app');
    expect(location.pathname).toBe('/sign-in');
    // The page is told a code only; the detailed reason goes to the audit trail.
    expect(location.searchParams.get('refused')).toBe(code);
    expect(String(response.headers['set-cookie'] ?? '')).not.toContain('ingotrace_session=');
    expect(await sessionRows()).toBe(before);
    expect((await agent.get('/api/me')).status).toBe(401);
    const [event] = await running.database.dataSource.query(
      "SELECT action, reason FROM audit_event WHERE action = 'session.sign-in-refused' ORDER BY seq DESC LIMIT 1",
    );
    expect(event.reason).toMatch(reason);
    return location.searchParams.get('refused');
  }

  it('when a well-formed response carries the right request id, then it is accepted (the control case)', async () => {
    const { agent, requestId } = await startSignIn();
    const response = await agent
      .post('/auth/saml/acs')
      .type('form')
      .send({ SAMLResponse: encodeForPost(buildSignedResponse(validInput(requestId))), RelayState: '/audit' });
    expect(response.headers.location).toBe('/audit');
    expect((await agent.get('/api/me')).status).toBe(200);
  });

  it('[SIGNIN-WRONG-KEY] when the response is signed by another key, then it is refused', async () => {
    const { agent, requestId } = await startSignIn();
    const intruder = await createSigningKey('someone else');
    await expectRefused(
      agent,
      buildSignedResponse(
        validInput(requestId, { privateKeyPem: intruder.privateKeyPem, certificatePem: intruder.certificatePem }),
      ),
      /Invalid (document )?signature/i,
    );
  });

  it('[SIGNIN-ALTERED] when an attribute was altered after signing, then it is refused', async () => {
    const { agent, requestId } = await startSignIn();
    const signed = buildSignedResponse(validInput(requestId));
    const altered = signed.replace('ingotrace-auditors', 'ingotrace-administrators');
    expect(altered).not.toBe(signed);
    await expectRefused(agent, altered, /Invalid (document )?signature/i);
  });

  it('when the assertion has expired, then it is refused', async () => {
    const { agent, requestId } = await startSignIn();
    const anHourAgo = new Date(Date.now() - 3600_000);
    // node-saml checks the bearer SubjectConfirmationData's NotOnOrAfter first and names it.
    await expectRefused(
      agent,
      buildSignedResponse(validInput(requestId, { issueInstant: anHourAgo, authnInstant: anHourAgo })),
      /No valid subject confirmation|expired/i,
    );
  });

  it('[SIGNIN-REPLAY] when a response is replayed, then the second use is refused', async () => {
    const { agent, requestId } = await startSignIn();
    const xml = buildSignedResponse(validInput(requestId));
    const first = await agent
      .post('/auth/saml/acs')
      .type('form')
      .send({ SAMLResponse: encodeForPost(xml), RelayState: '/' });
    expect(first.headers.location).toBe('/');
    await expectRefused(request.agent(running.app), xml, /InResponseTo is not valid/);
  });

  it('when the audience is another service, then it is refused', async () => {
    const { agent, requestId } = await startSignIn();
    await expectRefused(
      agent,
      buildSignedResponse(validInput(requestId, { audience: 'urn:another:service' })),
      /audience mismatch/i,
    );
  });

  it('when the recipient is another address, then it is refused', async () => {
    const { agent, requestId } = await startSignIn();
    await expectRefused(
      agent,
      buildSignedResponse(validInput(requestId, { recipient: 'http://127.0.0.1:9999/auth/saml/acs' })),
      /^Assertion recipient .* is not this service's address/,
    );
  });

  it('when the destination is another address, then it is refused', async () => {
    const { agent, requestId } = await startSignIn();
    await expectRefused(
      agent,
      buildSignedResponse(
        validInput(requestId, { destination: 'http://127.0.0.1:9999/auth/saml/acs', recipient: acs() }),
      ),
      /^Response destination .* is not this service's address/,
    );
  });

  it('when the issuer is not the configured identity provider, then it is refused', async () => {
    const { agent, requestId } = await startSignIn();
    await expectRefused(
      agent,
      buildSignedResponse(validInput(requestId, { issuer: 'http://impostor.example/metadata' })),
      /issuer .* is not the configured identity provider/i,
    );
  });

  it('when the response was not asked for (unsolicited), then it is refused', async () => {
    const { agent } = await startSignIn();
    await expectRefused(agent, buildSignedResponse(validInput(undefined)), /InResponseTo is missing/);
  });

  it('[SIGNIN-DEACTIVATED] when the person is deactivated in Ingotrace, then the sign-in is refused', async () => {
    const { agent, query } = await startSignIn();
    const answer = await saml.answerAtIdentityProvider(saml.idpAgent(), query, person('kiw-0901'));
    expect(answer.samlResponse).toBeDefined();
    await expectRefused(
      agent,
      Buffer.from(answer.samlResponse!, 'base64').toString('utf8'),
      /deactivated/,
      'deactivated',
    );
  });

  it(
    '[SIGNIN-OTHER-BROWSER] when a valid response obtained for one browser is posted from another, then the ' +
      'other browser is not signed in (login CSRF)',
    async () => {
      const victim = await startSignIn();
      const attacker = await startSignIn();
      // The attacker's own, perfectly valid response, posted by the victim's browser (which started its own sign-in)...
      const attackersResponse = buildSignedResponse(validInput(attacker.requestId));
      await expectRefused(victim.agent, attackersResponse, /started in another browser/, 'other-browser');
      // ...or by a browser that started none.
      const fresh = await startSignIn();
      await expectRefused(
        request.agent(running.app),
        buildSignedResponse(validInput(fresh.requestId)),
        /started in another browser/,
        'other-browser',
      );
      // A browser is let in with the response to the sign-in it started itself (a refusal ends the one it had).
      const again = await startSignIn();
      const own = await again.agent
        .post('/auth/saml/acs')
        .type('form')
        .send({ SAMLResponse: encodeForPost(buildSignedResponse(validInput(again.requestId))), RelayState: '/' });
      expect(own.headers.location).toBe('/');
    },
  );

  it(
    '[SIGNIN-DOCTYPE] when a response carries a DOCTYPE (even with only internal entities), then it is refused ' +
      'before it is parsed',
    async () => {
      const { agent, requestId } = await startSignIn();
      const signed = buildSignedResponse(validInput(requestId));
      const withDoctype = signed.replace(
        /^(<\?xml[^>]*\?>)?/,
        (declaration) => `${declaration}<!DOCTYPE Response [<!ENTITY who "kiw-0401">]>`,
      );
      expect(withDoctype).toContain('<!DOCTYPE');
      await expectRefused(agent, withDoctype, /contains a DOCTYPE/);
      const lowerCase = signed.replace(/^(<\?xml[^>]*\?>)?/, (declaration) => `${declaration}<!doctype Response>`);
      await expectRefused((await startSignIn()).agent, lowerCase, /contains a DOCTYPE/);
    },
  );

  it(
    'when the sign-in page is given any text in ?refused=, ' + 'then it shows only the product’s own messages',
    async () => {
      const { signInRefusalMessage } = await import('@shared/auth/sign-in-refusals');
      expect(signInRefusalMessage('Your account was compromised; call +1 555 0100')).toBeNull();
      expect(signInRefusalMessage('deactivated')).toBe('Your Ingotrace account is deactivated; ask an administrator.');
    },
  );
});
