import express, { Router, type Request, type Response } from 'express';
import type { PassportStatic } from 'passport';
import type { AppContext } from '../../app-context';
import { AppError } from '../../errors';
import { originOf, currentPerson } from '../../middleware/access';
import { recordRefusedSignIn, recordSignOut, signIn, SignInRefused } from '../people/people.service';
import type { SignInRefusalCode } from '@shared/auth/sign-in-refusals';
import {
  bindingCookieOptions,
  bindingNonceFrom,
  carriesDoctype,
  isBoundToThisBrowser,
  newBindingNonce,
  SIGN_IN_BINDING_COOKIE,
  withBindingNonce,
} from './sign-in-binding';
import { completeReauthentication, pendingReauthentication } from './reauthentication.service';
import { REAUTHENTICATION_STRATEGY, SamlRefusal, SIGN_IN_STRATEGY, type VerifiedAssertion } from './saml-strategies';
import type { Strategy } from '@node-saml/passport-saml';
import { SESSION_COOKIE } from './session';
import { limitRate } from '../../middleware/rate-limits';

/** A return path inside the app (never another site). */
export function safeReturnPath(value: unknown): string {
  return typeof value === 'string' && /^\/(?!\/)[^\s\\]*$/.test(value) && value.length <= 500 ? value : '/';
}

function refusalMessage(error: unknown): string {
  const message = error instanceof Error ? error.message : String(error);
  return message.length > 300 ? `${message.slice(0, 297)}…` : message;
}

interface SamlSessionFacts {
  nameID: string;
  nameIDFormat: string;
  sessionIndex: string | undefined;
}

/**
 * Sign-in, sign-out and re-authentication through the identity provider. These routes sit outside
 * /api: the identity provider posts its responses here, and they answer with redirects.
 */
