import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { organisationSchema } from '@shared/schemas/organisation';
import { demoOrganisation } from '../../scripts/seed/demo-scenario';
import { createTestApp } from '../helpers/test-app';

describe('GET /api/organisation', () => {
  const running = createTestApp();
  afterAll(() => running.close());

  it('when the demo scenario is seeded, then it returns the invented firm', async () => {
    const response = await request(running.app).get('/api/organisation');
    expect(response.status).toBe(200);
    expect(organisationSchema.parse(response.body)).toEqual(demoOrganisation);
  });
});
