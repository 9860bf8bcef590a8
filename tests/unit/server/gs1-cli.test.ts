import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';

function ingotrace(...args: string[]) {
  const result = spawnSync(process.execPath, ['bin/ingotrace.mjs', ...args], {
    encoding: 'utf8',
    env: { ...process.env, NO_COLOR: '1' },
  });
  return { code: result.status, stdout: result.stdout, stderr: result.stderr };
}

// Each call starts the CLI in its own Node process, which takes a few seconds here.
describe('ingotrace gs1', { timeout: 30_000 }, () => {
  it('when a published element string is parsed, then it prints the parts as JSON with ISO dates', () => {
    // Source: GS1 syntax dictionary AI formats; vector (01)09506000134352(17)261231(10)ABC123(21)12345.
    const result = ingotrace('gs1', 'parse', '(01)09506000134352(17)261231(10)ABC123(21)12345');
    expect(result.code).toBe(0);
    expect(JSON.parse(result.stdout)).toEqual({
      gtin: '09506000134352',
      lot: 'ABC123',
      expiry: '2026-12-31',
      productionDate: null,
      serial: '12345',
    });
  });
  it('when a Digital Link is parsed, then the same reading results', () => {
    // Source: GS1 Digital Link example https://id.gs1.org/01/09521234543213/10/ABC123/21/12345 (BWIPP wiki).
    const result = ingotrace('gs1', 'parse', 'https://id.gs1.org/01/09521234543213/10/ABC123/21/12345');
    expect(JSON.parse(result.stdout)).toMatchObject({
      gtin: '09521234543213',
      lot: 'ABC123',
      serial: '12345',
      expiry: null,
    });
  });
  it('when the check digit is wrong or the input malformed, then it exits non-zero with the reason', () => {
    const bad = ingotrace('gs1', 'parse', '(01)09506000134353(10)ABC');
    expect(bad.code).toBe(2);
    expect(bad.stderr).toBe('ingotrace: AI 01 (GTIN): the check digit should be 2\n');
    const malformed = ingotrace('gs1', 'parse', 'not a udi');
    expect(malformed.code).toBe(2);
    expect(malformed.stderr).toMatch(/^ingotrace: AI no is not one this product reads/);
  });
  it('when a UDI is built, then the element string and the Digital Link come on two lines', () => {
    const result = ingotrace(
      'gs1',
      'build',
      '--gtin',
      '09506000134352',
      '--lot',
      'ABC123',
      '--expiry',
      '261231',
      '--serial',
      '12345',
    );
    expect(result.code).toBe(0);
    expect(result.stdout).toBe(
      '(01)09506000134352(17)261231(10)ABC123(21)12345\n' +
        'https://id.gs1.org/01/09506000134352/10/ABC123/21/12345?17=261231\n',
    );
    expect(ingotrace('gs1', 'build', '--gtin', '09506000134352').code).not.toBe(0);
  });
});
