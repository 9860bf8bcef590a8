#!/usr/bin/env node
// The ingotrace command: loads the TypeScript CLI through tsx (no build step needed).
import { register } from 'tsx/esm/api';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));
register({ tsconfig: `${root}tsconfig.json` });
const { runCli } = await import('../server/src/cli/main.ts');
process.exitCode = await runCli(process.argv);
