import { once } from 'node:events';
import type { AddressInfo } from 'node:net';
import type { Express } from 'express';
import fc from 'fast-check';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { permissionMatrix } from '@shared/auth/permissions';
import { roles, type Role } from '@shared/auth/roles';
import { errorResponseSchema } from '@shared/errors';
import { verifyLedger } from '../../server/src/modules/ledger/ledger-verification';
import { createTestApp } from '../helpers/test-app';
import { bySingleRole, SamlTestDriver, signInPeople } from '../helpers/saml-round-trip';
import { routeTable, type RegisteredRoute } from '../helpers/route-table';

type Agent = Awaited<ReturnType<SamlTestDriver['signIn']>>['agent'];

// Generated inputs per route: a sample in `npm test`; `npm run test:fuzz` sets FUZZ_RUNS=10000.
const runs = Number(process.env.FUZZ_RUNS ?? 12);
// Each route's inputs are sent by this many property runs at once (each with its own seed, which
// a failure reports), against one listening server: the long run takes minutes, not hours.
const lanes = Math.max(1, Math.min(runs, Number(process.env.FUZZ_LANES ?? 4)));

// Strings that have broken web applications before (common practice, no source): SQL and
// template metacharacters, path traversal, NUL, markup, numbers out of range, very long text.
const nasty = fc.constantFrom(
  "' OR '1'='1",
  '"; DROP TABLE production_lot; --',
  '1; SELECT SLEEP(5)',
  '%',
  '_',
  '\\',
  '../../../../etc/passwd',
  '..%2f..%2fetc%2fpasswd',
  '\u0000',
  '<script>alert(1)</script>',
  '{{7*7}}${7*7}',
  '😀🧪',
  '-1',
  '0',
  '1e309',
  'NaN',
  '9'.repeat(40),
  '0x1F',
  ' ',
  '',
  'x'.repeat(5000),
  '2026-02-30',
  'true',
  'null',
);
const hostileString = fc.oneof(
  nasty,
  fc.string({ maxLength: 60 }),
  fc.string({ unit: 'grapheme', maxLength: 20 }),
  fc.integer().map(String),
);
const fieldNames = fc.constantFrom(
  'name',
  'reason',
  'roles',
  'active',
  'lotIds',
  'quantities',
  'partId',
  'plannedQty',
  'tag',
  'lengthMm',
  'heatId',
  'heatNumber',
  'supplierId',
  'specId',
  'grade',
  'chemistry',
  'mechanical',
  'approval',
  'country',
  'meaning',
  'recordType',
  'recordId',
  'reauthenticationId',
  'trigger',
  'mode',
  'qty',
  'consigneeId',
  'documentNumber',
  'shippedOn',
  'stepNo',
  'qtyIn',
  'qtyGood',
  'qtyScrap',
  'operatorName',
  'workCentre',
  'startedAt',
  'endedAt',
  'parameters',
  'kind',
  'methodId',
  'equipment',
  'runAt',
  'gtin',
  'lotPattern',
  'revision',
  'description',
  'partNumber',
  'unitLengthMm',
  'cutoffAllowanceMm',
  'specifications',
  'routing',
  'pieces',
  'diameterMm',
  'location',
  'page',
  'pageSize',
  'q',
  'status',
  'from',
  'to',
  'lot',
  'udi',
  'pieceId',
  'runId',
  'disposition',
  'values',
  'decision',
  'labels',
  'count',
  'reasonCode',
  '__proto__',
  'constructor',
);
const hostileValue = fc.oneof(hostileString, fc.jsonValue({ maxDepth: 2 }), fc.array(hostileString, { maxLength: 3 }));
const body = fc.oneof(
  fc.dictionary(fieldNames, hostileValue, { maxKeys: 6 }),
  fc.jsonValue({ maxDepth: 3 }),
  fc.constant(undefined),
  // Not JSON at all, sent as JSON.
  fc.constantFrom('{', '{"a":', '[1,2', 'nul', '"\\ud800"', '{"a":1}{"b":2}').map((text) => ({ raw: text })),
);
const query = fc.dictionary(fieldNames, fc.oneof(hostileString, fc.array(hostileString, { maxLength: 3 })), {
  maxKeys: 4,
});

