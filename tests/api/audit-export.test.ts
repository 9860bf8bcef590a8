import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp } from '../helpers/test-app';
import { csrfTokenOf, SamlTestDriver } from '../helpers/saml-round-trip';
import { mailWithSubject } from '../helpers/mail-catcher';
import { readWitnessFile, witnessFilePath } from '../../server/src/modules/ledger/ledger-checkpoints';
import { verifyLedgerExport } from '../../server/src/modules/ledger/ledger-verification';

describe('the verifiable ledger export', () => {
  const running = createTestApp();
  let saml: SamlTestDriver;
  beforeAll(async () => {
    saml = await SamlTestDriver.create(running.config);
  });
  afterAll(() => running.close());
  const exports = async () =>
    Number(
      (
        await running.database.dataSource.query("SELECT COUNT(*) AS n FROM audit_event WHERE action = 'audit.exported'")
      )[0].n,
    );

  it(
    '[AUDIT-EXPORT-POST] when the bundle is asked for by GET or without the CSRF token, then nothing is ' +
      'exported or recorded; a POST with the token exports and records it',
    async () => {
      const { agent } = await saml.signIn(running.app, 'kiw-0401');
      const before = await exports();
      expect((await agent.get('/api/audit/export')).status).toBe(404);
      expect((await agent.post('/api/audit/export')).status).toBe(403);
      expect(await exports()).toBe(before);
      const exported = await agent.post('/api/audit/export').set('X-CSRF-Token', await csrfTokenOf(agent));
      expect(exported.status).toBe(200);
      expect(exported.headers['content-disposition']).toMatch(
        /^attachment; filename="?ingotrace-ledger-export-\d+\.json"?$/,
      );
      const bundle = JSON.parse(exported.text);
      expect(bundle).toMatchObject({
        format: 'ingotrace-ledger-export/2',
        keyId: expect.stringMatching(/^[0-9a-f]{16}$/),
        publicKey: expect.stringContaining('BEGIN PUBLIC KEY'),
      });
      expect(
        verifyLedgerExport(bundle, { publicKeyPem: (await agent.get('/api/audit/public-key')).body.publicKey }).ok,
      ).toBe(true);
      expect(await exports()).toBe(before + 1);
    },
  );

  it(
    '[LEDGER-WITNESS] when the ledger is exported, then its chain head is checkpointed to the witnesses outside ' +
      'the database: the quality mailbox and the checkpoints file',
    async () => {
      const { agent } = await saml.signIn(running.app, 'kiw-0401');
      const file = witnessFilePath(running.config);
      const lines = readWitnessFile(file).length;
      expect((await agent.post('/api/audit/export').set('X-CSRF-Token', await csrfTokenOf(agent))).status).toBe(200);
      const witnessed = readWitnessFile(file);
      expect(witnessed).toHaveLength(lines + 1);
      const checkpoint = witnessed.at(-1)!;
      expect(checkpoint).toMatchObject({
        reason: 'export',
        seq: expect.any(Number),
        hash: expect.stringMatching(/^[0-9a-f]{64}$/),
        signature: expect.any(String),
      });
      const [event] = await running.database.dataSource.query('SELECT hash FROM audit_event WHERE seq = ?', [
        checkpoint.seq,
      ]);
      expect(event.hash).toBe(checkpoint.hash);
      const mail = await mailWithSubject(
        running.config.MAIL_WEB_PORT,
        `Audit trail checkpoint: event ${checkpoint.seq}`,
      );
      expect(mail.to.map((to) => to.address)).toEqual([running.config.QUALITY_MAILBOX]);
      expect(mail.text).toContain(checkpoint.signature);
    },
  );
});
