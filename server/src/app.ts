import express, { type Express } from 'express';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import type { AppContext } from './app-context';
import { apiNotFound, errorHandler } from './middleware/error-handler';
import { requestId } from './middleware/request-id';
import { createAuthentication } from './modules/auth/authentication';
import { authRouter } from './modules/auth/auth.router';
import { meRouter } from './modules/auth/me.router';
import { healthRouter } from './modules/health/health.router';
import { organisationRouter } from './modules/organisation/organisation.router';
import { peopleRouter } from './modules/people/people.router';
import { auditRouter } from './modules/ledger/audit.router';
import { signaturesRouter } from './modules/signatures/signatures.router';
import { materialsRouter } from './modules/materials/materials.router';
import { barStockRouter } from './modules/materials/bar-stock.router';
import { manufacturingRouter } from './modules/manufacturing/manufacturing.router';
import { releaseRouter } from './modules/release/release.router';
import { digitalLinkRouter } from './modules/trace/digital-link.router';
import { traceRouter } from './modules/trace/trace.router';
import { homeRouter } from './modules/home/home.router';
import { recallRouter } from './modules/recall/recall.router';
import { fieldActionRouter } from './modules/recall/field-action.router';
import { replyRouter } from './modules/recall/reply.router';
import { startReminderWorker } from './modules/recall/notice-reminders';
import { startMailWorker } from './modules/mail/mail-outbox';
import { startDailyCheckpoints } from './modules/ledger/ledger-checkpoints';
import { configureLinks } from './modules/mail/links';
import { registerProductRecordTypes } from './modules/signable-record-types';

export interface AppOptions {
  /** Folder with the built client (index.html and assets); omitted in API-only tests. */
  clientDir?: string;
  /** Deliver queued e-mail in the background (default); tests of the outbox itself turn it off. */
  mailWorker?: boolean;
  /**
   * Checkpoint the audit ledger daily (default, except in the test profile, whose suites checkpoint when they mean to).
   */
  dailyCheckpoints?: boolean;
  /** Remind consignees that have not answered (default, except in the test profile, whose suites run it when they mean to). */
  reminders?: boolean;
}

export type IngotraceApp = Express & { shutdown(): Promise<void> };

/** Builds the Express app; never listens (index.ts does, tests use supertest). */
export function createApp(context: AppContext, options: AppOptions = {}): IngotraceApp {
  registerProductRecordTypes();
  configureLinks(context.config.PUBLIC_URL);
  const app = express();
  app.disable('x-powered-by');
  app.set(
    'trust proxy',
    context.config.TRUST_PROXY ? context.config.TRUST_PROXY.split(',').map((entry) => entry.trim()) : false,
  );

  app.use(
    pinoHttp({
      logger: context.logger,
      genReqId: requestId,
      customLogLevel: (_req, res, error) =>
        error || res.statusCode >= 500 ? 'error' : res.statusCode >= 400 ? 'warn' : 'info',
      autoLogging: { ignore: (req) => req.url === '/api/health' },
    }),
  );
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          // PrimeVue writes its theme into <style> elements at run time.
          styleSrc: ["'self'", "'unsafe-inline'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          fontSrc: ["'self'", 'data:'],
          connectSrc: ["'self'"],
          objectSrc: ["'none'"],
          frameAncestors: ["'none'"],
          // Sign-in leaves for the identity provider.
          formAction: ["'self'", new URL(context.config.SAML_IDP_SSO_URL).origin],
          upgradeInsecureRequests: null,
        },
      },
      strictTransportSecurity: context.config.PUBLIC_URL.startsWith('https:'),
    }),
  );

  const authentication = createAuthentication(context);
  app.use(
    '/auth',
    ...authentication.sessionHandlers,
    authRouter(context, authentication.passport, authentication.signInStrategy, {
      protection: authentication.csrfProtection,
      generateToken: authentication.generateCsrfToken,
    }),
  );

  // A consignee's reply link: no account, no session; the link's secret is the credential.
  app.use('/api/replies', replyRouter(context));

  const api = express.Router();
  api.use(express.json({ limit: '1mb' }));
  api.use(...authentication.sessionHandlers, authentication.csrfProtection);
  api.use(healthRouter(context));
  api.use(organisationRouter(context));
  api.use(meRouter(context, authentication.generateCsrfToken));
  api.use(peopleRouter(context));
  api.use(auditRouter(context));
  api.use(signaturesRouter(context));
  api.use(materialsRouter(context));
  api.use(barStockRouter(context));
  api.use(manufacturingRouter(context));
  api.use(releaseRouter(context));
  api.use(traceRouter(context));
  api.use(homeRouter(context));
  api.use(recallRouter(context));
  api.use(fieldActionRouter(context));
  api.use(apiNotFound);
  app.use('/api', api);

  app.use(digitalLinkRouter(context, authentication.sessionHandlers));

  const clientDir = options.clientDir ? resolve(options.clientDir) : null;
  if (clientDir && existsSync(`${clientDir}/index.html`)) {
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
    // The client's router owns every other GET path.
    app.get('/{*splat}', (_req, res) => {
      res.set('Cache-Control', 'no-cache').sendFile(`${clientDir}/index.html`);
    });
  }
  app.use(apiNotFound);
  app.use(errorHandler);
  const stopMailWorker =
    options.mailWorker === false
      ? () => undefined
      : startMailWorker(context.config, () => context.database.dataSource, context.logger);
  const stopCheckpoints =
    (options.dailyCheckpoints ?? context.config.NODE_ENV !== 'test')
      ? startDailyCheckpoints(
          context.config,
          () => context.database.dataSource,
          (error) => context.logger.error({ err: error }, 'the daily audit trail checkpoint failed'),
        )
      : () => undefined;
  const stopReminders =
    (options.reminders ?? context.config.NODE_ENV !== 'test')
      ? startReminderWorker(
          () => context.database.dataSource,
          (error) => context.logger.error({ err: error }, 'the consignee reminder run failed'),
        )
      : () => undefined;
  return Object.assign(app, {
    shutdown: async () => {
      stopMailWorker();
      stopCheckpoints();
      stopReminders();
      await authentication.close();
    },
  });
}
