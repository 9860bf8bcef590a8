import { randomBytes } from 'node:crypto';
import { SignedXml } from 'xml-crypto';

/**
 * Builds a SAML 2.0 Response with one Assertion, signs the Assertion and then the Response
 * (RSA-SHA256, exclusive C14N, enveloped). Every field can be set, so tests can also build the
 * wrong responses a service provider must refuse.
 */
export interface SamlResponseInput {
  issuer: string;
  destination: string;
  recipient?: string;
  audience: string;
  inResponseTo?: string;
  subject: string;
  attributes: Record<string, string[]>;
  authnInstant: Date;
  /** Defaults to now. */
  issueInstant?: Date;
  /** How long the assertion stays valid; default 5 minutes. */
  validForMs?: number;
  sessionIndex?: string;
  assertionId?: string;
  privateKeyPem: string;
  certificatePem: string;
}

const SIGNATURE_ALGORITHM = 'http://www.w3.org/2001/04/xmldsig-more#rsa-sha256';
const DIGEST_ALGORITHM = 'http://www.w3.org/2001/04/xmlenc#sha256';
const EXCLUSIVE_C14N = 'http://www.w3.org/2001/10/xml-exc-c14n#';
const ENVELOPED = 'http://www.w3.org/2000/09/xmldsig#enveloped-signature';

export function newSamlId(): string {
  return `_${randomBytes(20).toString('hex')}`;
}

export function escapeXml(value: string): string {
  return value
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&apos;');
}

function instant(date: Date): string {
  return date.toISOString().replace(/\.\d{3}Z$/, 'Z');
}

function sign(xml: string, elementName: 'Assertion' | 'Response', input: SamlResponseInput): string {
  const signer = new SignedXml({
    privateKey: input.privateKeyPem,
    publicCert: input.certificatePem,
    signatureAlgorithm: SIGNATURE_ALGORITHM,
    canonicalizationAlgorithm: EXCLUSIVE_C14N,
  });
  const element = `//*[local-name(.)='${elementName}']`;
  signer.addReference({ xpath: element, transforms: [ENVELOPED, EXCLUSIVE_C14N], digestAlgorithm: DIGEST_ALGORITHM });
  signer.computeSignature(xml, {
    prefix: 'ds',
    location: { reference: `${element}/*[local-name(.)='Issuer']`, action: 'after' },
  });
  return signer.getSignedXml();
}

/** The unsigned XML (exposed for tests that alter it before or after signing). */
export function responseXml(input: SamlResponseInput, responseId = newSamlId()): string {
  const now = input.issueInstant ?? new Date();
  const notOnOrAfter = new Date(now.getTime() + (input.validForMs ?? 5 * 60_000));
  const notBefore = new Date(now.getTime() - 30_000);
  const inResponseTo = input.inResponseTo ? ` InResponseTo="${escapeXml(input.inResponseTo)}"` : '';
  const attributes = Object.entries(input.attributes)
    .map(
      ([name, values]) =>
        `<saml:Attribute Name="${escapeXml(name)}" ` +
        `NameFormat="urn:oasis:names:tc:SAML:2.0:attrname-format:basic">${values
          .map((value) => `<saml:AttributeValue>${escapeXml(value)}</saml:AttributeValue>`)
          .join('')}</saml:Attribute>`,
    )
    .join('');
  return (
    `<samlp:Response xmlns:samlp="urn:oasis:names:tc:SAML:2.0:protocol" ` +
    `xmlns:saml="urn:oasis:names:tc:SAML:2.0:assertion" ID="${responseId}" Version="2.0" ` +
    `IssueInstant="${instant(now)}" Destination="${escapeXml(input.destination)}"${inResponseTo}>` +
    `<saml:Issuer>${escapeXml(input.issuer)}</saml:Issuer>` +
    `<samlp:Status><samlp:StatusCode Value="urn:oasis:names:tc:SAML:2.0:status:Success"/></samlp:Status>` +
    `<saml:Assertion ID="${input.assertionId ?? newSamlId()}" Version="2.0" IssueInstant="${instant(now)}">` +
    `<saml:Issuer>${escapeXml(input.issuer)}</saml:Issuer>` +
    (`<saml:Subject><saml:NameID ` +
      `Format="urn:oasis:names:tc:SAML:2.0:nameid-format:persistent">${escapeXml(input.subject)}</saml:NameID>`) +
    (`<saml:SubjectConfirmation Method="urn:oasis:names:tc:SAML:2.0:cm:bearer">` +
      `<saml:SubjectConfirmationData${inResponseTo} ` +
      `NotOnOrAfter="${instant(notOnOrAfter)}" Recipient="${escapeXml(input.recipient ?? input.destination)}"/>` +
      `</saml:SubjectConfirmation></saml:Subject>`) +
    (`<saml:Conditions NotBefore="${instant(notBefore)}" ` +
      (`NotOnOrAfter="${instant(notOnOrAfter)}"><saml:AudienceRestriction>` +
        `<saml:Audience>${escapeXml(input.audience)}</saml:Audience></saml:AudienceRestriction>` +
        `</saml:Conditions>`)) +
    (`<saml:AuthnStatement AuthnInstant="${instant(input.authnInstant)}" ` +
      (`SessionIndex="${escapeXml(input.sessionIndex ?? newSamlId())}"><saml:AuthnContext>` +
        `<saml:AuthnContextClassRef>urn:oasis:names:tc:SAML:2.0:ac:classes:PasswordProtectedTransport` +
        `</saml:AuthnContextClassRef></saml:AuthnContext></saml:AuthnStatement>`)) +
    `<saml:AttributeStatement>${attributes}</saml:AttributeStatement>` +
    `</saml:Assertion></samlp:Response>`
  );
}

/** The signed Response as XML. */
export function buildSignedResponse(input: SamlResponseInput): string {
  return sign(sign(responseXml(input), 'Assertion', input), 'Response', input);
}

/** The signed Response, base64-encoded for the HTTP-POST binding. */
export function encodeForPost(xml: string): string {
  return Buffer.from(xml, 'utf8').toString('base64');
}
