import { Router } from 'express';
import { idParams } from '@shared/schemas/manufacturing';
import {
  labelMovementSchema,
  labelSheetQuerySchema,
  releaseQueueQuerySchema,
  type LabelSheetQuery,
  type ReleaseQueueQuery,
} from '@shared/schemas/release';
import { lotLabelsPdf } from './lot-labels';
import { z } from 'zod';

const packetQuerySchema = z.object({ view: z.enum(['inline']).optional() });
import type { AppContext } from '../../app-context';
import { actorOf, currentPerson, originOf, requireAction } from '../../middleware/access';
import { validate } from '../../middleware/validate';
import { recordLabels, releasePacket, releaseQueue, releaseView, submitForRelease } from './release.service';

/** The release desk: queues, a lot's checklist and dossier, submission and label counts. */
export function releaseRouter(context: AppContext): Router {
  const router = Router();
  const data = () => context.database.dataSource;
  const lotId = (res: { locals: Record<string, unknown> }) =>
    (res.locals.valid as { params: { lotId: number } }).params.lotId;

  router.get(
    '/release-queue',
    requireAction('release.read'),
    validate({ query: releaseQueueQuerySchema }),
    async (_req, res) => {
      res.json(await releaseQueue(data(), (res.locals.valid as { query: ReleaseQueueQuery }).query));
    },
  );
  router.get(
    '/lots/:lotId/release',
    requireAction('release.read'),
    validate({ params: idParams('lotId') }),
    async (_req, res) => {
      res.json(await releaseView(data(), lotId(res)));
    },
  );
  router.post(
    '/lots/:lotId/release-submissions',
    requireAction('release.submit'),
    validate({ params: idParams('lotId') }),
    async (req, res) => {
      res
        .status(201)
        .json(
          await submitForRelease(
            data(),
            lotId(res),
            currentPerson(req)!,
            actorOf(req, 'release.submit'),
            originOf(req),
          ),
        );
    },
  );
  router.post(
    '/lots/:lotId/labels',
    requireAction('labels.print'),
    validate({ params: idParams('lotId'), body: labelMovementSchema }),
    async (req, res) => {
      res
        .status(201)
        .json(
          await recordLabels(
            data(),
            lotId(res),
            req.body,
            currentPerson(req)!,
            actorOf(req, 'labels.print'),
            originOf(req),
          ),
        );
    },
  );
  router.get(
    '/lots/:lotId/labels.pdf',
    requireAction('labels.print'),
    validate({ params: idParams('lotId'), query: labelSheetQuerySchema }),
    async (_req, res) => {
      const labels = await lotLabelsPdf(data(), lotId(res), (res.locals.valid as { query: LabelSheetQuery }).query);
      res
        .type('application/pdf')
        .set('X-Content-Type-Options', 'nosniff')
        .attachment(`labels-${labels.lotNumber}.pdf`)
        .send(labels.pdf);
    },
  );
  router.get(
    '/lots/:lotId/release-packet',
    requireAction('release.read'),
    validate({ params: idParams('lotId'), query: packetQuerySchema }),
    async (_req, res) => {
      const packet = await releasePacket(data(), lotId(res), context.config.PUBLIC_URL);
      const { view } = (res.locals.valid as { query: { view?: 'inline' } }).query;
      const name = `release-packet-${packet.lotNumber.replace(/[^A-Za-z0-9._-]/g, '_')}.pdf`;
      res
        .type('application/pdf')
        .set('X-Content-Type-Options', 'nosniff')
        .set('Digest', `sha-256=${Buffer.from(packet.sha256, 'hex').toString('base64')}`)
        .set('X-Packet-SHA256', packet.sha256)
        // ?view=inline opens it in the browser's own PDF viewer (a preview); otherwise it downloads.
        .set('Content-Disposition', `${view === 'inline' ? 'inline' : 'attachment'}; filename="${name}"`)
        .send(packet.content);
    },
  );
  return router;
}
