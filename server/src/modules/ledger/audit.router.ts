import { Router } from 'express';
import { stringify } from 'csv-stringify/sync';
import { ledgerQuerySchema } from '@shared/schemas/audit';
import type { AppContext } from '../../app-context';
import { inTransaction } from '../../db/transaction';
import { actorOf, originOf, requireAction } from '../../middleware/access';
import { validated } from '../../middleware/validate';
import { distinctActions, findEvents, matchingEvents } from './ledger-events.repository';
import { exportLedger, verifyLedger } from './ledger-verification';
import { checkpointLedger, readWitnessFile, witnessFilePath } from './ledger-checkpoints';
import { ledgerSigner } from './ledger-signing-key';
import { appendLedgerEvent } from './ledger.repository';

const CSV_LIMIT = 200_000;

/** The auditor's view of the ledger: browse, verify, export. */
export function auditRouter(context: AppContext): Router {
  const router = Router();
  const dataSource = () => context.database.dataSource;

  router.get(
    '/audit/events',
    requireAction('audit.read'),
    ...validated({ query: ledgerQuerySchema }, async (input, _req, res) => {
      const query = input.query;
      const { items, total } = await findEvents(dataSource().manager, query);
      res.json({ items, total, page: query.page, pageSize: query.pageSize });
    }),
  );

  router.get('/audit/actions', requireAction('audit.read'), async (_req, res) => {
    res.json(await distinctActions(dataSource().manager));
  });

  // The public key that verifies every event and checkpoint (also beside the key file and in every export).
  router.get('/audit/public-key', requireAction('audit.read'), (_req, res) => {
    const signer = ledgerSigner(context.config);
    res.json({ keyId: signer.keyId, publicKey: signer.publicKeyPem });
  });

  router.get('/audit/verification', requireAction('audit.read'), async (_req, res) => {
    res.set('Cache-Control', 'no-store').json(
      await verifyLedger(dataSource().manager, {
        publicKeyPem: ledgerSigner(context.config).publicKeyPem,
        checkpoints: readWitnessFile(witnessFilePath(context.config)),
      }),
    );
  });

  router.get(
    '/audit/events.csv',
    requireAction('audit.read'),
    ...validated({ query: ledgerQuerySchema }, async (input, req, res) => {
      const query = input.query;
      const rows: string[][] = [];
      for await (const event of matchingEvents(dataSource().manager, query)) {
        rows.push([
          String(event.seq),
          event.occurredAt,
          event.actor.name ?? '',
          event.actor.role ?? '',
          event.action,
          event.entity.type,
          event.entity.id ?? '',
          event.before === null ? '' : JSON.stringify(event.before),
          event.after === null ? '' : JSON.stringify(event.after),
          event.reason ?? '',
          event.requestId ?? '',
          event.clientAddress ?? '',
          event.previousHash,
          event.hash,
        ]);
        if (rows.length >= CSV_LIMIT) break;
      }
      await inTransaction(dataSource(), (manager) =>
        appendLedgerEvent(manager, {
          actor: actorOf(req, 'audit.read'),
          action: 'audit.exported',
          entity: { type: 'audit-ledger', id: null },
          after: { format: 'csv', filters: query, rows: rows.length },
          origin: originOf(req),
        }),
      );
      const header = [
        'seq',
        'occurred_at_utc',
        'actor',
        'role',
        'action',
        'entity_type',
        'entity_id',
        'before',
        'after',
        'reason',
        'request_id',
        'client_address',
        'previous_hash',
        'hash',
      ];
      res
        .type('text/csv; charset=utf-8')
        .attachment(`ingotrace-audit-ledger-${new Date().toISOString().slice(0, 10)}.csv`)
        // A BOM so that spreadsheet programs read the accented names correctly.
        .send(`\uFEFF${stringify([header, ...rows])}`);
    }),
  );

  // A POST: the export is recorded in the audit trail, so it changes state and carries the CSRF token.
  router.post('/audit/export', requireAction('audit.read'), async (req, res) => {
    const bundle = await exportLedger(dataSource());
    await inTransaction(dataSource(), (manager) =>
      appendLedgerEvent(manager, {
        actor: actorOf(req, 'audit.read'),
        action: 'audit.exported',
        entity: { type: 'audit-ledger', id: null },
        after: { format: 'bundle', chainHead: bundle.chainHead },
        origin: originOf(req),
      }),
    );
    // Every export is witnessed outside the database (mail to the quality mailbox and the checkpoints file).
    await checkpointLedger(dataSource(), context.config, 'export');
    res
      .type('application/json')
      .attachment(`ingotrace-ledger-export-${bundle.chainHead.seq}.json`)
      .send(JSON.stringify(bundle));
  });

  return router;
}
