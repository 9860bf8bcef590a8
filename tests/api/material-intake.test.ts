import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { heatDetailSchema } from '@shared/schemas/materials';
import { createTestApp } from '../helpers/test-app';
import { csrfTokenOf, reauthenticate, SamlTestDriver } from '../helpers/saml-round-trip';

type Agent = Awaited<ReturnType<SamlTestDriver['signIn']>>['agent'];

const pdf = (text: string) =>
  Buffer.from(`%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\n% ${text}\ntrailer << /Root 1 0 R >>\n%%EOF\n`);
const conforming = {
  chemistry: { Al: '6.10', V: '4.05', Fe: '0.16', O: '0.11', C: '0.02', N: '0.01', H: '45 ppm' },
  mechanical: { utsMPa: '945', ysMPa: '870', elongationPct: '15', reductionOfAreaPct: '42' },
};

describe('material intake: suppliers, heats, certificates, results, disposition', () => {
  const running = createTestApp();
  let saml: SamlTestDriver;
  const people: Record<string, { agent: Agent; csrf: string }> = {};
  let supplierId: number;
  let heatId: number;

  beforeAll(async () => {
    saml = await SamlTestDriver.create(running.config);
    for (const [name, subject] of [
      ['engineer', 'kiw-0101'],
      ['reviewer', 'kiw-0201'],
      ['approver', 'kiw-0301'],
    ] as const) {
      const { agent } = await saml.signIn(running.app, subject);
      people[name] = { agent, csrf: await csrfTokenOf(agent) };
    }
  });
  afterAll(() => running.close());

  const as = (name: string) => people[name]!;

  it('when a QA approver registers a supplier, then it is listed; an engineer may not', async () => {
    const refused = await as('engineer')
      .agent.post('/api/suppliers')
      .set('X-CSRF-Token', as('engineer').csrf)
      .send({ name: 'Test Mill A', country: 'Norway', approval: 'approved', reason: 'audited' });
    expect(refused.status).toBe(403);
    const created = await as('approver')
      .agent.post('/api/suppliers')
      .set('X-CSRF-Token', as('approver').csrf)
      .send({ name: 'Test Mill A', country: 'Norway', approval: 'approved', reason: 'Audited on site' });
    expect(created.status).toBe(201);
    supplierId = created.body.id;
    const duplicate = await as('approver')
      .agent.post('/api/suppliers')
      .set('X-CSRF-Token', as('approver').csrf)
      .send({ name: 'Test Mill A', country: 'Norway', approval: 'approved', reason: 'again' });
    expect(duplicate.status).toBe(409);
  });

  it(
    'when an engineer receives a heat, then it is stored ' + 'against the current revision of its specification',
    async () => {
      const response = await as('engineer').agent.post('/api/heats').set('X-CSRF-Token', as('engineer').csrf).send({
        heatNumber: 'TA-90001',
        supplierId,
        specId: 'astm f136',
        meltRoute: 'VAR ×3',
        productForm: 'bar',
        condition: 'annealed',
        sizeMm: '25.4',
      });
      expect(response.status).toBe(201);
      expect(response.body).toMatchObject({
        heatNumber: 'TA-90001',
        spec: { id: 'ASTM F136', revision: 'L2', grade: null },
        sizeMm: '25.400',
        status: 'received',
        verdict: null,
      });
      heatId = response.body.id;
    },
  );

  it('when the heat input is wrong, then the errors name the fields and nothing is stored', async () => {
    const engineer = as('engineer');
    const duplicate = await engineer.agent.post('/api/heats').set('X-CSRF-Token', engineer.csrf).send({
      heatNumber: 'TA-90001',
      supplierId,
      specId: 'ASTM F136',
      meltRoute: 'VAR',
      productForm: 'bar',
      condition: 'annealed',
      sizeMm: '25',
    });
    expect(duplicate.status).toBe(409);
    const noGrade = await engineer.agent.post('/api/heats').set('X-CSRF-Token', engineer.csrf).send({
      heatNumber: 'CP-1',
      supplierId,
      specId: 'ASTM F67',
      meltRoute: 'VAR',
      productForm: 'bar',
      condition: 'annealed',
      sizeMm: '25',
    });
    expect(noGrade.status).toBe(422);
    expect(noGrade.body.error.fields).toEqual({ grade: 'One of 1, 2, 3, 4' });
    const invalid = await engineer.agent
      .post('/api/heats')
      .set('X-CSRF-Token', engineer.csrf)
      .send({ heatNumber: '', supplierId: 0, specId: 'ASTM F136', meltRoute: 'V', productForm: 'ingot', sizeMm: '-3' });
    expect(invalid.status).toBe(400);
    expect(Object.keys(invalid.body.error.fields).sort()).toEqual([
      'condition',
      'heatNumber',
      'meltRoute',
      'productForm',
      'sizeMm',
      'supplierId',
    ]);
    const tomorrow = new Date(Date.now() + 2 * 86_400_000).toISOString().slice(0, 10);
    for (const [receivedOn, message] of [
      [tomorrow, 'Not in the future'],
      ['2025-02-30', 'Not a calendar date'],
      ['02/03/2025', 'A date as YYYY-MM-DD'],
    ]) {
      const refused = await engineer.agent.post('/api/heats').set('X-CSRF-Token', engineer.csrf).send({
        heatNumber: 'TA-90009',
        supplierId,
        specId: 'ASTM F136',
        meltRoute: 'VAR ×3',
        productForm: 'bar',
        condition: 'annealed',
        sizeMm: '25',
        receivedOn,
      });
      expect(refused.status).toBe(400);
      expect(refused.body.error.fields).toEqual({ receivedOn: message });
    }
    expect((await running.database.dataSource.query("SELECT id FROM heat WHERE heat_number = 'TA-90009'")).length).toBe(
      0,
    );
  });

  it('when a heat is recorded after the day it arrived, then the receipt date given is kept', async () => {
    const engineer = as('engineer');
    const response = await engineer.agent.post('/api/heats').set('X-CSRF-Token', engineer.csrf).send({
      heatNumber: 'TA-90008',
      supplierId,
      specId: 'ASTM F136',
      meltRoute: 'VAR ×3',
      productForm: 'bar',
      condition: 'annealed',
      sizeMm: '25.4',
      receivedOn: '2025-03-14',
    });
    expect(response.status).toBe(201);
    expect(response.body.receivedAt).toBe('2025-03-14T00:00:00.000Z');
  });

  it(
    '[HEAT-EVALUATE] when results are entered, then they are evaluated against the specification and kept with ' +
      'the revision used',
    async () => {
      const engineer = as('engineer');
      const response = await engineer.agent
        .put(`/api/heats/${heatId}/results`)
        .set('X-CSRF-Token', engineer.csrf)
        .send(conforming);
      expect(response.status).toBe(200);
      const heat = heatDetailSchema.parse(response.body);
      expect(heat.verdict).toBe('conforms');
      expect(heat.results.chemistry).toMatchObject({ H: '45 ppm', O: '0.11' });
      const evaluation = heat.evaluation as {
        spec: { revision: string };
        items: Array<{ item: string; note?: string }>;
      };
      expect(evaluation.spec.revision).toBe('L2');
      expect(evaluation.items.find((item) => item.item === 'H')?.note).toBe('45 ppm = 0.0045 %');
      const bad = await engineer.agent
        .put(`/api/heats/${heatId}/results`)
        .set('X-CSRF-Token', engineer.csrf)
        .send({ chemistry: { O: 'high' } });
      expect(bad.status).toBe(400);
      expect(bad.body.error.fields).toEqual({
        'chemistry.O': '"high" is not a decimal number (write e.g. 0.12 or 40 ppm)',
      });
    },
  );

  it(
    '[UPLOAD-HASH] when a certificate is uploaded, then its type comes from its bytes, it is hashed, stored ' +
      'once and downloadable',
    async () => {
      const engineer = as('engineer');
      const bytes = pdf('certificate TA-90001');
      const uploaded = await engineer.agent
        .post(`/api/heats/${heatId}/certificates`)
        .set('X-CSRF-Token', engineer.csrf)
        .attach('certificate', bytes, { filename: 'Zertifikat Łódź.pdf', contentType: 'application/pdf' });
      expect(uploaded.status).toBe(201);
      expect(uploaded.body).toMatchObject({ storedNow: true, alsoOnHeats: [] });
      const download = await engineer.agent
        .get(`/api/heats/${heatId}/certificates/${uploaded.body.documentId}`)
        .buffer(true)
        .parse((res, done) => {
          const chunks: Buffer[] = [];
          res.on('data', (chunk: Buffer) => chunks.push(chunk));
          res.on('end', () => done(null, Buffer.concat(chunks)));
        });
      expect(download.headers['content-type']).toBe('application/pdf');
      expect(download.headers['content-disposition']).toContain('Zertifikat');
      expect(Buffer.compare(download.body as Buffer, bytes)).toBe(0);

      const again = await engineer.agent
        .post(`/api/heats/${heatId}/certificates`)
        .set('X-CSRF-Token', engineer.csrf)
        .attach('certificate', bytes, 'copy.pdf');
      expect(again.status).toBe(409);
    },
  );

  it(
    '[UPLOAD-REFUSE] when the bytes are not a PDF, PNG or JPEG, or too large, or empty, then the upload is ' +
      'refused',
    async () => {
      const engineer = as('engineer');
      const post = () => engineer.agent.post(`/api/heats/${heatId}/certificates`).set('X-CSRF-Token', engineer.csrf);
      const disguised = await post().attach(
        'certificate',
        Buffer.from('MZ\x90\x00 this is not a pdf at all, just text pretending'),
        { filename: 'certificate.pdf', contentType: 'application/pdf' },
      );
      expect(disguised.status).toBe(415);
      expect(disguised.body.error.message).toMatch(/is not a PDF, PNG or JPEG/);
      const empty = await post().attach('certificate', Buffer.alloc(0), 'empty.pdf');
      expect(empty.status).toBe(415);
      expect(empty.body.error).toMatchObject({ code: 'UNSUPPORTED_MEDIA_TYPE', message: 'The file is empty' });
      const huge = await post().attach(
        'certificate',
        Buffer.concat([pdf('big'), Buffer.alloc(10 * 1024 * 1024)]),
        'big.pdf',
      );
      expect(huge.status).toBe(413);
      expect(huge.body.error.code).toBe('PAYLOAD_TOO_LARGE');
      const scripted = await post().attach(
        'certificate',
        Buffer.from(
          '%PDF-1.4\n1 0 obj << /Type /Catalog /OpenAction << /S /JavaScript /JS (app.alert\\(1\\)) >> >> ' +
            'endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n',
        ),
        'certificate.pdf',
      );
      expect(scripted.status).toBe(422);
      expect(scripted.body.error.message).toMatch(/^The PDF carries JavaScript; such files are refused, not cleaned/);
      expect(scripted.body.error.fields).toEqual({ certificate: 'PDF with JavaScript' });
      // The same script in an object stream encoded with /ASCIIHexDecode (which a scan of Flate streams alone let
      // through).
      const inner = Buffer.from('4 0 << /S /JavaScript /JS (app.alert\\(1\\)) >>', 'latin1').toString('hex');
      const hidden = Buffer.from(
        `%PDF-1.4\n1 0 obj << /Type /Catalog /Pages 2 0 R /OpenAction 4 0 R >> endobj\n2 0 obj << /Type /Pages ` +
          `/Kids [] /Count 0 >> endobj\n3 0 obj << /Type /ObjStm /N 1 /First 4 /Filter /ASCIIHexDecode /Length ` +
          `${inner.length + 1} >>\nstream\n${inner}>\nendstream\nendobj\ntrailer << /Root 1 0 R >>\n%%EOF\n`,
        'latin1',
      );
      const documents = Number(
        (await running.database.dataSource.query('SELECT COUNT(*) AS n FROM certificate_document'))[0].n,
      );
      const bypass = await post().attach('certificate', hidden, 'certificate.pdf');
      expect(bypass.status).toBe(422);
      expect(bypass.body.error.fields).toEqual({ certificate: 'PDF with JavaScript' });
      expect(
        Number((await running.database.dataSource.query('SELECT COUNT(*) AS n FROM certificate_document'))[0].n),
      ).toBe(documents);
    },
  );

  it(
    'when a file name climbs out of its folder or carries SQL, then it is stored as a plain name and the upload ' +
      'works',
    async () => {
      const engineer = as('engineer');
      const uploaded = await engineer.agent
        .post(`/api/heats/${heatId}/certificates`)
        .set('X-CSRF-Token', engineer.csrf)
        .attach('certificate', pdf(`traversal ${Date.now()}`), {
          filename: "../../etc/passwd'; DROP TABLE heat; --.pdf",
          contentType: 'application/pdf',
        });
      expect(uploaded.status).toBe(201);
      const listed = await engineer.agent.get(`/api/heats/${heatId}`);
      const names: string[] = listed.body.certificates.map(
        (certificate: { originalName: string }) => certificate.originalName,
      );
      const stored = names.find((name) => name.includes('passwd'))!;
      expect(stored).toBeDefined();
      expect(stored).not.toMatch(/[\\/]/);
      expect(stored.startsWith('.')).toBe(false);
    },
  );

  it(
    '[HEAT-ACCEPT] when a QA reviewer accepts the conforming heat with a signature, then its status changes; ' +
      'its results can no longer change',
    async () => {
      const reviewer = as('reviewer');
      const intent = { recordType: 'heat', recordId: String(heatId), meaning: 'accepted' };
      const preparation = (
        await reviewer.agent.post('/api/signatures/preparations').set('X-CSRF-Token', reviewer.csrf).send(intent)
      ).body;
      expect(preparation.content).toMatchObject({ heat: 'TA-90001', verdict: 'conforms' });
      const signed = await reviewer.agent
        .post('/api/signatures')
        .set('X-CSRF-Token', reviewer.csrf)
        .send({
          ...intent,
          contentHash: preparation.contentHash,
          reauthenticationId: await reauthenticate(saml, reviewer.agent, 'kiw-0201', preparation.bindingHash),
        });
      expect(signed.status).toBe(201);
      expect((await reviewer.agent.get(`/api/heats/${heatId}`)).body.status).toBe('accepted');
      const late = await as('engineer')
        .agent.put(`/api/heats/${heatId}/results`)
        .set('X-CSRF-Token', as('engineer').csrf)
        .send(conforming);
      expect(late.status).toBe(422);
      expect(late.body.error.message).toBe('The heat is accepted; its results can no longer change');
    },
  );

  it(
    '[HEAT-ACCEPT-REFUSED] when a heat does not conform, has no certificate, or comes from a disqualified ' +
      'supplier, then acceptance is refused',
    async () => {
      const engineer = as('engineer');
      const reviewer = as('reviewer');
      const receive = async (heatNumber: string, chemistry: Record<string, string>) => {
        const heat = await engineer.agent.post('/api/heats').set('X-CSRF-Token', engineer.csrf).send({
          heatNumber,
          supplierId,
          specId: 'ASTM F136',
          meltRoute: 'VAR',
          productForm: 'bar',
          condition: 'annealed',
          sizeMm: '25',
        });
        await engineer.agent
          .put(`/api/heats/${heat.body.id}/results`)
          .set('X-CSRF-Token', engineer.csrf)
          .send({ ...conforming, chemistry });
        return heat.body.id as number;
      };
      const tryAccept = async (id: number) => {
        const intent = { recordType: 'heat', recordId: String(id), meaning: 'accepted' };
        const prepared = await reviewer.agent
          .post('/api/signatures/preparations')
          .set('X-CSRF-Token', reviewer.csrf)
          .send(intent);
        if (prepared.status !== 200) return prepared;
        const preparation = prepared.body;
        return reviewer.agent
          .post('/api/signatures')
          .set('X-CSRF-Token', reviewer.csrf)
          .send({
            ...intent,
            contentHash: preparation.contentHash,
            reauthenticationId: await reauthenticate(saml, reviewer.agent, 'kiw-0201', preparation.bindingHash),
          });
      };
      const noCertificate = await receive('TA-90002', conforming.chemistry);
      expect((await tryAccept(noCertificate)).body.error.message).toBe(
        'Attach the mill certificate before accepting the heat',
      );
      const highOxygen = await receive('TA-90003', { ...conforming.chemistry, O: '0.16' });
      // TA-90002 reported exactly what TA-90001 did: the heat page says so.
      const copied = heatDetailSchema.parse((await reviewer.agent.get(`/api/heats/${noCertificate}`)).body);
      expect(copied.crossChecks.identicalResultsOn).toContain('TA-90001');
      expect(
        heatDetailSchema.parse((await reviewer.agent.get(`/api/heats/${highOxygen}`)).body).crossChecks
          .identicalResultsOn,
      ).not.toContain('TA-90001');
      await engineer.agent
        .post(`/api/heats/${highOxygen}/certificates`)
        .set('X-CSRF-Token', engineer.csrf)
        .attach('certificate', pdf('TA-90003'), 'c.pdf');
      expect((await tryAccept(highOxygen)).body.error.message).toBe(
        'Only a conforming heat can be accepted; its evaluation says does not conform',
      );

      await as('approver')
        .agent.put(`/api/suppliers/${supplierId}/approval`)
        .set('X-CSRF-Token', as('approver').csrf)
        .send({ approval: 'disqualified', reason: 'Failed re-audit' });
      const fromDisqualified = await receive('TA-90004', conforming.chemistry);
      await engineer.agent
        .post(`/api/heats/${fromDisqualified}/certificates`)
        .set('X-CSRF-Token', engineer.csrf)
        .attach('certificate', pdf('TA-90004'), 'c.pdf');
      const refused = await tryAccept(fromDisqualified);
      expect(refused.status).toBe(422);
      expect(refused.body.error.message).toBe('Heats from a disqualified supplier cannot be accepted');
      expect((await reviewer.agent.get(`/api/heats/${fromDisqualified}`)).body.status).toBe('received');
    },
  );
});

