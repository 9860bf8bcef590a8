import { createMemoryHistory, createRouter } from 'vue-router';
import { describe, expect, it } from 'vitest';
import { routes } from '../../../src/router';
import { recordRoute, recordRouteParams } from '../../../src/router/record-route';

// The product's own routes; no published source.
describe('typed routes to record pages', () => {
  const router = createRouter({ history: createMemoryHistory(), routes });

  it(
    'when a record route is named, then it exists and its ' + 'path takes exactly the parameter the helper asks for',
    () => {
      for (const [name, param] of Object.entries(recordRouteParams)) {
        const route = routes.find((candidate) => candidate.name === name);
        expect(route, name).toBeDefined();
        expect(
          [...route!.path.matchAll(/:([A-Za-z]+)/g)].map((match) => match[1]),
          name,
        ).toEqual([param]);
      }
    },
  );

  it('when a record route is resolved, then it gives the page address people share', () => {
    expect(router.resolve(recordRoute('lot', { lotId: 42 })).fullPath).toBe('/lots/42');
    expect(router.resolve(recordRoute('bar-piece', { pieceId: 7 })).fullPath).toBe('/bar-stock/7');
    expect(router.resolve(recordRoute('nonconformance', { ncId: 3 })).fullPath).toBe('/nonconformances/3');
  });
});
