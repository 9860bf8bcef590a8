import request from 'supertest';
import type { Express } from 'express';
import type TestAgent from 'supertest/lib/agent';
import { createStandInIdp } from '../../scripts/stand-in-idp/app';
import { parseRedirectAuthnRequest, type AuthnRequestInfo } from '../../scripts/stand-in-idp/authn-request';
import { demoPeople, type DemoPerson } from '../../scripts/stand-in-idp/demo-people';
import { loadOrCreateSigningKey, type SigningKey } from '../../scripts/stand-in-idp/signing-key';
import type { AppConfig } from '../../server/src/config/env';

/** Text of an HTML attribute value back to plain text. */
function unescapeHtml(value: string): string {
  return value
    .replace(/&quot;/g, '"')
    .replace(/&apos;/g, "'")
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&amp;/g, '&');
}

export function hiddenField(html: string, name: string): string | undefined {
  const match = new RegExp(`name="${name}" value="([^"]*)"`).exec(html);
  return match?.[1] === undefined ? undefined : unescapeHtml(match[1]);
}

export function person(subject: string): DemoPerson {
  const found = demoPeople.find((candidate) => candidate.subject === subject);
  if (!found) throw new Error(`no demo person ${subject}`);
  return found;
}

export const bySingleRole = {
  'manufacturing-engineer': 'kiw-0101',
  'qa-reviewer': 'kiw-0201',
  'qa-approver': 'kiw-0301',
  auditor: 'kiw-0401',
  'recall-coordinator': 'kiw-0501',
  administrator: 'kiw-0601',
} as const;

/**
 * Drives the real SAML round trip without a browser: the service provider's redirect, the
 * stand-in identity provider's pages (with their own cookie jar) and the HTTP-POST back.
 */
/** The people a lot's way from making to recall passes through, one of each role that acts on it. */
export const lotToRecallPeople = {
  engineer: 'kiw-0102',
  reviewer: 'kiw-0201',
  approver: 'kiw-0301',
  auditor: 'kiw-0401',
  coordinator: 'kiw-0501',
} as const;

export class SamlTestDriver {
  readonly identityProvider: Express;
  private constructor(
    readonly config: AppConfig,
    readonly key: SigningKey,
  ) {
    this.identityProvider = createStandInIdp({
      entityId: config.SAML_IDP_ENTITY_ID,
      audience: config.SAML_SP_ENTITY_ID,
      allowedAcsUrls: config.allowedAcsUrls,
      key,
    });
  }

  static async create(config: AppConfig): Promise<SamlTestDriver> {
    return new SamlTestDriver(config, await loadOrCreateSigningKey(config.SAML_IDP_CERT_FILE));
  }

  idpAgent(): TestAgent {
    return request.agent(this.identityProvider);
  }

  /** Follows a service-provider redirect to the identity provider; returns the request it carries. */
  static authnRequestFrom(location: string | undefined): { request: AuthnRequestInfo; query: string } {
    if (!location) throw new Error('expected a redirect to the identity provider');
    const url = new URL(location);
    return { request: parseRedirectAuthnRequest(url.searchParams.get('SAMLRequest') ?? ''), query: url.search };
  }

  /** At the identity provider: opens the sign-in page for the request and signs in; returns the POST-binding form. */
  async answerAtIdentityProvider(
    idp: TestAgent,
    query: string,
    who: DemoPerson,
    password = who.password,
  ): Promise<{ status: number; samlResponse?: string; relayState?: string; action?: string; html: string }> {
    const page = await idp.get(`/sso${query}`);
    let html = page.text;
    const token = hiddenField(html, 'request');
    if (token) {
      const signedIn = await idp
        .post('/sso/sign-in')
        .type('form')
        .send({ request: token, subject: who.subject, password });
      html = signedIn.text;
      if (signedIn.status !== 200) return { status: signedIn.status, html };
    }
    const action = /<form method="post" action="([^"]+)"/.exec(html)?.[1];
    return {
      status: 200,
      samlResponse: hiddenField(html, 'SAMLResponse'),
      relayState: hiddenField(html, 'RelayState'),
      action: action && unescapeHtml(action),
      html,
    };
  }

  /** Signs a person in to the app through the identity provider; returns the app agent with its session cookie. */
  async signIn(
    app: Express,
    subject: string,
    returnTo = '/',
  ): Promise<{ agent: TestAgent; location: string; cookie: string; setCookie: string[] }> {
    const agent = request.agent(app);
    const login = await agent.get(`/auth/login?returnTo=${encodeURIComponent(returnTo)}`);
    if (login.status !== 302) throw new Error(`login answered ${login.status}`);
    const { query } = SamlTestDriver.authnRequestFrom(login.headers.location as string);
    const answer = await this.answerAtIdentityProvider(this.idpAgent(), query, person(subject));
    if (!answer.samlResponse)
      throw new Error(`identity provider answered ${answer.status}: ${answer.html.slice(0, 300)}`);
    const acs = await agent
      .post('/auth/saml/acs')
      .type('form')
      .send({ SAMLResponse: answer.samlResponse, RelayState: answer.relayState });
    // The session cookie as a header, for clients other than this agent (benchmarks).
    const setCookie = ([] as string[]).concat(acs.headers['set-cookie'] ?? []);
    const cookie = setCookie.map((line) => line.split(';')[0]).join('; ');
    return { agent, location: acs.headers.location as string, cookie, setCookie };
  }
}

/** The CSRF token of a signed-in agent (from /api/me). */
export async function csrfTokenOf(agent: TestAgent): Promise<string> {
  const me = await agent.get('/api/me');
  if (me.status !== 200) throw new Error(`/api/me answered ${me.status}`);
  return me.body.csrfToken as string;
}

/**
 * Runs the re-authentication a signature needs: starts it in the app, answers the identity
 * provider's password prompt as the given person, and returns its id.
 */
export async function reauthenticate(
  saml: SamlTestDriver,
  agent: TestAgent,
  subject: string,
  bindingHash: string,
): Promise<string> {
  const csrf = await csrfTokenOf(agent);
  const started = await agent
    .post('/api/reauthentications')
    .set('X-CSRF-Token', csrf)
    .send({ purpose: 'sign in a test', bindingHash });
  if (started.status !== 201) throw new Error(`starting re-authentication answered ${started.status}`);
  const redirect = await agent.get(String(started.body.url));
  const { query } = SamlTestDriver.authnRequestFrom(redirect.headers.location);
  const answer = await saml.answerAtIdentityProvider(saml.idpAgent(), query, person(subject));
  await agent
    .post('/auth/saml/reauth-acs')
    .type('form')
    .send({ SAMLResponse: answer.samlResponse, RelayState: answer.relayState });
  return started.body.id as string;
}

/** Signs each named person in through the real SAML round trip; returns their agents with CSRF tokens, by name. */
export async function signInPeople<Name extends string>(
  saml: SamlTestDriver,
  app: Express,
  subjects: Record<Name, string>,
) {
  const people = {} as Record<Name, { agent: TestAgent; csrf: string; subject: string }>;
  for (const [name, subject] of Object.entries(subjects) as Array<[Name, string]>) {
    const { agent } = await saml.signIn(app, subject);
    people[name] = { agent, csrf: await csrfTokenOf(agent), subject };
  }
  return people;
}
