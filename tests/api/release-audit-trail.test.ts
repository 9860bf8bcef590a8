// The audit-trail review at release: the dossier view lists the lot's ledger events, the
// reviewer's signature records how far it covered them, and a later event voids the review.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inTransaction } from '../../server/src/db/transaction';
import { appendLedgerEvent } from '../../server/src/modules/ledger/ledger.repository';
import { createTestApp } from '../helpers/test-app';
import { csrfTokenOf, reauthenticate, SamlTestDriver } from '../helpers/saml-round-trip';
import { signThroughApi } from '../helpers/signing';

type Agent = Awaited<ReturnType<SamlTestDriver['signIn']>>['agent'];

describe('the release review covers the lot’s audit trail', () => {
  const running = createTestApp();
  let saml: SamlTestDriver;
  const people = {} as Record<'reviewer' | 'approver', { agent: Agent; csrf: string; subject: string }>;
  let lotId: number;

  beforeAll(async () => {
    saml = await SamlTestDriver.create(running.config);
    for (const [name, subject] of [
      ['reviewer', 'kiw-0201'],
      ['approver', 'kiw-0301'],
    ] as const) {
      const { agent } = await saml.signIn(running.app, subject);
      people[name] = { agent, csrf: await csrfTokenOf(agent), subject };
    }
    // A lot of the demo that waits for approval, reviewed by the seeded signature (test-made lots come later).
    const [lot] = await (
      await running.database.connect()
    ).query("SELECT id FROM production_lot WHERE status = 'reviewed' ORDER BY id LIMIT 1");
    lotId = lot.id;
  });
  afterAll(() => running.close());

  const view = async () => (await people.reviewer.agent.get(`/api/lots/${lotId}/release`)).body;
  const sign = (who: 'reviewer' | 'approver', meaning: string) =>
    signThroughApi(saml, people[who], { recordType: 'lot-release', recordId: String(lotId), meaning });

  it(
    '[TRAIL-REVIEW] when a lot has been reviewed, then its view lists the trail and the review recorded how far ' +
      'it went',
    async () => {
      const { auditTrail } = await view();
      const actions = auditTrail.events.map((event: { action: string }) => event.action);
      expect(actions).toContain('lot.opened');
      expect(actions).toContain('lot.submitted-for-release');
      expect(actions).not.toContain('lot.reviewed');
      expect(auditTrail.reviewedThroughSeq).toBe(auditTrail.events.at(-1).seq);
      expect(auditTrail.afterReview).toEqual([]);
      const [review] = await (
        await running.database.connect()
      ).query(
        "SELECT after_json FROM audit_event WHERE action = 'lot.reviewed' AND entity_type = 'lot' AND entity_id " +
          '= ? ORDER BY seq DESC LIMIT 1',
        [String(lotId)],
      );
      expect(JSON.parse(review.after_json).auditTrail).toEqual({
        events: auditTrail.events.length,
        throughSeq: auditTrail.reviewedThroughSeq,
      });
    },
  );

  it(
    'when a lot was split from another, then the trail holds the parent’s history up to the split, not the ' +
      'parent’s later events',
    async () => {
      const [child] = await (
        await running.database.connect()
      ).query("SELECT id, lot_number FROM production_lot WHERE origin = 'split' ORDER BY id LIMIT 1");
      const { auditTrail } = (await people.reviewer.agent.get(`/api/lots/${child.id}/release`)).body;
      const own = auditTrail.events.filter((event: { lot: string }) => event.lot === child.lot_number);
      const inherited = auditTrail.events.filter((event: { lot: string }) => event.lot !== child.lot_number);
      expect(own.length).toBeGreaterThan(0);
      expect(inherited.map((event: { action: string }) => event.action)).toContain('lot.split');
      const began = Math.min(...own.map((event: { seq: number }) => event.seq));
      expect(inherited.every((event: { seq: number }) => event.seq < began)).toBe(true);
    },
  );

  it(
    '[TRAIL-VOID] when an event reaches the lot after the review or while the reviewer signs, then the ' +
      'signature is refused until the lot is reviewed again',
    async () => {
      await inTransaction(running.database.dataSource, (manager) =>
        appendLedgerEvent(manager, {
          actor: { id: null, name: 'test administrator', role: null },
          action: 'lot.note-added',
          entity: { type: 'lot', id: lotId },
          after: { note: 'corrected a typing error' },
        }),
      );
      const { auditTrail } = await view();
      expect(auditTrail.afterReview.map((event: { action: string }) => event.action)).toEqual(['lot.note-added']);
      const refused = await sign('approver', 'approved-for-release');
      expect(refused.status).toBe(422);
      expect(refused.body.error.message).toMatch(
        /^The lot's audit trail has 1 event\(s\) after the review \(#\d+ lot\.note-added by test administrator\); it must be reviewed again$/,
      );

      // An event that arrives while the reviewer's signing dialog is open refuses the review.
      const intent = { recordType: 'lot-release', recordId: String(lotId), meaning: 'reviewed' };
      const { reviewer } = people;
      const preparation = (
        await reviewer.agent.post('/api/signatures/preparations').set('X-CSRF-Token', reviewer.csrf).send(intent)
      ).body;
      expect(preparation.trailThroughSeq).toBe((await view()).auditTrail.events.at(-1).seq);
      expect(preparation.trailEvents).toBe((await view()).auditTrail.events.length);
      await inTransaction(running.database.dataSource, (manager) =>
        appendLedgerEvent(manager, {
          actor: { id: null, name: 'test administrator', role: null },
          action: 'lot.note-added',
          entity: { type: 'lot', id: lotId },
          after: { note: 'a second correction' },
        }),
      );
      const late = await reviewer.agent
        .post('/api/signatures')
        .set('X-CSRF-Token', reviewer.csrf)
        .send({
          ...intent,
          contentHash: preparation.contentHash,
          trailThroughSeq: preparation.trailThroughSeq,
          reauthenticationId: await reauthenticate(saml, reviewer.agent, reviewer.subject, preparation.bindingHash),
        });
      expect(late.status).toBe(422);
      expect(late.body.error.message).toMatch(
        /^The audit trail gained events while you were signing \(now through event #\d+, you were shown through #\d+\); review them and sign anew$/,
      );
      expect(late.body.error.fields).toEqual({ trailThroughSeq: 'Outdated' });
      // Without the mark, the signature is refused too.
      const unmarked = await reviewer.agent
        .post('/api/signatures')
        .set('X-CSRF-Token', reviewer.csrf)
        .send({
          ...intent,
          contentHash: preparation.contentHash,
          reauthenticationId: await reauthenticate(saml, reviewer.agent, reviewer.subject, preparation.bindingHash),
        });
      expect(unmarked.status).toBe(422);

      expect((await sign('reviewer', 'reviewed')).status).toBe(201);
      expect((await view()).auditTrail.afterReview).toEqual([]);
      expect((await sign('approver', 'approved-for-release')).status).toBe(201);
      expect((await view()).status).toBe('released');
    },
  );
});
