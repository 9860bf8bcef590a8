import express from 'express';
import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { z } from 'zod';
import { errorResponseSchema } from '@shared/errors';
import { validate } from '../../server/src/middleware/validate';
import { errorHandler } from '../../server/src/middleware/error-handler';
import { AppError } from '../../server/src/errors';
import { createTestApp } from '../helpers/test-app';

describe('the one JSON error shape', () => {
  const running = createTestApp();
  afterAll(() => running.close());

  it('when an API route does not exist, then 404 NOT_FOUND names the method and path', async () => {
    const response = await request(running.app).get('/api/no-such-thing');
    expect(response.status).toBe(404);
    const body = errorResponseSchema.parse(response.body);
    expect(body.error).toMatchObject({ code: 'NOT_FOUND', message: 'No route for GET /no-such-thing' });
    expect(body.error.requestId).toBe(response.headers['x-request-id']);
  });

  it('when a non-GET request misses every route outside the API, then it is a JSON 404 too', async () => {
    const response = await request(running.app).post('/somewhere').send({});
    expect(response.status).toBe(404);
    expect(errorResponseSchema.parse(response.body).error.code).toBe('NOT_FOUND');
  });

  it('when the body is not valid JSON, then 400 INVALID_JSON', async () => {
    const response = await request(running.app)
      .post('/api/organisation')
      .set('Content-Type', 'application/json')
      .send('{"name": ');
    expect(response.status).toBe(400);
    expect(errorResponseSchema.parse(response.body).error).toMatchObject({
      code: 'INVALID_JSON',
      message: 'The request body is not valid JSON',
    });
  });

  it('when the body is larger than the limit, then 413 PAYLOAD_TOO_LARGE', async () => {
    const response = await request(running.app)
      .post('/api/organisation')
      .set('Content-Type', 'application/json')
      .send(JSON.stringify({ text: 'x'.repeat(1_100_000) }));
    expect(response.status).toBe(413);
    expect(errorResponseSchema.parse(response.body).error.code).toBe('PAYLOAD_TOO_LARGE');
  });

  it('when a proxy sends a well-formed request id, then it is kept and echoed', async () => {
    const response = await request(running.app).get('/api/nothing-here').set('X-Request-Id', 'proxy-1234-abcd');
    expect(response.headers['x-request-id']).toBe('proxy-1234-abcd');
  });
});

describe('the validate middleware with the error handler', () => {
  const app = express();
  app.use(express.json());
  app.post(
    '/heats/:heatId',
    validate({
      params: z.object({ heatId: z.coerce.number().int().positive() }),
      body: z.object({
        number: z.string().min(1, 'Heat number is required'),
        chemistry: z.object({ O: z.string().regex(/^\d+(\.\d+)?$/, 'Expected a decimal number') }),
      }),
    }),
    (_req, res) => res.json(res.locals.valid),
  );
  app.get('/rule', () => {
    throw AppError.rule('Bar from a quarantined heat cannot be issued', { barTag: 'Heat H-1 is quarantined' });
  });
  app.get('/boom', () => {
    throw new Error('secret internal detail');
  });
  app.use(errorHandler);

  it(
    '[INPUT-FIELDS] when several fields are wrong, then 400 ' + 'VALIDATION_FAILED lists each field with its message',
    async () => {
      const response = await request(app)
        .post('/heats/abc')
        .send({ number: '', chemistry: { O: '0,12' } });
      expect(response.status).toBe(400);
      const body = errorResponseSchema.parse(response.body);
      expect(body.error.code).toBe('VALIDATION_FAILED');
      expect(body.error.fields).toEqual({
        'params.heatId': expect.stringMatching(/number/i),
        number: 'Heat number is required',
        'chemistry.O': 'Expected a decimal number',
      });
    },
  );

  it('when the input is valid, then the handler receives the parsed values', async () => {
    const response = await request(app)
      .post('/heats/12')
      .send({ number: 'H-1', chemistry: { O: '0.12' } });
    expect(response.status).toBe(200);
    expect(response.body).toEqual({ params: { heatId: 12 }, body: { number: 'H-1', chemistry: { O: '0.12' } } });
  });

  it('[INPUT-RULES] when a service breaks a rule, then 422 RULE_VIOLATION with its fields', async () => {
    const response = await request(app).get('/rule');
    expect(response.status).toBe(422);
    expect(response.body).toEqual({
      error: {
        code: 'RULE_VIOLATION',
        message: 'Bar from a quarantined heat cannot be issued',
        fields: { barTag: 'Heat H-1 is quarantined' },
      },
    });
  });

  it('when something unexpected is thrown, then a bare 500 that does not leak the detail', async () => {
    const response = await request(app).get('/boom');
    expect(response.status).toBe(500);
    expect(response.body.error.code).toBe('INTERNAL');
    expect(JSON.stringify(response.body)).not.toContain('secret internal detail');
  });
});
