import express, { type Express } from 'express';
import { randomBytes } from 'node:crypto';
import { timingSafeEqual } from 'node:crypto';
import {
  AuthnRequestError,
  parseRedirectAuthnRequest,
  parseRedirectLogoutRequest,
  type AuthnRequestInfo,
} from './authn-request';
import { demoPeople, findDemoPerson, type DemoPerson } from './demo-people';
import { messagePage, postBindingPage, signInPage } from './pages';
import { buildSignedResponse, encodeForPost, newSamlId } from './saml-response';
import type { SigningKey } from './signing-key';

export interface StandInIdpOptions {
  entityId: string;
  /** The service provider's entity id (the audience of every assertion). */
  audience: string;
  /** ACS URLs the provider may post to; anything else is refused. */
  allowedAcsUrls: string[];
  key: SigningKey;
  people?: DemoPerson[];
  now?: () => Date;
}

interface PendingRequest {
  request: AuthnRequestInfo;
  relayState: string | undefined;
  createdAt: number;
}

interface IdpSession {
  subject: string;
  authnInstant: Date;
  sessionIndex: string;
}

const COOKIE = 'ingotrace_standin_idp';
const PENDING_LIFETIME_MS = 10 * 60_000;

function samePassword(given: string, expected: string): boolean {
  const a = Buffer.from(given);
  const b = Buffer.from(expected);
  return a.length === b.length && timingSafeEqual(a, b);
}

function readCookie(header: string | undefined, name: string): string | undefined {
  return header
    ?.split(';')
    .map((part) => part.trim().split('='))
    .find(([key]) => key === name)?.[1];
}

/**
 * The stand-in SAML 2.0 identity provider: HTTP-Redirect AuthnRequest in, signed Response and
 * Assertion out over HTTP-POST, ForceAuthn honoured, single logout. Development and tests only.
 */
