// Every signature the demo seed makes must still match the record it signed once the whole
// scenario is built: later steps of the seed (rules set after the history, drills, releases)
// must not change what earlier signatures signed.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seededReauthenticationPurpose } from '../../scripts/seed/demo-signature';
import { createTestApp } from '../helpers/test-app';
import { csrfTokenOf, SamlTestDriver } from '../helpers/saml-round-trip';

describe('the demo scenario’s signatures', () => {
  const running = createTestApp();
  let agent: Awaited<ReturnType<SamlTestDriver['signIn']>>['agent'];

  beforeAll(async () => {
    const saml = await SamlTestDriver.create(running.config);
    agent = (await saml.signIn(running.app, 'kiw-0401')).agent;
    await csrfTokenOf(agent);
  });
  afterAll(() => running.close());

  it(
    '[SIG-DEMO-INTACT] when the scenario is seeded, then no seeded signature shows its record changed after ' +
      'signing',
    async () => {
      const records: Array<{ record_type: string; record_id: string }> = await running.database.dataSource.query(
        `SELECT DISTINCT s.record_type, s.record_id FROM electronic_signature s JOIN reauthentication r ON r.id =
          s.reauthentication_id
        WHERE r.purpose = ? AND s.record_type IN ('heat', 'lot-release', 'recall-investigation',
          'specification-draft', 'heat-mixing', 'nonconformance', 'lot-hold')`,
        [seededReauthenticationPurpose],
      );
      expect(records.length).toBeGreaterThan(20);
      const changed: string[] = [];
      for (const record of records) {
        const signatures = (
          await agent.get(`/api/signatures?recordType=${record.record_type}&recordId=${record.record_id}`)
        ).body as Array<{ manifestation: string; changedAfterSigning: boolean }>;
        for (const signature of signatures)
          if (signature.changedAfterSigning)
            changed.push(`${record.record_type} ${record.record_id}: ${signature.manifestation}`);
      }
      expect(changed).toEqual([]);
    },
  );
});