describe('the demo scenario’s material history', () => {
  const running = createTestApp();
  afterAll(() => running.close());

  it(
    'when seeded, then it holds dozens of heats over two years from several mills, one quarantined by a marked ' +
      'seeded signature',
    async () => {
      const db = await running.database.connect();
      const [span] = await db.query(
        'SELECT COUNT(*) AS heats, COUNT(DISTINCT supplier_id) AS mills, DATEDIFF(MAX(received_at), ' +
          'MIN(received_at)) AS days FROM heat WHERE received_by = (SELECT id FROM person WHERE subject = ' +
          "'kiw-0101')",
      );
      expect(Number(span.heats)).toBeGreaterThanOrEqual(36);
      expect(Number(span.mills)).toBeGreaterThanOrEqual(3);
      expect(Number(span.days)).toBeGreaterThanOrEqual(680);
      const quarantined = await db.query(
        `SELECT h.heat_number, s.reason, r.purpose FROM heat h
         JOIN electronic_signature s ON s.record_type = 'heat' AND s.record_id = CAST(h.id AS CHAR) AND
           s.meaning = 'quarantined'
         JOIN reauthentication r ON r.id = s.reauthentication_id
        WHERE h.status = 'quarantined'`,
      );
      expect(quarantined).toEqual([
        expect.objectContaining({
          heat_number: 'OB-55208',
          purpose: expect.stringMatching(/^demo scenario: confirmed by the seed script/),
        }),
      ]);
      const [failing] = await db.query(
        "SELECT verdict FROM heat_evaluation e JOIN heat h ON h.id = e.heat_id WHERE h.heat_number = 'NV-25-0388'",
      );
      expect(failing.verdict).toBe('does-not-conform');
      const [stock] = await db.query(
        "SELECT COUNT(*) AS pieces FROM bar_piece b JOIN heat h ON h.id = b.heat_id WHERE h.status = 'accepted'",
      );
      expect(Number(stock.pieces)).toBeGreaterThanOrEqual(16);
    },
  );
});

