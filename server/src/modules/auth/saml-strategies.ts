import { readFile } from 'node:fs/promises';
import {
  Strategy,
  ValidateInResponseTo,
  type Profile,
  type PassportSamlConfig,
  type VerifyWithRequest,
} from '@node-saml/passport-saml';
import type { AppContext } from '../../app-context';
import { attributeValues, rolesFromGroups } from '../people/people.domain';
import type { SignInIdentity } from '../people/people.service';
import { assertionRefusal, readAssertionFacts } from './assertion-facts';
import { claimAssertionId, MariadbSamlRequestCache } from './saml-request-cache.repository';
import { requestIdGenerator } from './sign-in-binding';

export const SIGN_IN_STRATEGY = 'saml';
export const REAUTHENTICATION_STRATEGY = 'saml-reauthentication';
const REQUEST_LIFETIME_MS = 10 * 60_000;

export class SamlRefusal extends Error {
  constructor(
    message: string,
    readonly subject: string | null = null,
  ) {
    super(message);
  }
}

export interface VerifiedAssertion extends SignInIdentity {
  assertionId: string;
  inResponseTo: string | null;
  sessionIndex: string | undefined;
}

export function acsUrls(context: AppContext): { signIn: string; reauthentication: string } {
  return {
    signIn: `${context.config.PUBLIC_URL}/auth/saml/acs`,
    reauthentication: `${context.config.PUBLIC_URL}/auth/saml/reauth-acs`,
  };
}

/**
 * Two passport strategies against the same identity provider: one to sign in, one that forces
 * the password again (ForceAuthn) before an electronic signature. node-saml verifies both
 * signatures, the audience, the time window and InResponseTo; we add the issuer, the destination
 * and recipient, and a used-assertion cache against replay.
 */
export function createSamlStrategies(context: AppContext): { signIn: Strategy; reauthentication: Strategy } {
  const { config } = context;
  const urls = acsUrls(context);
  const cacheProvider = new MariadbSamlRequestCache(context.database, REQUEST_LIFETIME_MS);
  const common: Omit<PassportSamlConfig, 'callbackUrl'> = {
    entryPoint: config.SAML_IDP_SSO_URL,
    logoutUrl: config.SAML_IDP_SLO_URL,
    issuer: config.SAML_SP_ENTITY_ID,
    audience: config.SAML_SP_ENTITY_ID,
    idpIssuer: config.SAML_IDP_ENTITY_ID,
    idpCert: (callback) => {
      readFile(config.SAML_IDP_CERT_FILE, 'utf8').then(
        (pem) => callback(null, pem),
        (error: Error) =>
          callback(
            new Error(`Cannot read the identity provider's certificate ${config.SAML_IDP_CERT_FILE}: ${error.message}`),
          ),
      );
    },
    wantAssertionsSigned: true,
    wantAuthnResponseSigned: true,
    acceptedClockSkewMs: config.SAML_CLOCK_SKEW_MS,
    validateInResponseTo: ValidateInResponseTo.always,
    requestIdExpirationPeriodMs: REQUEST_LIFETIME_MS,
    cacheProvider,
    generateUniqueId: requestIdGenerator(config.SESSION_SECRET),
    disableRequestedAuthnContext: true,
    identifierFormat: 'urn:oasis:names:tc:SAML:2.0:nameid-format:persistent',
    signatureAlgorithm: 'sha256',
    passReqToCallback: true,
  };

  const verifier =
    (acsUrl: string): VerifyWithRequest =>
    (_req, profile, done) => {
      verifyProfile(context, profile, acsUrl).then(
        (verified) => done(null, verified as unknown as Record<string, unknown>),
        (error: Error) => done(error),
      );
    };
  const noLogoutRequests: VerifyWithRequest = (_req, _profile, done) =>
    done(new Error('logout requests from the identity provider are not accepted'));

  return {
    signIn: new Strategy(
      { ...common, name: SIGN_IN_STRATEGY, callbackUrl: urls.signIn },
      verifier(urls.signIn),
      noLogoutRequests,
    ),
    reauthentication: new Strategy(
      { ...common, name: REAUTHENTICATION_STRATEGY, callbackUrl: urls.reauthentication, forceAuthn: true },
      verifier(urls.reauthentication),
      noLogoutRequests,
    ),
  };
}

async function verifyProfile(context: AppContext, profile: Profile | null, acsUrl: string): Promise<VerifiedAssertion> {
  if (!profile?.getSamlResponseXml) throw new SamlRefusal('The identity provider sent no assertion');
  const facts = readAssertionFacts(profile.getSamlResponseXml());
  const subject = profile.nameID || null;
  const refusal = assertionRefusal(facts, { idpEntityId: context.config.SAML_IDP_ENTITY_ID, acsUrl });
  if (refusal) throw new SamlRefusal(refusal, subject);
  if (!subject) throw new SamlRefusal('Assertion names no subject');
  const fresh = await claimAssertionId(
    context.database,
    facts.assertionId as string,
    facts.notOnOrAfter ?? new Date(Date.now() + 3600_000),
  );
  if (!fresh) throw new SamlRefusal('This assertion was already used (replay)', subject);
  const name = attributeValues(profile.displayName)[0] ?? subject;
  const email = attributeValues(profile.email ?? profile.mail)[0] ?? '';
  return {
    subject,
    name,
    email,
    identityProviderRoles: rolesFromGroups(
      attributeValues(profile[context.config.SAML_GROUP_ATTRIBUTE]),
      context.config.roleMap,
    ),
    authnInstant: facts.authnInstant as Date,
    assertionId: facts.assertionId as string,
    inResponseTo: facts.inResponseTo,
    sessionIndex: typeof profile.sessionIndex === 'string' ? profile.sessionIndex : undefined,
  };
}
