import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';

function ingotrace(...args: string[]) {
  const result = spawnSync(process.execPath, ['bin/ingotrace.mjs', ...args], { encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } });
  return { code: result.status, stdout: result.stdout, stderr: result.stderr };
}

describe('the ingotrace command', () => {
  it('when asked for --help, then it lists its commands and exits 0', () => {
    const result = ingotrace('--help');
    expect(result.code).toBe(0);
    expect(result.stdout).toMatch(/^Usage: ingotrace \[options\] \[command\]/);
    expect(result.stdout).toMatch(/config\s+check the configuration/);
  });

  it('when asked for --version, then it prints the package version', async () => {
    const { version } = (await import('../../../package.json', { with: { type: 'json' } })).default;
    const result = ingotrace('--version');
    expect(result.code).toBe(0);
    expect(result.stdout.trim()).toBe(version);
  });

  it('when given an unknown command, then it says so on stderr and exits non-zero', () => {
    const result = ingotrace('frobnicate');
    expect(result.code).not.toBe(0);
    expect(result.stderr).toContain("error: unknown command 'frobnicate'");
    expect(result.stdout).toBe('');
  });

  it('when the configuration is invalid, then config names the setting and exits non-zero', () => {
    const result = spawnSync(process.execPath, ['bin/ingotrace.mjs', 'config'], { encoding: 'utf8', env: { ...process.env, DB_PORT: 'abc' } });
    expect(result.status).toBe(1);
    expect(result.stderr).toMatch(/Invalid configuration:\n\s+DB_PORT:/);
  });

  it('when the configuration is valid, then config prints it with the passwords masked', () => {
    const result = spawnSync(process.execPath, ['bin/ingotrace.mjs', 'config'], { encoding: 'utf8', env: { ...process.env, DB_PASSWORD: 'hunter2-secret' } });
    expect(result.status).toBe(0);
    const shown = JSON.parse(result.stdout) as Record<string, unknown>;
    expect(shown.DB_PASSWORD).toBe('********');
    expect(result.stdout).not.toContain('hunter2-secret');
  });
});
