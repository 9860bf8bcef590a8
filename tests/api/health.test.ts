import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { createTestApp } from '../helpers/test-app';
import { errorResponseSchema } from '@shared/errors';
import { healthSchema } from '@shared/schemas/health';

describe('GET /api/health', () => {
  const running = createTestApp();
  afterAll(() => running.close());

  it('when the database is reachable and migrated, then it answers ok with the server version', async () => {
    const response = await request(running.app).get('/api/health');
    expect(response.status).toBe(200);
    const body = healthSchema.parse(response.body);
    expect(body.status).toBe('ok');
    expect(body.database.server).toMatch(/MariaDB/);
    expect(response.headers['cache-control']).toBe('no-store');
  });

  it(
    '[HEALTH-DB-DOWN] when the database cannot be reached, then it answers 503 in the error shape with the ' + 'reason',
    async () => {
      // Port 9 (discard) has no MariaDB on this machine: the connection is refused for real.
      const unreachable = createTestApp({ DB_PORT: '9' });
      try {
        const response = await request(unreachable.app).get('/api/health');
        expect(response.status).toBe(503);
        const body = errorResponseSchema.parse(response.body);
        expect(body.error.code).toBe('SERVICE_UNAVAILABLE');
        expect(body.error.message).toMatch(/^Database unreachable: .*ECONNREFUSED/);
      } finally {
        await unreachable.close();
      }
    },
  );
});
