import { lotOfGtin } from './trace-starts.repository';
import { Router, type RequestHandler, type Response } from 'express';
import { rolesAllow } from '@shared/auth/permissions';
import { gtinProblem, lotNumberProblem } from '@shared/domain/gs1/gtin';
import type { AppContext } from '../../app-context';
import { allowPublic, currentPerson } from '../../middleware/access';

const escapeHtml = (text: string) => text.replace(/[&<>"']/g, (character) => `&#${character.charCodeAt(0)};`);

function notFoundPage(res: Response, title: string, detail: string): void {
  res
    .status(404)
    .type('html')
    .send(
      `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${escapeHtml(title)} · ` +
        `Ingotrace</title></head>` +
        (`<body><main><h1>${escapeHtml(title)}</h1><p>${escapeHtml(detail)}</p><p><a href="/">Go to ` +
          `Ingotrace</a></p></main></body></html>`),
    );
}

/**
 * GS1 Digital Link resolver: /01/{gtin}/10/{lot}[/21/{serial}] opens that lot's page (the QR on
 * every release packet points here; a person who may trace but not read lots gets its trace). A person who is not
 * signed in is sent to sign
 * in first, so lot numbers are not disclosed to anyone who scans a label.
 */
export function digitalLinkRouter(context: AppContext, sessionHandlers: RequestHandler[]): Router {
  const router = Router();
  const resolve: RequestHandler = async (req, res) => {
    const { gtin, lot, serial } = req.params as { gtin: string; lot: string; serial?: string };
    const problem = gtinProblem(gtin) ?? lotNumberProblem(lot);
    if (problem) return notFoundPage(res, 'Not a valid GS1 Digital Link', `${problem}.`);
    const person = currentPerson(req);
    if (!person) return res.redirect(302, `/sign-in?returnTo=${encodeURIComponent(req.originalUrl)}`);
    if (!rolesAllow(person.roles, 'trace.read'))
      return notFoundPage(res, 'Not permitted', 'Your roles do not include tracing lots.');
    const row = await lotOfGtin(context.database.dataSource.manager, gtin.padStart(14, '0'), lot);
    if (!row) return notFoundPage(res, 'No such lot', `No lot ${lot} of GTIN ${gtin} is recorded in this Ingotrace.`);
    if (rolesAllow(person.roles, 'lots.read')) return res.redirect(302, `/lots/${row.id}`);
    // The lot's trace page, started from the same key the label carries (GTIN + lot is unique; a lot number alone need
    // not be).
    const udi = `(01)${gtin.padStart(14, '0')}(10)${lot}${serial ? `(21)${serial}` : ''}`;
    res.redirect(302, `/trace?q=${encodeURIComponent(udi)}`);
  };
  router.get('/01/:gtin/10/:lot', allowPublic(), ...sessionHandlers, resolve);
  router.get('/01/:gtin/10/:lot/21/:serial', allowPublic(), ...sessionHandlers, resolve);
  return router;
}