export function createStandInIdp(options: StandInIdpOptions): Express {
  const people = options.people ?? demoPeople;
  const now = options.now ?? (() => new Date());
  const pending = new Map<string, PendingRequest>();
  const sessions = new Map<string, IdpSession>();
  const app = express();
  app.disable('x-powered-by');
  app.use(express.urlencoded({ extended: false, limit: '100kb' }));
  app.use((_req, res, next) => {
    res.set(
      'Content-Security-Policy',
      "default-src 'none'; style-src 'unsafe-inline'; script-src 'unsafe-inline'; form-action *; " +
        "frame-ancestors 'none'",
    );
    res.set('Cache-Control', 'no-store');
    next();
  });

  const respond = (
    res: express.Response,
    request: AuthnRequestInfo,
    relayState: string | undefined,
    session: IdpSession,
  ) => {
    const person = findDemoPerson(session.subject) ?? people.find((candidate) => candidate.subject === session.subject);
    if (!person) throw new Error('unknown person in identity-provider session');
    const acsUrl = request.assertionConsumerServiceUrl as string;
    const xml = buildSignedResponse({
      issuer: options.entityId,
      destination: acsUrl,
      audience: options.audience,
      inResponseTo: request.id,
      subject: person.subject,
      attributes: { displayName: [person.name], email: [person.email], groups: person.groups },
      authnInstant: session.authnInstant,
      issueInstant: now(),
      sessionIndex: session.sessionIndex,
      privateKeyPem: options.key.privateKeyPem,
      certificatePem: options.key.certificatePem,
    });
    res.type('html').send(postBindingPage(acsUrl, encodeForPost(xml), relayState));
  };

  app.get('/metadata', (_req, res) => {
    const certificate = options.key.certificatePem.replace(/-----[^-]+-----/g, '').replace(/\s+/g, '');
    res
      .type('application/samlmetadata+xml')
      .send(
        `<?xml version="1.0"?><md:EntityDescriptor xmlns:md="urn:oasis:names:tc:SAML:2.0:metadata" ` +
          `entityID="${options.entityId}">` +
          (`<md:IDPSSODescriptor WantAuthnRequestsSigned="false" ` +
            `protocolSupportEnumeration="urn:oasis:names:tc:SAML:2.0:protocol">`) +
          (`<md:KeyDescriptor use="signing"><ds:KeyInfo ` +
            (`xmlns:ds="http://www.w3.org/2000/09/xmldsig#"><ds:X509Data>` +
              `<ds:X509Certificate>${certificate}</ds:X509Certificate></ds:X509Data></ds:KeyInfo>` +
              `</md:KeyDescriptor>`)) +
          (`<md:SingleLogoutService Binding="urn:oasis:names:tc:SAML:2.0:bindings:HTTP-Redirect" ` +
            `Location="${options.entityId.replace(/\/metadata$/, '')}/slo"/>`) +
          (`<md:SingleSignOnService Binding="urn:oasis:names:tc:SAML:2.0:bindings:HTTP-Redirect" ` +
            `Location="${options.entityId.replace(/\/metadata$/, '')}/sso"/>`) +
          `</md:IDPSSODescriptor></md:EntityDescriptor>`,
      );
  });

  app.get('/sso', (req, res) => {
    const samlRequest = typeof req.query.SAMLRequest === 'string' ? req.query.SAMLRequest : '';
    const relayState = typeof req.query.RelayState === 'string' ? req.query.RelayState : undefined;
    let request: AuthnRequestInfo;
    try {
      request = parseRedirectAuthnRequest(samlRequest);
    } catch (error) {
      res
        .status(400)
        .type('html')
        .send(
          messagePage('Bad sign-in request', error instanceof AuthnRequestError ? error.message : 'unreadable request'),
        );
      return;
    }
    if (!request.assertionConsumerServiceUrl || !options.allowedAcsUrls.includes(request.assertionConsumerServiceUrl)) {
      res
        .status(400)
        .type('html')
        .send(
          messagePage(
            'Unknown service',
            `The address ${request.assertionConsumerServiceUrl ?? '(none)'} is not registered with this ` +
              `identity provider.`,
          ),
        );
      return;
    }
    const session = sessions.get(readCookie(req.headers.cookie, COOKIE) ?? '');
    if (session && !request.forceAuthn) {
      respond(res, request, relayState, session);
      return;
    }
    const token = randomBytes(16).toString('hex');
    pending.set(token, { request, relayState, createdAt: Date.now() });
    res
      .type('html')
      .send(
        signInPage({ requestToken: token, people, forceAuthn: request.forceAuthn, selectedSubject: session?.subject }),
      );
  });

  app.post('/sso/sign-in', (req, res) => {
    const { request: token, subject, password } = req.body as Record<string, string | undefined>;
    const waiting = pending.get(token ?? '');
    if (!waiting || Date.now() - waiting.createdAt > PENDING_LIFETIME_MS) {
      res.status(400).type('html').send(messagePage('Sign-in expired', 'Start again from Ingotrace.'));
      return;
    }
    const person = people.find((candidate) => candidate.subject === subject);
    if (!person || !samePassword(password ?? '', person.password)) {
      res
        .status(401)
        .type('html')
        .send(
          signInPage({
            requestToken: token as string,
            people,
            forceAuthn: waiting.request.forceAuthn,
            error: 'That password is not right for this person.',
            selectedSubject: subject,
          }),
        );
      return;
    }
    pending.delete(token as string);
    const sessionId = randomBytes(24).toString('hex');
    const session: IdpSession = { subject: person.subject, authnInstant: now(), sessionIndex: newSamlId() };
    sessions.set(sessionId, session);
    res.cookie(COOKIE, sessionId, { httpOnly: true, sameSite: 'lax', path: '/' });
    respond(res, waiting.request, waiting.relayState, session);
  });

  // Single logout (HTTP-Redirect LogoutRequest): ends the identity provider's session and
  // returns to the service provider's RelayState when it is one of the registered origins.
  app.get('/slo', (req, res) => {
    if (typeof req.query.SAMLRequest === 'string') {
      try {
        parseRedirectLogoutRequest(req.query.SAMLRequest);
      } catch (error) {
        res
          .status(400)
          .type('html')
          .send(
            messagePage(
              'Bad sign-out request',
              error instanceof AuthnRequestError ? error.message : 'unreadable request',
            ),
          );
        return;
      }
    }
    sessions.delete(readCookie(req.headers.cookie, COOKIE) ?? '');
    res.clearCookie(COOKIE, { path: '/' });
    const returnTo = typeof req.query.RelayState === 'string' ? req.query.RelayState : '';
    const allowedReturn = options.allowedAcsUrls.some((acs) => returnTo.startsWith(new URL(acs).origin + '/'));
    if (allowedReturn) res.redirect(303, returnTo);
    else res.type('html').send(messagePage('Signed out', 'You are signed out of the identity provider.'));
  });

  return app;
}
