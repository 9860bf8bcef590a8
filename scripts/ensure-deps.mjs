// Installs the project's npm dependencies when node_modules is missing or older than the lock
// file. Uses only Node's built-ins, so it can run before anything else is installed.
import { execSync } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const lock = join(root, 'package-lock.json');
const marker = join(root, 'node_modules', '.package-lock.json');

const stale = !existsSync(marker) || (existsSync(lock) && statSync(lock).mtimeMs > statSync(marker).mtimeMs);
if (stale) {
  const command = existsSync(lock) ? 'npm ci --no-audit --no-fund' : 'npm install --no-audit --no-fund';
  process.stdout.write(`[ingotrace] installing npm dependencies (${command})…\n`);
  try {
    execSync(command, { cwd: root, stdio: 'inherit' });
  } catch {
    process.stderr.write('[ingotrace] npm could not install the dependencies; see the messages above.\n');
    process.exit(1);
  }
}
