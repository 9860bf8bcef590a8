import { Router } from 'express';
import { signatureIntentSchema, signatureListQuerySchema, signatureRequestSchema } from '@shared/schemas/signatures';
import type { AppContext } from '../../app-context';
import { currentPerson, originOf, requireSignedIn } from '../../middleware/access';
import { validated } from '../../middleware/validate';
import { limitRate } from '../../middleware/rate-limits';
import { listSignatures, prepareSignature, signRecord } from './signatures.service';
import { signableRecordType } from './signable-records';
import { rolesAllow } from '@shared/auth/permissions';
import { AppError } from '../../errors';

/** Signing is open to every signed-in person; each record type then checks the signer's roles. */
export function signaturesRouter(context: AppContext): Router {
  const router = Router();
  const dataSource = () => context.database.dataSource;
  // Each signature begins with a preparation (and its password prompt); they are counted per person.
  const signing = limitRate({
    name: 'signing',
    limit: context.config.SIGNING_ATTEMPTS_PER_15_MIN,
    connect: () => context.database.connect(),
    key: 'person',
    message: (minutes) =>
      `Too many signatures begun in a short time; try again in ${minutes} minute${minutes === 1 ? '' : 's'}`,
    answer: 'json',
  });

  router.post(
    '/signatures/preparations',
    requireSignedIn(),
    signing,
    ...validated({ body: signatureIntentSchema }, async (input, req, res) => {
      res.json(await prepareSignature(dataSource(), currentPerson(req)!, input.body));
    }),
  );

  router.post(
    '/signatures',
    requireSignedIn(),
    ...validated({ body: signatureRequestSchema }, async (input, req, res) => {
      res.status(201).json(await signRecord(dataSource(), currentPerson(req)!, input.body, originOf(req)));
    }),
  );

  router.get(
    '/signatures',
    requireSignedIn(),
    ...validated({ query: signatureListQuerySchema }, async (input, req, res) => {
      const { recordType, recordId } = input.query;
      // Signatures are read with the right to read the record they sign, not by anyone signed in.
      const type = signableRecordType(recordType);
      if (!type) throw new AppError('NOT_FOUND', `Records of type ${recordType} are not signed`);
      if (!rolesAllow(currentPerson(req)!.roles, type.readAction))
        throw new AppError('FORBIDDEN', `Your roles do not allow reading ${type.label} signatures`);
      res.json(await listSignatures(dataSource(), recordType, recordId));
    }),
  );

  return router;
}
