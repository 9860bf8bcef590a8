import { DOMParser } from '@xmldom/xmldom';

const PROTOCOL = 'urn:oasis:names:tc:SAML:2.0:protocol';
const ASSERTION = 'urn:oasis:names:tc:SAML:2.0:assertion';

/** What the service provider checks itself, beyond what node-saml validates. */
export interface AssertionFacts {
  responseIssuer: string | null;
  destination: string | null;
  /** The AuthnRequest ID the response answers. */
  inResponseTo: string | null;
  assertionId: string | null;
  assertionIssuer: string | null;
  recipients: string[];
  authnInstant: Date | null;
  notOnOrAfter: Date | null;
}

function date(value: string | null | undefined): Date | null {
  if (!value) return null;
  const parsed = new Date(value);
  return Number.isNaN(parsed.getTime()) ? null : parsed;
}

/** Reads the facts from a Response whose signatures node-saml has already verified. */
export function readAssertionFacts(responseXml: string): AssertionFacts {
  const document = new DOMParser({ errorHandler: { warning: () => undefined } }).parseFromString(
    responseXml,
    'text/xml',
  );
  const response = document.documentElement;
  const assertion = document.getElementsByTagNameNS(ASSERTION, 'Assertion')[0];
  const directChild = (parent: Element | undefined, namespace: string, name: string) =>
    parent
      ? Array.from(parent.childNodes).find(
          (node): node is Element =>
            node.nodeType === 1 && (node as Element).localName === name && (node as Element).namespaceURI === namespace,
        )
      : undefined;
  const confirmations = assertion
    ? Array.from(assertion.getElementsByTagNameNS(ASSERTION, 'SubjectConfirmationData'))
    : [];
  const authnStatement = assertion?.getElementsByTagNameNS(ASSERTION, 'AuthnStatement')[0];
  const conditions = assertion?.getElementsByTagNameNS(ASSERTION, 'Conditions')[0];
  return {
    responseIssuer:
      response?.namespaceURI === PROTOCOL
        ? (directChild(response, ASSERTION, 'Issuer')?.textContent?.trim() ?? null)
        : null,
    destination: response?.getAttribute('Destination') ?? null,
    inResponseTo: response?.getAttribute('InResponseTo') || null,
    assertionId: assertion?.getAttribute('ID') ?? null,
    assertionIssuer: directChild(assertion, ASSERTION, 'Issuer')?.textContent?.trim() ?? null,
    recipients: confirmations.map((element) => element.getAttribute('Recipient') ?? ''),
    authnInstant: date(authnStatement?.getAttribute('AuthnInstant')),
    notOnOrAfter: date(conditions?.getAttribute('NotOnOrAfter')),
  };
}

/** The reason to refuse, or null: issuer, destination and recipient must be exactly ours. */
export function assertionRefusal(
  facts: AssertionFacts,
  expected: { idpEntityId: string; acsUrl: string },
): string | null {
  if (facts.responseIssuer !== null && facts.responseIssuer !== expected.idpEntityId)
    return `Response issuer ${facts.responseIssuer} is not the configured identity provider`;
  if (facts.assertionIssuer !== expected.idpEntityId)
    return `Assertion issuer ${facts.assertionIssuer ?? '(none)'} is not the configured identity provider`;
  if (facts.destination !== expected.acsUrl)
    return `Response destination ${facts.destination ?? '(none)'} is not this service's address`;
  if (facts.recipients.length === 0 || facts.recipients.some((recipient) => recipient !== expected.acsUrl)) {
    return `Assertion recipient ${facts.recipients.join(', ') || '(none)'} is not this service's address`;
  }
  if (!facts.assertionId) return 'Assertion has no ID';
  if (!facts.authnInstant) return 'Assertion has no AuthnInstant';
  return null;
}
