import { readFileSync } from 'node:fs';

/** The product version from package.json (read once). */
export const productVersion: string = (
  JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')) as { version: string }
).version;
