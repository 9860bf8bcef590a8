import type { Request, RequestHandler } from 'express';
import passport from 'passport';
import { csrfSync } from 'csrf-sync';
import type { Strategy } from '@node-saml/passport-saml';
import type { Person } from '@shared/schemas/people';
import type { AppContext } from '../../app-context';
import { findPerson } from '../people/people.service';
import { createSamlStrategies, REAUTHENTICATION_STRATEGY, SIGN_IN_STRATEGY } from './saml-strategies';
import { createSessionSupport } from './session';

export interface Authentication {
  passport: passport.PassportStatic;
  signInStrategy: Strategy;
  /** Session, passport and time-outs, in order, for every route that knows who is asking. */
  sessionHandlers: RequestHandler[];
  csrfProtection: RequestHandler;
  generateCsrfToken: (req: Request) => string;
  close(): Promise<void>;
}

/** One passport instance per app (no global state), SAML strategies, sessions in MariaDB, CSRF. */
export function createAuthentication(context: AppContext): Authentication {
  const instance = new passport.Passport() as unknown as passport.PassportStatic;
  const strategies = createSamlStrategies(context);
  instance.use(SIGN_IN_STRATEGY, strategies.signIn);
  instance.use(REAUTHENTICATION_STRATEGY, strategies.reauthentication);
  instance.serializeUser((user, done) => done(null, (user as Person).id));
  // The session store reads the person with the session (one round trip), so a person arrives
  // here already read; an id alone means that no such person was found.
  instance.deserializeUser((stored: number | Person, done) => {
    if (typeof stored === 'object') return done(null, stored.active ? stored : false);
    context.database
      .connect()
      .then((dataSource) => findPerson(dataSource, stored))
      // A person deactivated while signed in loses the session at the next request.
      .then((person) => done(null, person && person.active ? person : false), done);
  });
  const sessions = createSessionSupport(context.config, () => context.database.connect());
  const csrf = csrfSync({
    getTokenFromRequest: (req) => {
      const header = req.headers['x-csrf-token'];
      return typeof header === 'string' ? header : undefined;
    },
  });
  return {
    passport: instance,
    signInStrategy: strategies.signIn,
    sessionHandlers: [sessions.middleware, instance.initialize(), instance.session(), sessions.enforceTimeouts],
    csrfProtection: csrf.csrfSynchronisedProtection,
    generateCsrfToken: (req) => csrf.generateToken(req),
    close: () => sessions.close(),
  };
}
