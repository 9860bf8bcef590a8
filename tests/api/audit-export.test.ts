import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp } from '../helpers/test-app';
import { csrfTokenOf, SamlTestDriver } from '../helpers/saml-round-trip';

describe('the verifiable ledger export', () => {
  const running = createTestApp();
  let saml: SamlTestDriver;
  beforeAll(async () => {
    saml = await SamlTestDriver.create(running.config);
  });
  afterAll(() => running.close());
  const exports = async () => Number((await running.database.dataSource.query("SELECT COUNT(*) AS n FROM audit_event WHERE action = 'audit.exported'"))[0].n);

  it('[AUDIT-EXPORT-POST] when the bundle is asked for by GET or without the CSRF token, then nothing is exported or recorded; a POST with the token exports and records it', async () => {
    const { agent } = await saml.signIn(running.app, 'kiw-0401');
    const before = await exports();
    expect((await agent.get('/api/audit/export')).status).toBe(404);
    expect((await agent.post('/api/audit/export')).status).toBe(403);
    expect(await exports()).toBe(before);
    const exported = await agent.post('/api/audit/export').set('X-CSRF-Token', await csrfTokenOf(agent));
    expect(exported.status).toBe(200);
    expect(exported.headers['content-disposition']).toMatch(/^attachment; filename="?ingotrace-ledger-export-\d+\.json"?$/);
    expect(JSON.parse(exported.text)).toHaveProperty('chainHead');
    expect(await exports()).toBe(before + 1);
  });
});