export function authRouter(
  context: AppContext,
  passport: PassportStatic,
  signInStrategy: Strategy,
  csrf: { protection: express.RequestHandler; generateToken: (req: Request) => string },
): Router {
  const router = Router();
  const urlencoded = express.urlencoded({ extended: false, limit: '512kb' });
  // Each answer from the identity provider counts as one attempt of the address it comes from.
  const attempts = limitRate({
    name: 'sign-in',
    limit: context.config.SIGN_IN_ATTEMPTS_PER_15_MIN,
    connect: () => context.database.connect(),
    key: 'address',
    message: (minutes) =>
      `Too many sign-in attempts from this address; try again in ${minutes} minute${minutes === 1 ? '' : 's'}`,
    answer: 'sign-in-page',
  });

  const secret = context.config.SESSION_SECRET;
  const cookieOptions = bindingCookieOptions(context.config.PUBLIC_URL);

  router.get('/login', (req, res, next) => {
    // The AuthnRequest's ID is derived from a nonce only this browser holds (see sign-in-binding).
    const nonce = newBindingNonce();
    res.cookie(SIGN_IN_BINDING_COOKIE, nonce, cookieOptions);
    withBindingNonce(nonce, () =>
      passport.authenticate(SIGN_IN_STRATEGY, {
        additionalParams: { RelayState: safeReturnPath(req.query.returnTo) },
      } as object)(req, res, next),
    );
  });

  /** Records why in the audit trail and sends the browser to the sign-in page with the code only. */
  async function refuse(
    req: Request,
    res: Response,
    code: SignInRefusalCode,
    reason: string,
    subject: string | null,
  ): Promise<void> {
    await recordRefusedSignIn(context.database.dataSource, refusalMessage(reason), subject, originOf(req));
    res.clearCookie(SIGN_IN_BINDING_COOKIE, { ...cookieOptions, maxAge: undefined });
    res.redirect(303, `/sign-in?refused=${code}`);
  }

  router.post('/saml/acs', attempts, urlencoded, (req: Request, res: Response, next) => {
    const relayState = safeReturnPath((req.body as { RelayState?: unknown })?.RelayState);
    if (carriesDoctype((req.body as { SAMLResponse?: unknown })?.SAMLResponse)) {
      refuse(req, res, 'not-confirmed', 'The identity provider’s answer contains a DOCTYPE and is refused', null).catch(
        next,
      );
      return;
    }
    passport.authenticate(
      SIGN_IN_STRATEGY,
      { session: false },
      async (error: unknown, verified: VerifiedAssertion | false) => {
        try {
          const origin = originOf(req);
          if (error || !verified) {
            await refuse(
              req,
              res,
              'not-confirmed',
              refusalMessage(error ?? 'The identity provider did not confirm who you are'),
              error instanceof SamlRefusal ? error.subject : null,
            );
            return;
          }
          if (!isBoundToThisBrowser(verified.inResponseTo, bindingNonceFrom(req.get('cookie')), secret)) {
            await refuse(
              req,
              res,
              'other-browser',
              `The response answers a sign-in started in another browser (InResponseTo ` +
                `${verified.inResponseTo ?? 'missing'})`,
              verified.subject,
            );
            return;
          }
          let person;
          try {
            person = await signIn(context.database.dataSource, verified, origin);
          } catch (refused) {
            await refuse(
              req,
              res,
              refused instanceof SignInRefused ? refused.code : 'not-confirmed',
              refusalMessage(refused),
              verified.subject,
            );
            return;
          }
          res.clearCookie(SIGN_IN_BINDING_COOKIE, { ...cookieOptions, maxAge: undefined });
          // passport regenerates the session id here (no session fixation).
          req.login(person, (loginError) => {
            if (loginError) return next(loginError);
            const now = Date.now();
            req.session.signedInAt = now;
            req.session.lastSeenAt = now;
            // The token exists from the first moment of the session, so that concurrent first
            // requests (each saving the session) cannot race over creating it.
            csrf.generateToken(req);
            (req.session as unknown as { saml: SamlSessionFacts }).saml = {
              nameID: verified.subject,
              nameIDFormat: 'urn:oasis:names:tc:SAML:2.0:nameid-format:persistent',
              sessionIndex: verified.sessionIndex,
            };
            req.session.save((saveError) => (saveError ? next(saveError) : res.redirect(303, relayState)));
          });
        } catch (unexpected) {
          next(unexpected);
        }
      },
    )(req, res, next);
  });

  router.post('/logout', csrf.protection, async (req, res) => {
    const person = currentPerson(req);
    const saml = (req.session as unknown as { saml?: SamlSessionFacts } | undefined)?.saml;
    if (person) await recordSignOut(context.database.dataSource, person, originOf(req));
    const identityProviderLogout = await new Promise<string>((resolve) => {
      if (!saml) return resolve(`${context.config.SAML_IDP_SLO_URL}`);
      const logoutRequest = { user: saml, query: { RelayState: `${context.config.PUBLIC_URL}/signed-out` }, body: {} };
      signInStrategy.logout(logoutRequest as never, (error, url) =>
        resolve(error || !url ? context.config.SAML_IDP_SLO_URL : url),
      );
    });
    await new Promise<void>((resolve) => req.logout({ keepSessionInfo: false }, () => resolve()));
    await new Promise<void>((resolve) => (req.session ? req.session.destroy(() => resolve()) : resolve()));
    res.clearCookie(SESSION_COOKIE, { path: '/' });
    res.json({ redirectUrl: identityProviderLogout });
  });

  router.get('/reauth/:reauthenticationId', async (req, res, next) => {
    const row = await pendingReauthentication(context.database.dataSource, String(req.params.reauthenticationId));
    const person = currentPerson(req);
    if (!row || !person || row.personId !== person.id) {
      next(
        new AppError('NOT_FOUND', 'This re-authentication is unknown, expired or not yours; start the signature again'),
      );
      return;
    }
    passport.authenticate(REAUTHENTICATION_STRATEGY, { additionalParams: { RelayState: row.id } } as object)(
      req,
      res,
      next,
    );
  });

  router.post('/saml/reauth-acs', attempts, urlencoded, (req: Request, res: Response, next) => {
    const id = String((req.body as { RelayState?: unknown })?.RelayState ?? '');
    if (carriesDoctype((req.body as { SAMLResponse?: unknown })?.SAMLResponse)) {
      next(new AppError('VALIDATION_FAILED', 'The identity provider’s answer contains a DOCTYPE and is refused'));
      return;
    }
    passport.authenticate(
      REAUTHENTICATION_STRATEGY,
      { session: false },
      async (error: unknown, verified: VerifiedAssertion | false) => {
        try {
          const outcome = await completeReauthentication(context.database.dataSource, {
            id,
            assertedSubject: verified ? verified.subject : null,
            authnInstant: verified ? verified.authnInstant : null,
            failure:
              error || !verified ? refusalMessage(error ?? 'The identity provider did not confirm who you are') : null,
            clockSkewMs: context.config.SAML_CLOCK_SKEW_MS,
            origin: originOf(req),
          });
          const separator = outcome.returnTo.includes('?') ? '&' : '?';
          res.redirect(303, `${outcome.returnTo}${separator}reauthentication=${id}`);
        } catch (failure) {
          next(failure);
        }
      },
    )(req, res, next);
  });

  return router;
}