/** One role that may call the route (none for public routes). */
function callerFor(route: RegisteredRoute): Role | null {
  if (!route.access || route.access.kind === 'public') return null;
  if (route.access.kind === 'signed-in') return 'auditor';
  const action = route.access.action;
  return roles.find((role) => permissionMatrix[role].includes(action)) ?? null;
}

describe('hostile input on every API route', () => {
  const running = createTestApp();
  // FUZZ_ROUTES (a regular expression on "METHOD /path") narrows a long run to some routes.
  const only = process.env.FUZZ_ROUTES ? new RegExp(process.env.FUZZ_ROUTES) : null;
  const apiRoutes = routeTable(running.app).filter(
    (route) => route.path.startsWith('/api/') && (!only || only.test(`${route.method} ${route.path}`)),
  );
  let agents: Record<Role, { agent: Agent; csrf: string }>;
  const server = running.app.listen(0, '127.0.0.1');
  let base = '';
  let inputs = 0;
  // State-changing calls that were accepted: random input that happened to be valid.
  const accepted: string[] = [];

  beforeAll(async () => {
    if (!server.listening) await once(server, 'listening');
    base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    agents = await signInPeople(await SamlTestDriver.create(running.config), base as unknown as Express, bySingleRole);
  });
  afterAll(async () => {
    server.close();
    await running.close();
  });

  it.each(apiRoutes.map((route) => [`${route.method} ${route.path}`, route] as const))(
    '%s: never a 500, always the one error shape',
    async (_name, route) => {
      const role = callerFor(route);
      const caller = role ? agents[role] : null;
      const parameterNames = [...route.path.matchAll(/:([A-Za-z]+)/g)].map((match) => match[1]!);
      const property = fc.asyncProperty(
        fc.array(hostileString, { minLength: parameterNames.length, maxLength: parameterNames.length }),
        query,
        body,
        async (parameters, search, payload) => {
          const path = parameterNames.reduce(
            (built, name, index) => built.replace(`:${name}`, encodeURIComponent(parameters[index]!) || '%20'),
            route.path,
          );
          const target = caller ? caller.agent : request(base);
          let call = target[route.method.toLowerCase() as 'get' | 'post' | 'put' | 'delete'](path).query(search);
          if (caller && route.method !== 'GET') call = call.set('X-CSRF-Token', caller.csrf);
          const raw =
            payload && typeof payload === 'object' && 'raw' in payload && Object.keys(payload).length === 1
              ? String((payload as { raw: string }).raw)
              : JSON.stringify(payload);
          const response = await (route.method === 'GET' || payload === undefined
            ? call
            : call.set('Content-Type', 'application/json').send(raw));
          inputs += 1;
          if (route.method !== 'GET' && response.status < 300)
            accepted.push(`${route.method} ${path} ${raw?.slice(0, 200)} → ${response.status}`);
          const context =
            `${route.method} ${path}?${new URLSearchParams(search as Record<string, string>)} ` +
            `${JSON.stringify(payload)?.slice(0, 300)} → ${response.status} ` +
            `${JSON.stringify(response.body).slice(0, 300)}`;
          expect(response.status, context).toBeLessThan(500);
          if (response.status >= 400) expect(errorResponseSchema.safeParse(response.body).success, context).toBe(true);
        },
      );
      const seed = Number(process.env.FUZZ_SEED ?? Date.now() % 2 ** 31);
      const before = inputs;
      const started = Date.now();
      await Promise.all(
        Array.from({ length: lanes }, (_unused, lane) =>
          fc.assert(property, { numRuns: Math.ceil(runs / lanes), seed: seed + lane }),
        ),
      );
      // One line per route, so that a long run shows how far it has come.
      if (runs >= 1000)
        console.log(
          `hostile input: ${route.method} ${route.path}: ${inputs - before} inputs, no 500, in ` +
            `${Math.round((Date.now() - started) / 1000)} s (seed ${seed})`,
        );
    },
    Math.max(60_000, runs * 1_000),
  );

  it('[FUZZ-LEDGER] when every route has been fed hostile input, then the audit ledger still verifies', async () => {
    const verification = await verifyLedger(running.database.dataSource.manager);
    expect(verification.ok, verification.summary).toBe(true);
    expect(inputs).toBeGreaterThanOrEqual(apiRoutes.length * runs);
    console.log(
      `hostile input: ${inputs} inputs, ${accepted.length} state-changing calls accepted\n${accepted.join('\n')}`,
    );
  });
});
