import { Router } from 'express';
import { idParams } from '@shared/schemas/manufacturing';
import { labelMovementSchema, labelSheetQuerySchema, releaseQueueQuerySchema } from '@shared/schemas/release';
import { lotLabelsPdf } from './lot-labels';
import { z } from 'zod';

const packetQuerySchema = z.object({ view: z.enum(['inline']).optional() });
import type { AppContext } from '../../app-context';
import { actorOf, currentPerson, originOf, requireAction } from '../../middleware/access';
import { validated } from '../../middleware/validate';
import { recordLabels, releasePacket, releaseQueue, releaseView, submitForRelease } from './release.service';

/** The release desk: queues, a lot's checklist and dossier, submission and label counts. */
export function releaseRouter(context: AppContext): Router {
  const router = Router();
  const data = () => context.database.dataSource;

  router.get(
    '/release-queue',
    requireAction('release.read'),
    ...validated({ query: releaseQueueQuerySchema }, async (input, _req, res) => {
      res.json(await releaseQueue(data(), input.query));
    }),
  );
  router.get(
    '/lots/:lotId/release',
    requireAction('release.read'),
    ...validated({ params: idParams('lotId') }, async (input, _req, res) => {
      res.json(await releaseView(data(), input.params.lotId));
    }),
  );
  router.post(
    '/lots/:lotId/release-submissions',
    requireAction('release.submit'),
    ...validated({ params: idParams('lotId') }, async (input, req, res) => {
      res
        .status(201)
        .json(
          await submitForRelease(
            data(),
            input.params.lotId,
            currentPerson(req)!,
            actorOf(req, 'release.submit'),
            originOf(req),
          ),
        );
    }),
  );
  router.post(
    '/lots/:lotId/labels',
    requireAction('labels.print'),
    ...validated({ params: idParams('lotId'), body: labelMovementSchema }, async (input, req, res) => {
      res
        .status(201)
        .json(
          await recordLabels(
            data(),
            input.params.lotId,
            input.body,
            currentPerson(req)!,
            actorOf(req, 'labels.print'),
            originOf(req),
          ),
        );
    }),
  );
  router.get(
    '/lots/:lotId/labels.pdf',
    requireAction('labels.print'),
    ...validated({ params: idParams('lotId'), query: labelSheetQuerySchema }, async (input, _req, res) => {
      const labels = await lotLabelsPdf(data(), input.params.lotId, input.query);
      res
        .type('application/pdf')
        .set('X-Content-Type-Options', 'nosniff')
        .attachment(`labels-${labels.lotNumber}.pdf`)
        .send(labels.pdf);
    }),
  );
  router.get(
    '/lots/:lotId/release-packet',
    requireAction('release.read'),
    ...validated({ params: idParams('lotId'), query: packetQuerySchema }, async (input, _req, res) => {
      const packet = await releasePacket(data(), input.params.lotId, context.config.PUBLIC_URL);
      const { view } = input.query;
      const name = `release-packet-${packet.lotNumber.replace(/[^A-Za-z0-9._-]/g, '_')}.pdf`;
      res
        .type('application/pdf')
        .set('X-Content-Type-Options', 'nosniff')
        .set('Digest', `sha-256=${Buffer.from(packet.sha256, 'hex').toString('base64')}`)
        .set('X-Packet-SHA256', packet.sha256)
        // ?view=inline opens it in the browser's own PDF viewer (a preview); otherwise it downloads.
        .set('Content-Disposition', `${view === 'inline' ? 'inline' : 'attachment'}; filename="${name}"`)
        .send(packet.content);
    }),
  );
  return router;
}