describe('element trends per supplier and specification', () => {
  const running = createTestApp();
  afterAll(() => running.close());

  it(
    'when asked for oxygen of the demo mill on F136, then the points come in receipt order with the limit and ' + 'Cpk',
    async () => {
      const saml = await SamlTestDriver.create(running.config);
      const { agent } = await saml.signIn(running.app, 'kiw-0401');
      const [supplier] = await running.database.dataSource.query(
        "SELECT id FROM supplier WHERE name = 'Nordvik Titanium Mill'",
      );
      const response = await agent.get(`/api/trends?supplierId=${supplier.id}&specId=ASTM%20F136&element=O`);
      expect(response.status).toBe(200);
      const points: Array<{ heatNumber: string; receivedAt: string; value: string }> = response.body.points;
      // Two years of demo history (16 heats) come before the four recent heats.
      expect(points.length).toBeGreaterThanOrEqual(20);
      expect(points.map((point) => point.receivedAt)).toEqual(points.map((point) => point.receivedAt).sort());
      // The demo scenario's recent Nordvik F136 heats reported O 0.11, 0.10, 0.12 and 0.15, in that order.
      const recent = ['NV-24-1107', 'NV-24-1162', 'NV-25-0214', 'NV-25-0388'];
      expect(
        points.filter((point) => recent.includes(point.heatNumber)).map((point) => [point.heatNumber, point.value]),
      ).toEqual([
        ['NV-24-1107', '0.11'],
        ['NV-24-1162', '0.1'],
        ['NV-25-0214', '0.12'],
        ['NV-25-0388', '0.15'],
      ]);
      expect(response.body.limit).toEqual({ max: '0.13', text: '≤ 0.13' });
      expect(response.body.capability.ppk.formula).toMatch(/^Ppk = min\(\(USL − x̄\) \/ 3s/);
      expect(response.body.capability.cpk.formula).toMatch(/σ̂ = MR̄ \/ 1\.128/);
      expect(response.body.capability.indicativeOnly).toBe(points.length < 25);
      const missing = await agent.get(`/api/trends?supplierId=${supplier.id}&specId=ASTM%20F136&element=Zr`);
      expect(missing.status).toBe(422);
    },
  );
});
