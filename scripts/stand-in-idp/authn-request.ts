import { inflateRawSync } from 'node:zlib';
import { DOMParser } from '@xmldom/xmldom';

export interface AuthnRequestInfo {
  id: string;
  issuer: string;
  assertionConsumerServiceUrl: string | null;
  forceAuthn: boolean;
  issueInstant: string;
}

export class AuthnRequestError extends Error {}

/** Decodes a SAML protocol message from the HTTP-Redirect binding (base64 of raw DEFLATE). */
function decodeRedirectMessage(samlRequest: string, rootName: string): Element {
  let xml: string;
  try {
    xml = inflateRawSync(Buffer.from(samlRequest, 'base64')).toString('utf8');
  } catch {
    throw new AuthnRequestError('SAMLRequest is not base64-encoded DEFLATE data');
  }
  const errors: string[] = [];
  const document = new DOMParser({
    errorHandler: {
      warning: () => undefined,
      error: (message: string) => errors.push(message),
      fatalError: (message: string) => errors.push(message),
    },
  }).parseFromString(xml, 'text/xml');
  const root = document.documentElement;
  if (errors.length || !root || root.localName !== rootName)
    throw new AuthnRequestError(`SAMLRequest does not hold a ${rootName}`);
  return root;
}

/** Decodes an AuthnRequest from the HTTP-Redirect binding. */
export function parseRedirectAuthnRequest(samlRequest: string): AuthnRequestInfo {
  const root = decodeRedirectMessage(samlRequest, 'AuthnRequest');
  const id = root.getAttribute('ID');
  if (!id) throw new AuthnRequestError('AuthnRequest has no ID');
  const issuer =
    root.getElementsByTagNameNS('urn:oasis:names:tc:SAML:2.0:assertion', 'Issuer')[0]?.textContent?.trim() ?? '';
  return {
    id,
    issuer,
    assertionConsumerServiceUrl: root.getAttribute('AssertionConsumerServiceURL'),
    forceAuthn: root.getAttribute('ForceAuthn') === 'true',
    issueInstant: root.getAttribute('IssueInstant') ?? '',
  };
}

/** Decodes a LogoutRequest from the HTTP-Redirect binding; returns the NameID it names. */
export function parseRedirectLogoutRequest(samlRequest: string): { nameId: string | null } {
  const root = decodeRedirectMessage(samlRequest, 'LogoutRequest');
  return {
    nameId:
      root.getElementsByTagNameNS('urn:oasis:names:tc:SAML:2.0:assertion', 'NameID')[0]?.textContent?.trim() ?? null,
  };
}
