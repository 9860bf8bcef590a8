import { spawnSync } from 'node:child_process';
import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { organisationSchema } from '@shared/schemas/organisation';
import { demoOrganisation } from '../../scripts/seed/demo-scenario';
import { createTestApp } from '../helpers/test-app';

function ingotrace(...args: string[]) {
  const result = spawnSync(process.execPath, ['bin/ingotrace.mjs', ...args], { encoding: 'utf8', env: process.env });
  return { code: result.status, stdout: result.stdout, stderr: result.stderr };
}

describe('GET /api/organisation', () => {
  const running = createTestApp();
  afterAll(() => running.close());

  it('when the demo scenario is seeded, then it returns the invented firm with its time zone', async () => {
    const response = await request(running.app).get('/api/organisation');
    expect(response.status).toBe(200);
    expect(organisationSchema.parse(response.body)).toEqual(demoOrganisation);
    expect(response.body.timeZone).toBe('Europe/London');
  });

  it(
    "when the plant's time zone is set from the command line, then only an IANA name is taken and the change is " +
      'an audit trail event',
    async () => {
      const refused = ingotrace('organisation', 'time-zone', '+01:00', '--reason', 'Moved');
      expect(refused.code).toBe(2);
      expect(refused.stderr).toContain('+01:00 is not an IANA time zone name');
      expect(ingotrace('organisation', 'time-zone', 'Europe/Tarnbridge', '--reason', 'Moved').code).toBe(2);
      expect(ingotrace('organisation', 'time-zone', 'America/Chicago', '--reason', 'x').code).toBe(2);
      try {
        const moved = ingotrace(
          'organisation',
          'time-zone',
          'America/Chicago',
          '--reason',
          'Line moved to the second site',
        );
        expect(moved.code).toBe(0);
        expect(moved.stdout).toContain("the plant's time zone is now America/Chicago (was Europe/London)");
        expect((await request(running.app).get('/api/organisation')).body.timeZone).toBe('America/Chicago');
        const [event] = await running.database.dataSource.query(
          'SELECT before_json, after_json, reason FROM audit_event WHERE action = ' +
            "'organisation.setting-changed' ORDER BY seq DESC LIMIT 1",
        );
        expect([JSON.parse(event.before_json), JSON.parse(event.after_json), event.reason]).toEqual([
          { timeZone: 'Europe/London' },
          { timeZone: 'America/Chicago' },
          'Line moved to the second site',
        ]);
      } finally {
        expect(ingotrace('organisation', 'time-zone', 'Europe/London', '--reason', 'Back after the test').code).toBe(0);
      }
    },
  );
});
