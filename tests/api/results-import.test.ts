import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp } from '../helpers/test-app';
import { csrfTokenOf, SamlTestDriver } from '../helpers/saml-round-trip';

describe('importing certificate results from CSV', () => {
  const running = createTestApp();
  let agent: Awaited<ReturnType<SamlTestDriver['signIn']>>['agent'];
  let csrf: string;
  beforeAll(async () => {
    const saml = await SamlTestDriver.create(running.config);
    agent = (await saml.signIn(running.app, 'kiw-0101')).agent;
    csrf = await csrfTokenOf(agent);
  });
  afterAll(() => running.close());

  const importCsv = (csv: string, mode: string) =>
    agent.post('/api/heat-results/imports').set('X-CSRF-Token', csrf).send({ csv, mode });
  const results = async (heatNumber: string) =>
    (await running.database.dataSource.query(
      'SELECT r.item, r.as_reported FROM heat_result r JOIN heat h ON h.id = r.heat_id WHERE h.heat_number = ' +
        '? ORDER BY r.item',
      [heatNumber],
    )) as Array<{ item: string; as_reported: string }>;

  const csv = [
    'supplier,heat_number,Al,V,Fe,O,C,N,H,uts_mpa,ys_mpa,elongation_pct,reduction_of_area_pct',
    'Castellane Special Metals,CS-7781,6.00,4.00,0.19,0.105,0.02,0.01,35 ppm,931,861,15,40',
    'Castellane Special Metals,CS-9999,6.00,4.00,0.19,0.10,0.02,0.01,0.003,930,860,15,40',
    '"Castellane Special Metals",CS-7790,6.00,four,0.19,0.10,0.02,0.01,0.003,930,860,15,40',
  ].join('\n');

  it(
    'when checking a file, then every bad row is reported ' + 'with its line and field, and nothing is written',
    async () => {
      const before = await results('CS-7781');
      const response = await importCsv(csv, 'check');
      expect(response.status).toBe(200);
      expect(response.body).toMatchObject({ rows: 3, valid: 1, imported: 0 });
      expect(response.body.errors).toEqual([
        { line: 3, field: 'heat_number', message: 'No heat CS-9999 from Castellane Special Metals' },
        { line: 4, field: 'V', message: '"four" is not a decimal number (write e.g. 0.12 or 40 ppm)' },
      ]);
      expect(await results('CS-7781')).toEqual(before);
    },
  );

  it('when importing all rows but some are bad, then nothing is written', async () => {
    const before = await results('CS-7781');
    const response = await importCsv(csv, 'all');
    expect(response.status).toBe(422);
    expect(response.body.error.message).toBe(
      'Nothing was imported: 2 problem(s) in 2 row(s); fix them or import only the valid rows',
    );
    expect(await results('CS-7781')).toEqual(before);
  });

  it('when the person imports only the valid rows, then those are written and evaluated', async () => {
    const response = await importCsv(csv, 'valid-only');
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({
      imported: 1,
      verdicts: [{ line: 2, heatNumber: 'CS-7781', verdict: 'conforms' }],
    });
    expect((await results('CS-7781')).find((row) => row.item === 'H')?.as_reported).toBe('35 ppm');
  });

  it('when the header is wrong or the text is not CSV, then the file is refused as a whole', async () => {
    expect((await importCsv('heat,O\nX,0.1', 'check')).body.error.message).toBe(
      'The header lacks supplier, heat_number',
    );
    expect((await importCsv('supplier,heat_number,Oxygen\nA,B,0.1', 'check')).body.error.message).toBe(
      'Unknown columns: Oxygen',
    );
    const broken = await importCsv('supplier,heat_number,O\n"unterminated,B,0.1', 'check');
    expect(broken.status).toBe(400);
    expect(broken.body.error.message).toMatch(/^The file is not readable CSV/);
  });
});
