import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { createTestApp } from '../helpers/test-app';
import { routeTable } from '../helpers/route-table';

/**
 * Writes that no screen offers, on purpose, each with why. Everything else the permission matrix
 * lets a role write must be reachable from a screen (the client's API modules call it).
 */
const apiOnly: Record<string, string> = {};

/** The write calls the client makes: "METHOD /path" with each ${…} as a path segment. */
function clientWrites(): Array<{ method: string; path: string }> {
  const folder = join(process.cwd(), 'src', 'api');
  const calls: Array<{ method: string; path: string }> = [];
  for (const file of readdirSync(folder).filter((name) => name.endsWith('.ts'))) {
    const text = readFileSync(join(folder, file), 'utf8');
    for (const match of text.matchAll(/api(Request|Upload|Download)\(\s*(['`])([^'`]+)\2/g)) {
      const [, kind, , rawPath] = match;
      // The call's options may run over several lines: read on to the next call or export.
      const after = text.slice(match.index + match[0].length);
      const rest = after.slice(0, after.search(/api(Request|Upload|Download)\(|\nexport /) >>> 0);
      const method =
        kind === 'Upload' || kind === 'Download'
          ? 'POST'
          : (/method: '(POST|PUT|PATCH|DELETE)'/.exec(rest ?? '')?.[1] ?? 'GET');
      calls.push({ method, path: rawPath!.split('?')[0]!.replace(/\$\{[^}]+\}/g, 'X') });
    }
  }
  return calls;
}

describe('every write has a screen', () => {
  const running = createTestApp();
  afterAll(() => running.close());

  it(
    '[SCREEN-FOR-EVERY-WRITE] when the API’s write routes are listed, then each is called by the client, or is ' +
      'marked API-only with a reason',
    () => {
      const writes = routeTable(running.app).filter(
        (route) => route.path.startsWith('/api/') && ['POST', 'PUT', 'PATCH', 'DELETE'].includes(route.method),
      );
      expect(writes.length).toBeGreaterThan(20);
      const calls = clientWrites();
      const uncovered = writes
        .filter((route) => {
          const pattern = new RegExp(`^${route.path.slice(4).replace(/:[A-Za-z]+(\([^)]*\))?/g, '[^/]+')}$`);
          return !calls.some((call) => call.method === route.method && pattern.test(call.path));
        })
        .map((route) => `${route.method} ${route.path}`)
        .filter((route) => !(route in apiOnly));
      expect(uncovered).toEqual([]);
    },
  );
});
