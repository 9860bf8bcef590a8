import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';

function ingotrace(...args: string[]) {
  const result = spawnSync(process.execPath, ['bin/ingotrace.mjs', ...args], {
    encoding: 'utf8',
    env: { ...process.env, NO_COLOR: '1' },
  });
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
    const result = spawnSync(process.execPath, ['bin/ingotrace.mjs', 'config'], {
      encoding: 'utf8',
      env: { ...process.env, DB_PORT: 'abc' },
    });
    expect(result.status).toBe(1);
    expect(result.stderr).toMatch(/Invalid configuration:\n\s+DB_PORT:/);
  });

  it('when the configuration is valid, then config prints it with the passwords masked', () => {
    const result = spawnSync(process.execPath, ['bin/ingotrace.mjs', 'config'], {
      encoding: 'utf8',
      env: { ...process.env, DB_PASSWORD: 'hunter2-secret' },
    });
    expect(result.status).toBe(0);
    const shown = JSON.parse(result.stdout) as Record<string, unknown>;
    expect(shown.DB_PASSWORD).toBe('********');
    expect(result.stdout).not.toContain('hunter2-secret');
  });
});

describe('ingotrace evaluate', () => {
  const certificate = {
    spec: 'ASTM F136',
    grade: null,
    form: 'bar',
    sizeMm: '25',
    chemistry: { Al: '6.1', V: '4.0', Fe: '0.18', O: '0.12', C: '0.02', N: '0.01', H: '0.004' },
    mechanical: { utsMPa: '950', ysMPa: '880', elongationPct: '14', reductionOfAreaPct: '40' },
  };
  const evaluate = (input: string) =>
    spawnSync(process.execPath, ['bin/ingotrace.mjs', 'evaluate'], { encoding: 'utf8', input });

  it('when given a conforming certificate on stdin, then it prints the evaluation as JSON and exits 0', () => {
    const result = evaluate(JSON.stringify(certificate));
    expect(result.status).toBe(0);
    const evaluation = JSON.parse(result.stdout);
    expect(evaluation.verdict).toBe('conforms');
    expect(evaluation.spec).toMatchObject({ id: 'ASTM F136', revision: 'L2' });
    expect(evaluation.basis).toEqual({ form: 'bar', condition: 'annealed', sizeMm: '25' });
    expect(evaluation.items[3]).toMatchObject({
      item: 'O',
      reported: '0.12',
      rounded: '0.12',
      limit: '≤ 0.13',
      verdict: 'conforms',
    });
  });

  it(
    'when the certificate does not conform, then it still exits 0 with that verdict (numbers may be JSON ' + 'numbers)',
    () => {
      const result = evaluate(
        JSON.stringify({ ...certificate, spec: 'astm f136', chemistry: { ...certificate.chemistry, O: 0.135 } }),
      );
      expect(result.status).toBe(0);
      expect(JSON.parse(result.stdout).verdict).toBe('does-not-conform');
    },
  );

  it(
    'when no requirement applies to the form (F136 plate is outside the library), then the verdict is ' +
      'cannot-be-evaluated with the reason, not conforms',
    () => {
      const result = evaluate(JSON.stringify({ ...certificate, form: 'plate', condition: 'Annealed' }));
      expect(result.status).toBe(0);
      const evaluation = JSON.parse(result.stdout);
      expect(evaluation.verdict).toBe('cannot-be-evaluated');
      expect(evaluation.items.at(-1)).toMatchObject({
        kind: 'selection',
        verdict: 'cannot-be-evaluated',
        reason: 'no-requirement',
      });
      const typedCondition = evaluate(JSON.stringify({ ...certificate, condition: 'as rolled' }));
      expect(typedCondition.status).toBe(2);
      expect(typedCondition.stderr).toContain(
        'condition: Choose one of: annealed, cold-worked, hot-worked, warm-worked, extra-hard',
      );
    },
  );

  it(
    'when the input is not JSON or names an unknown ' + 'specification, then it exits non-zero with a clear message',
    () => {
      const notJson = evaluate('{"spec": ');
      expect(notJson.status).toBe(2);
      expect(notJson.stderr).toMatch(/^ingotrace: the input is not JSON/);
      const unknown = evaluate(JSON.stringify({ ...certificate, spec: 'ASTM F999' }));
      expect(unknown.status).toBe(2);
      expect(unknown.stderr).toBe(
        'ingotrace: Unknown specification "ASTM F999"\n  spec: Not in the specification library\n',
      );
      expect(unknown.stdout).toBe('');
    },
  );
});
