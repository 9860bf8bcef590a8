import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signatureStatement } from '@shared/domain/signatures';
import { signaturePreparationSchema, signatureSchema } from '@shared/schemas/signatures';
import { registerSignableRecordType } from '../../server/src/modules/signatures/signable-records';
import { createTestApp } from '../helpers/test-app';
import { csrfTokenOf, reauthenticate, SamlTestDriver } from '../helpers/saml-round-trip';
import { adminSql } from '../helpers/admin-sql';

// A record type for exercising the signing machinery on real rows: a person's own profile card,
// "authored" by that person. Product record types (heats, lots, releases) register the same way.
registerSignableRecordType({
  type: 'test-person-card',
  label: 'person card',
  action: 'system.read',
  readAction: 'system.read',
  meanings: ['reviewed', 'approved', 'rejected', 'withdrawn'],
  async load(manager, recordId) {
    const [row] = await manager.query('SELECT id, subject, name, email FROM person WHERE subject = ?', [recordId]);
    return row
      ? {
          title: `Card of ${row.name}`,
          content: { subject: row.subject, name: row.name, email: row.email },
          authorIds: [Number(row.id)],
        }
      : null;
  },
});

describe('electronic signatures', () => {
  const running = createTestApp();
  let saml: SamlTestDriver;
  beforeAll(async () => {
    saml = await SamlTestDriver.create(running.config);
  });
  afterAll(() => running.close());

  async function signedIn(subject: string) {
    const { agent } = await saml.signIn(running.app, subject);
    return { agent, csrf: await csrfTokenOf(agent) };
  }

  async function prepare(
    agent: Awaited<ReturnType<typeof signedIn>>['agent'],
    csrf: string,
    recordId: string,
    meaning: string,
  ) {
    const response = await agent
      .post('/api/signatures/preparations')
      .set('X-CSRF-Token', csrf)
      .send({ recordType: 'test-person-card', recordId, meaning });
    expect(response.status).toBe(200);
    return signaturePreparationSchema.parse(response.body);
  }

  /** Prepares, re-authenticates as the signer and submits one signature on a person card. */
  async function signCard(
    signer: { agent: Awaited<ReturnType<typeof signedIn>>['agent']; csrf: string },
    subject: string,
    recordId: string,
    meaning: string,
    extra: Record<string, unknown> = {},
  ) {
    // A refusal that does not depend on the password comes at preparation, before any password is asked.
    const prepared = await signer.agent
      .post('/api/signatures/preparations')
      .set('X-CSRF-Token', signer.csrf)
      .send({ recordType: 'test-person-card', recordId, meaning });
    if (prepared.status !== 200) return prepared;
    const preparation = signaturePreparationSchema.parse(prepared.body);
    return signer.agent
      .post('/api/signatures')
      .set('X-CSRF-Token', signer.csrf)
      .send({
        recordType: 'test-person-card',
        recordId,
        meaning,
        contentHash: preparation.contentHash,
        reauthenticationId: await reauthenticate(saml, signer.agent, subject, preparation.bindingHash),
        ...extra,
      });
  }

  it(
    '[SIG-MANIFESTATION] when a reviewer re-authenticates and signs, then the signature shows name, meaning and ' +
      'time with zone, bound to the content hash',
    async () => {
      const { agent, csrf } = await signedIn('kiw-0201');
      const preparation = await prepare(agent, csrf, 'kiw-0101', 'reviewed');
      expect(preparation.statement).toBe(signatureStatement);
      expect(preparation.content).toEqual({
        subject: 'kiw-0101',
        name: 'Maren Østby',
        email: 'maren.ostby@kestrelmoor.example',
      });
      // The hash is SHA-256 over the RFC 8785 canonical JSON (keys sorted) of what was shown.
      expect(preparation.contentHash).toBe(
        createHash('sha256')
          .update('{"email":"maren.ostby@kestrelmoor.example","name":"Maren Østby","subject":"kiw-0101"}')
          .digest('hex'),
      );
      const reauthenticationId = await reauthenticate(saml, agent, 'kiw-0201', preparation.bindingHash);
      const signed = await agent.post('/api/signatures').set('X-CSRF-Token', csrf).send({
        recordType: 'test-person-card',
        recordId: 'kiw-0101',
        meaning: 'reviewed',
        contentHash: preparation.contentHash,
        reauthenticationId,
      });
      expect(signed.status).toBe(201);
      const signature = signatureSchema.parse(signed.body);
      expect(signature.manifestation).toMatch(
        /^Aisling Ní Bhriain — Reviewed — \d{4}-\d{2}-\d{2} \d{2}:\d{2}:\d{2} (GMT|BST)$/,
      );
      // On the plant's clock (the demo plant is in Europe/London): GMT is UTC+0, BST UTC+1.
      const [, stamp, zone] = /— (\S+ \S+) (GMT|BST)$/.exec(signature.manifestation)!;
      const offsetHours = zone === 'BST' ? 1 : 0;
      expect(
        Math.abs(Date.parse(`${stamp!.replace(' ', 'T')}Z`) - offsetHours * 3600_000 - Date.parse(signature.signedAt)),
      ).toBeLessThan(1000);
      expect(signature).toMatchObject({
        signerRole: 'qa-reviewer',
        contentHash: preparation.contentHash,
        changedAfterSigning: false,
      });
      const [event] = await running.database.dataSource.query(
        "SELECT action, actor_name FROM audit_event WHERE action = 'signature.signed' ORDER BY seq DESC LIMIT 1",
      );
      expect(event).toEqual({ action: 'signature.signed', actor_name: 'Aisling Ní Bhriain' });

      // The same re-authentication cannot sign twice.
      const again = await agent.post('/api/signatures').set('X-CSRF-Token', csrf).send({
        recordType: 'test-person-card',
        recordId: 'kiw-0101',
        meaning: 'reviewed',
        contentHash: preparation.contentHash,
        reauthenticationId,
      });
      expect(again.status).toBe(422);
      expect(again.body.error.message).toBe('Sign again: the re-authentication was already used for a signature');
    },
  );

  it(
    '[SIG-CHANGED-AFTER] when the record changes after signing, then its signatures show "changed after ' + 'signing"',
    async () => {
      const { agent } = await signedIn('kiw-0201');
      const listed = async () =>
        (await agent.get('/api/signatures?recordType=test-person-card&recordId=kiw-0101')).body as Array<{
          changedAfterSigning: boolean;
        }>;
      expect((await listed()).map((item) => item.changedAfterSigning)).toEqual([false]);
      await adminSql("UPDATE person SET email = 'maren@changed.example' WHERE subject = 'kiw-0101'");
      try {
        expect((await listed()).map((item) => item.changedAfterSigning)).toEqual([true]);
      } finally {
        await adminSql("UPDATE person SET email = 'maren.ostby@kestrelmoor.example' WHERE subject = 'kiw-0101'");
      }
    },
  );

  it(
    '[SIG-REAUTH-REQUIRED] when someone signs without a fresh re-authentication, then it is refused and nothing ' +
      'is written',
    async () => {
      const { agent, csrf } = await signedIn('kiw-0301');
      const preparation = await prepare(agent, csrf, 'kiw-0102', 'approved');
      const count = async () =>
        Number((await running.database.dataSource.query('SELECT COUNT(*) AS n FROM electronic_signature'))[0].n);
      const before = await count();
      const response = await agent
        .post('/api/signatures')
        .set('X-CSRF-Token', csrf)
        .send({
          recordType: 'test-person-card',
          recordId: 'kiw-0102',
          meaning: 'approved',
          contentHash: preparation.contentHash,
          reauthenticationId: 'a'.repeat(32),
        });
      expect(response.status).toBe(422);
      expect(response.body.error.message).toBe('Sign again: no re-authentication of yours matches this signature');
      expect(await count()).toBe(before);
    },
  );

  it(
    '[SIG-REAUTH-MEANING] when the re-authentication was ' + 'for another meaning, then the signature is refused',
    async () => {
      const { agent, csrf } = await signedIn('kiw-0301');
      const approve = await prepare(agent, csrf, 'kiw-0102', 'approved');
      const reject = await prepare(agent, csrf, 'kiw-0102', 'rejected');
      const reauthenticationId = await reauthenticate(saml, agent, 'kiw-0301', approve.bindingHash);
      const response = await agent.post('/api/signatures').set('X-CSRF-Token', csrf).send({
        recordType: 'test-person-card',
        recordId: 'kiw-0102',
        meaning: 'rejected',
        reason: 'wrong e-mail',
        contentHash: reject.contentHash,
        reauthenticationId,
      });
      expect(response.status).toBe(422);
      expect(response.body.error.message).toBe('Sign again: the record changed after you re-authenticated');
    },
  );

  it('[SIG-SOD-AUTHOR] when the author of a record would review it, then separation of duties refuses', async () => {
    const response = await signCard(await signedIn('kiw-0201'), 'kiw-0201', 'kiw-0201', 'reviewed');
    expect(response.status).toBe(422);
    expect(response.body.error.message).toBe('You authored this record, so you cannot review it');
  });

  it(
    '[SIG-REFUSE-BEFORE-PASSWORD] when a signature would be refused whatever the password, then the preparation ' +
      'says so and no password is asked',
    async () => {
      const aisling = await signedIn('kiw-0201');
      const reauthentications = async () =>
        Number((await running.database.dataSource.query('SELECT COUNT(*) AS n FROM reauthentication'))[0].n);
      const before = await reauthentications();
      const prepared = await aisling.agent
        .post('/api/signatures/preparations')
        .set('X-CSRF-Token', aisling.csrf)
        .send({ recordType: 'test-person-card', recordId: 'kiw-0201', meaning: 'reviewed' });
      expect(prepared.status).toBe(422);
      expect(prepared.body.error).toMatchObject({
        message: 'You authored this record, so you cannot review it',
        fields: { meaning: 'Separation of duties' },
      });
      expect(await reauthentications()).toBe(before);
    },
  );

  it('[SIG-SOD-REVIEWER] when the reviewer would also approve, then separation of duties refuses', async () => {
    const chiara = await signedIn('kiw-0701');
    expect((await signCard(chiara, 'kiw-0701', 'kiw-0501', 'reviewed')).status).toBe(201);
    const approved = await signCard(chiara, 'kiw-0701', 'kiw-0501', 'approved');
    expect(approved.status).toBe(422);
    expect(approved.body.error.message).toBe('You reviewed this record, so someone else must approve it');
  });

  it('[SIG-REASON] when a rejection has no reason, then it is refused with the field named', async () => {
    const approver = await signedIn('kiw-0301');
    expect((await prepare(approver.agent, approver.csrf, 'kiw-0102', 'rejected')).reasonRequired).toBe(true);
    const response = await signCard(approver, 'kiw-0301', 'kiw-0102', 'rejected');
    expect(response.status).toBe(422);
    expect(response.body.error.fields).toEqual({ reason: 'A reason of at least 3 characters is required' });
  });

  it('when the record type or meaning is unknown, then the preparation says so', async () => {
    const { agent, csrf } = await signedIn('kiw-0301');
    const unknownType = await agent
      .post('/api/signatures/preparations')
      .set('X-CSRF-Token', csrf)
      .send({ recordType: 'nothing', recordId: '1', meaning: 'approved' });
    expect(unknownType.status).toBe(404);
    const wrongMeaning = await agent
      .post('/api/signatures/preparations')
      .set('X-CSRF-Token', csrf)
      .send({ recordType: 'ledger-review', recordId: '1', meaning: 'approved' });
    expect(wrongMeaning.status).toBe(422);
    expect(wrongMeaning.body.error.message).toBe('This audit-trail review cannot be signed as "approved"');
  });

  it(
    '[SIG-WITHDRAW] when a signer withdraws their signature, then it is a new signature naming the old one; ' +
      'nobody else may withdraw it',
    async () => {
      const approver = await signedIn('kiw-0301');
      const { agent } = approver;
      const approved = await signCard(approver, 'kiw-0301', 'kiw-0601', 'approved');
      expect(approved.status).toBe(201);

      const refused = await signCard(await signedIn('kiw-0201'), 'kiw-0201', 'kiw-0601', 'withdrawn', {
        reason: 'not mine to withdraw',
        withdrawsSignatureId: approved.body.id,
      });
      expect(refused.status).toBe(422);
      expect(refused.body.error.message).toBe('Only the signer can withdraw their signature');

      const withdrawn = await signCard(approver, 'kiw-0301', 'kiw-0601', 'withdrawn', {
        reason: 'Approved the wrong card',
        withdrawsSignatureId: approved.body.id,
      });
      expect(withdrawn.status).toBe(201);
      expect(withdrawn.body).toMatchObject({
        meaning: 'withdrawn',
        withdrawsSignatureId: approved.body.id,
        reason: 'Approved the wrong card',
      });
      const listed = (await agent.get('/api/signatures?recordType=test-person-card&recordId=kiw-0601')).body as Array<{
        meaning: string;
      }>;
      expect(listed.map((item) => item.meaning)).toEqual(['approved', 'withdrawn']);
    },
  );

  it(
    '[SIG-LIST-PERMISSION] when someone lists the signatures of a record type they may not read, then 403; an ' +
      'unknown type is 404',
    async () => {
      const engineer = await signedIn('kiw-0101');
      expect((await engineer.agent.get('/api/signatures?recordType=ledger-review&recordId=1')).status).toBe(403);
      expect((await engineer.agent.get('/api/signatures?recordType=role-change&recordId=1')).status).toBe(403);
      const administrator = await signedIn('kiw-0601');
      expect((await administrator.agent.get('/api/signatures?recordType=heat&recordId=1')).status).toBe(403);
      expect((await administrator.agent.get('/api/signatures?recordType=lot-release&recordId=1')).status).toBe(403);
      expect((await administrator.agent.get('/api/signatures?recordType=role-change&recordId=1')).status).toBe(200);
      expect((await engineer.agent.get('/api/signatures?recordType=heat&recordId=1')).status).toBe(200);
      expect((await engineer.agent.get('/api/signatures?recordType=no-such-type&recordId=1')).status).toBe(404);
    },
  );
});
