import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { actions, permissionMatrix } from '@shared/auth/permissions';
import { roles, type Role } from '@shared/auth/roles';
import { createTestApp } from '../helpers/test-app';
import { bySingleRole, SamlTestDriver, signInPeople } from '../helpers/saml-round-trip';
import { routeTable } from '../helpers/route-table';

type Agent = Awaited<ReturnType<SamlTestDriver['signIn']>>['agent'];

// Ids that do not exist, so that an allowed call answers 404 or 400 and changes nothing.
const sampleParameters: Record<string, string> = {
  personId: '999999',
  heatId: '999999',
  supplierId: '999999',
  documentId: '999999',
  pieceId: '999999',
  partId: '999999',
  lotId: '999999',
  runId: '999999',
  ncId: '999999',
  recallId: '999999',
  noticeId: '999999',
  consigneeId: '999999',
  token: 'n'.repeat(43),
  operationId: '999999',
  methodId: 'NO-SUCH-METHOD',
  reauthenticationId: '0'.repeat(32),
};

function concretePath(path: string): string {
  return path.replace(/:([A-Za-z]+)/g, (_match, name: string) => {
    const value = sampleParameters[name];
    if (!value) throw new Error(`add a sample value for the path parameter :${name}`);
    return value;
  });
}

// Every API route × every role (and nobody signed in), asserted from the one permission matrix.
describe('the route × role permission matrix', () => {
  const running = createTestApp();
  let agents: Record<Role, { agent: Agent; csrf: string }>;
  const apiRoutes = routeTable(running.app).filter((route) => route.path.startsWith('/api/'));

  beforeAll(async () => {
    agents = await signInPeople(await SamlTestDriver.create(running.config), running.app, bySingleRole);
  });
  afterAll(() => running.close());

  it('[AUTHZ-GUARDED] when the app is built, then every API route starts with an access guard', () => {
    expect(apiRoutes.length).toBeGreaterThan(5);
    expect(apiRoutes.filter((route) => route.access === null).map((route) => `${route.method} ${route.path}`)).toEqual(
      [],
    );
  });

  it('when the matrix is read, then it names only known actions and every action belongs to some role', () => {
    const granted = new Set(Object.values(permissionMatrix).flat());
    for (const action of granted) expect(actions).toContain(action);
    for (const action of actions) expect(granted.has(action)).toBe(true);
  });

  it(
    '[AUTHZ-MATRIX] when each route is called by each role, then the server allows exactly what the matrix ' + 'allows',
    async () => {
      let cells = 0;
      for (const route of apiRoutes) {
        const path = concretePath(route.path);
        const send = (agent: Agent | null, csrf?: string) => {
          const target = agent ?? request(running.app);
          const call = target[route.method.toLowerCase() as 'get' | 'post' | 'put' | 'delete'](path);
          if (csrf) call.set('X-CSRF-Token', csrf);
          return route.method === 'GET' ? call : call.send({});
        };
        const anonymous = await send(null);
        if (route.access?.kind === 'public')
          expect([401, 403], `${route.method} ${route.path} anonymous`).not.toContain(anonymous.status);
        else
          expect(anonymous.status, `${route.method} ${route.path} anonymous`).toBe(route.method === 'GET' ? 401 : 403);
        cells++;
        for (const role of roles) {
          const { agent, csrf } = agents[role];
          const response = await send(agent, csrf);
          const allowed = route.access?.kind !== 'action' || permissionMatrix[role].includes(route.access.action);
          if (allowed)
            expect(
              [401, 403],
              `${route.method} ${route.path} as ${role}: ${JSON.stringify(response.body)}`,
            ).not.toContain(response.status);
          else expect(response.status, `${route.method} ${route.path} as ${role}`).toBe(403);
          cells++;
        }
      }
      expect(cells).toBe(apiRoutes.length * (roles.length + 1));
    },
  );
});
