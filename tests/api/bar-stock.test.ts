import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { barPieceSchema } from '@shared/schemas/materials';
import { createTestApp } from '../helpers/test-app';
import { csrfTokenOf, SamlTestDriver } from '../helpers/saml-round-trip';

describe('bar stock', () => {
  const running = createTestApp();
  let engineer: Awaited<ReturnType<SamlTestDriver['signIn']>>['agent'];
  let csrf: string;
  let heatId: number;

  beforeAll(async () => {
    const saml = await SamlTestDriver.create(running.config);
    engineer = (await saml.signIn(running.app, 'kiw-0102')).agent;
    csrf = await csrfTokenOf(engineer);
    const [heat] = await running.database.dataSource.query("SELECT id FROM heat WHERE heat_number = 'NV-24-1107'");
    heatId = heat.id;
  });
  afterAll(() => running.close());

  const post = (path: string, body: object) => engineer.post(path).set('X-CSRF-Token', csrf).send(body);

  it(
    'when bar is received against a heat, then the piece ' + 'carries its tag, heat and full remaining length',
    async () => {
      const response = await post('/api/bar-pieces', {
        heatId,
        markedHeatNumber: 'NV 24 1107',
        tag: 'nv-1107-01',
        diameterMm: '25.4',
        lengthMm: '3000',
        massKg: '6.84',
        location: 'Rack B2',
      });
      expect(response.status).toBe(201);
      expect(barPieceSchema.parse(response.body)).toMatchObject({
        tag: 'NV-1107-01',
        heat: { heatNumber: 'NV-24-1107' },
        lengthMm: '3000.00',
        remainingMm: '3000.00',
        status: 'in-stock',
      });
      const duplicate = await post('/api/bar-pieces', {
        heatId,
        markedHeatNumber: 'NV-24-1107',
        tag: 'NV-1107-01',
        diameterMm: '25.4',
        lengthMm: '3000',
        location: 'Rack B2',
      });
      expect(duplicate.status).toBe(409);
      const invalid = await post('/api/bar-pieces', {
        heatId,
        tag: 'x',
        diameterMm: '0',
        lengthMm: 'long',
        location: '',
      });
      expect(invalid.status).toBe(400);
      expect(Object.keys(invalid.body.error.fields).sort()).toEqual([
        'diameterMm',
        'lengthMm',
        'location',
        'markedHeatNumber',
        'tag',
      ]);
      expect(barPieceSchema.parse(response.body).markedHeatNumber).toBe('NV 24 1107');
    },
  );

  it(
    '[BAR-MARKING] when the heat number read off the bar does not match the certificate, then the receipt is ' +
      'refused, nothing is stocked, and the mismatch is recorded',
    async () => {
      const refused = await post('/api/bar-pieces', {
        heatId,
        markedHeatNumber: 'NV-24-11O7',
        tag: 'NV-1107-X1',
        diameterMm: '25.4',
        lengthMm: '3000',
        location: 'Rack B2',
      });
      expect(refused.status).toBe(422);
      expect(refused.body.error.message).toBe(
        'The bar is marked NV-24-11O7, the certificate is for heat NV-24-1107; they differ from character 7 (O ' +
          'against 0). The bar was not taken into stock; set it aside and ask QA.',
      );
      expect(refused.body.error.fields).toEqual({ markedHeatNumber: 'Does not match heat NV-24-1107' });
      const db = running.database.dataSource;
      expect(await db.query("SELECT id FROM bar_piece WHERE tag = 'NV-1107-X1'")).toEqual([]);
      const [event] = await db.query(
        "SELECT entity_type, entity_id, after_json FROM audit_event WHERE action = 'bar.heat-marking-mismatch' " +
          'ORDER BY seq DESC LIMIT 1',
      );
      expect(event).toMatchObject({ entity_type: 'heat', entity_id: String(heatId) });
      expect(JSON.parse(event.after_json)).toMatchObject({
        tag: 'NV-1107-X1',
        markedHeatNumber: 'NV-24-11O7',
        heatNumber: 'NV-24-1107',
      });
    },
  );

  it(
    'when a piece is cut and the lengths plus kerf account for it, then the children get their own tags and the ' +
      'parent is used up',
    async () => {
      const [piece] = await running.database.dataSource.query("SELECT id FROM bar_piece WHERE tag = 'NV-1107-01'");
      const cut = await post(`/api/bar-pieces/${piece.id}/cuts`, {
        pieces: [{ lengthMm: '1000' }, { lengthMm: '997' }, { lengthMm: '997', location: 'Saw bay' }],
      });
      expect(cut.status).toBe(201);
      expect(
        cut.body.map((child: { tag: string; lengthMm: string; massKg: string }) => [
          child.tag,
          child.lengthMm,
          child.massKg,
        ]),
      ).toEqual([
        ['NV-1107-01-A', '1000.00', '2.280'],
        ['NV-1107-01-B', '997.00', '2.273'],
        ['NV-1107-01-C', '997.00', '2.273'],
      ]);
      const parent = barPieceSchema.parse((await engineer.get(`/api/bar-pieces/${piece.id}`)).body);
      expect(parent).toMatchObject({
        status: 'cut',
        remainingMm: '0.00',
        childTags: ['NV-1107-01-A', 'NV-1107-01-B', 'NV-1107-01-C'],
      });
      const again = await post(`/api/bar-pieces/${piece.id}/cuts`, {
        pieces: [{ lengthMm: '10' }, { lengthMm: '10' }],
      });
      expect(again.status).toBe(422);
    },
  );

  it('when a cut does not account for the bar, then it is refused and nothing is written', async () => {
    const received = await post('/api/bar-pieces', {
      heatId,
      markedHeatNumber: 'NV-24-1107',
      tag: 'NV-1107-02',
      diameterMm: '25.4',
      lengthMm: '1000',
      location: 'Rack B2',
    });
    const count = async () =>
      Number((await running.database.dataSource.query('SELECT COUNT(*) AS n FROM bar_piece'))[0].n);
    const before = await count();
    const refused = await post(`/api/bar-pieces/${received.body.id}/cuts`, {
      pieces: [{ lengthMm: '400' }, { lengthMm: '400' }],
    });
    expect(refused.status).toBe(422);
    expect(refused.body.error.message).toBe(
      '200 mm of the bar is not accounted for (the kerf allowance is 3 mm); record the remnant as a piece',
    );
    expect(await count()).toBe(before);
  });

  it('when listing, then pieces can be filtered by heat and by what is still in stock', async () => {
    const all = (await engineer.get(`/api/bar-pieces?heatId=${heatId}`)).body;
    expect(all.total).toBe(5);
    const inStock = (await engineer.get(`/api/bar-pieces?heatId=${heatId}&inStockOnly=true`)).body;
    expect(inStock.items.map((item: { tag: string }) => item.tag).sort()).toEqual([
      'NV-1107-01-A',
      'NV-1107-01-B',
      'NV-1107-01-C',
      'NV-1107-02',
    ]);
  });
});
