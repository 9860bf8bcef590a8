import { deflateRawSync } from 'node:zlib';
import { beforeAll, describe, expect, it } from 'vitest';
import { loadConfig } from '../../server/src/config/env';
import { SamlTestDriver } from '../helpers/saml-round-trip';

function redirectRequest(acsUrl: string, forceAuthn = false): string {
  const xml =
    `<samlp:AuthnRequest xmlns:samlp="urn:oasis:names:tc:SAML:2.0:protocol" ` +
    `xmlns:saml="urn:oasis:names:tc:SAML:2.0:assertion" ID="_test1" Version="2.0" ` +
    `IssueInstant="2026-12-01T10:00:00Z" AssertionConsumerServiceURL="${acsUrl}" ` +
    `ForceAuthn="${forceAuthn}"><saml:Issuer>urn:ingotrace:service-provider</saml:Issuer></samlp:AuthnRequest>`;
  return encodeURIComponent(deflateRawSync(Buffer.from(xml)).toString('base64'));
}

describe('the stand-in identity provider', () => {
  const config = loadConfig();
  let saml: SamlTestDriver;
  beforeAll(async () => {
    saml = await SamlTestDriver.create(config);
  });

  it('when asked for metadata, then it publishes its entity id, endpoints and signing certificate', async () => {
    const response = await saml.idpAgent().get('/metadata');
    expect(response.status).toBe(200);
    expect(response.text).toContain(`entityID="${config.SAML_IDP_ENTITY_ID}"`);
    const certificateBody = saml.key.certificatePem.replace(/-----[^-]+-----/g, '').replace(/\s+/g, '');
    expect(response.text).toContain(`<ds:X509Certificate>${certificateBody}</ds:X509Certificate>`);
  });

  it('when a request names an ACS that is not registered, then it refuses to answer', async () => {
    const response = await saml.idpAgent().get(`/sso?SAMLRequest=${redirectRequest('http://127.0.0.1:9999/steal')}`);
    expect(response.status).toBe(400);
    expect(response.text).toContain(
      'The address http://127.0.0.1:9999/steal is not registered with this identity provider.',
    );
  });

  it('when the request is not a SAML AuthnRequest, then it says so', async () => {
    const response = await saml.idpAgent().get('/sso?SAMLRequest=bm90IGRlZmxhdGU%3D');
    expect(response.status).toBe(400);
    expect(response.text).toMatch(/SAMLRequest (is not base64-encoded DEFLATE data|does not hold a AuthnRequest)/);
  });

  it('when a registered ACS asks, then it shows the sign-in page listing the demo people', async () => {
    const response = await saml
      .idpAgent()
      .get(`/sso?SAMLRequest=${redirectRequest(`${config.PUBLIC_URL}/auth/saml/acs`)}`);
    expect(response.status).toBe(200);
    expect(response.text).toContain('Sign in to Ingotrace');
    expect(response.text).toContain('Maren Østby');
    expect(response.text).toContain('deactivated in Ingotrace');
  });
});
