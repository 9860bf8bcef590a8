import { spawn, spawnSync, type SpawnOptions } from 'node:child_process';

export function log(message: string): void {
  process.stdout.write(`[ingotrace] ${message}\n`);
}

/** Runs a command to completion; rejects with its stderr when it fails. */
export function runCommand(
  command: string,
  args: string[],
  options: SpawnOptions & { input?: string } = {},
): Promise<string> {
  return new Promise((resolve, reject) => {
    const child = spawn(command, args, { ...options, stdio: ['pipe', 'pipe', 'pipe'] });
    let stdout = '';
    let stderr = '';
    child.stdout?.on('data', (chunk) => (stdout += chunk));
    child.stderr?.on('data', (chunk) => (stderr += chunk));
    child.on('error', reject);
    child.on('close', (code) => {
      if (code === 0) resolve(stdout);
      else reject(new Error(`${command} ${args.join(' ')} exited ${code}: ${stderr.trim() || stdout.trim()}`));
    });
    // A command that exits before reading its input closes the pipe; that is not an error here.
    child.stdin?.on('error', () => undefined);
    child.stdin?.end(options.input ?? '');
  });
}

/** Finds an executable on PATH or in the sbin folders that a non-login shell may lack. */
export function findExecutable(name: string): string | null {
  const folders = [...(process.env.PATH ?? '').split(':'), '/usr/sbin', '/sbin', '/usr/local/sbin'];
  for (const folder of folders) {
    if (!folder) continue;
    const candidate = `${folder}/${name}`;
    if (spawnSync('test', ['-x', candidate]).status === 0) return candidate;
  }
  return null;
}

/** Whether a process with this id exists (signal 0 checks without signalling). */
export function processAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

export function isRoot(): boolean {
  return typeof process.getuid === 'function' && process.getuid() === 0;
}

/** Installs Debian packages with apt-get when an executable is missing. */
export async function ensureDebianPackages(executable: string, packages: string[]): Promise<string> {
  const found = findExecutable(executable);
  if (found) return found;
  if (!isRoot()) {
    throw new Error(
      `${executable} is not installed. Install it with: sudo apt-get install -y ${packages.join(' ')}` +
        ' (or run this command as root and it will install them).',
    );
  }
  log(`installing ${packages.join(', ')} from Debian's packages (one time)…`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  await runCommand('apt-get', ['update'], { env });
  await runCommand('apt-get', ['install', '-y', '--no-install-recommends', ...packages], { env });
  const installed = findExecutable(executable);
  if (!installed) throw new Error(`${executable} still missing after installing ${packages.join(' ')}`);
  return installed;
}

/** A catch handler for a script's main(): prints the reason and exits non-zero. */
export function fail(what: string): (error: unknown) => never {
  return (error) => {
    process.stderr.write(`[ingotrace] ${what} failed: ${error instanceof Error ? error.message : String(error)}\n`);
    process.exit(1);
  };
}
