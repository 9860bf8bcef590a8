// Every setting the app reads is documented in .env.example (commented out where it has no
// useful local value), so that operators find each one, secrets included, in one place.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { configSchema } from '../../../server/src/config/env';

describe('.env.example', () => {
  const documented = new Set(
    readFileSync('.env.example', 'utf8')
      .split('\n')
      .map((line) => /^#?\s*([A-Z][A-Z0-9_]+)=/.exec(line)?.[1])
      .filter((key): key is string => Boolean(key)),
  );

  it('names every setting of the configuration schema', () => {
    const missing = Object.keys(configSchema.shape).filter((key) => !documented.has(key));
    expect(missing).toEqual([]);
  });

  it('names nothing that nothing reads', () => {
    // Beyond the schema: TEST_<setting> overrides for npm test (testProfileEnvironment) and the
    // few settings that only the scripts and the dev server read.
    const readElsewhere = ['scripts/dev.ts', 'vite.config.ts', 'tests/api/mariadb-bootstrap.test.ts']
      .map((file) => readFileSync(file, 'utf8'))
      .join('\n');
    const unknown = [...documented].filter(
      (key) =>
        !(key in configSchema.shape) &&
        !(key.startsWith('TEST_') && key.slice(5) in configSchema.shape) &&
        !readElsewhere.includes(`process.env.${key}`),
    );
    expect(unknown).toEqual([]);
  });
});
