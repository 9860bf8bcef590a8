import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BackwardTrace, ForwardTrace } from '@shared/schemas/trace';
import type { GenealogyGraph } from '@shared/domain/trace/genealogy-graph';
import { derivedLotHeatsSql } from '../../server/src/modules/manufacturing/lot-heats.repository';
import { createTestApp } from '../helpers/test-app';
import { csrfTokenOf, SamlTestDriver } from '../helpers/saml-round-trip';

type Agent = Awaited<ReturnType<SamlTestDriver['signIn']>>['agent'];

describe(
  'genealogy both ways on a hand-built history with a ' + 'cut bar, a split, a merge, shared runs and two heats',
  () => {
    const running = createTestApp();
    let engineer: { agent: Agent; csrf: string };
    let auditor: Agent;
    const lot: Record<string, { id: number; lotNumber: string }> = {};
    const ids: Record<string, number> = {};
    const times = {
      operatorName: 'Test',
      workCentre: 'Cell',
      startedAt: '2026-11-20T08:00:00Z',
      endedAt: '2026-11-20T09:00:00Z',
    };

    beforeAll(async () => {
      const saml = await SamlTestDriver.create(running.config);
      const signedIn = await saml.signIn(running.app, 'kiw-0102');
      engineer = { agent: signedIn.agent, csrf: await csrfTokenOf(signedIn.agent) };
      auditor = (await saml.signIn(running.app, 'kiw-0401')).agent;
      const post = async (path: string, body: unknown) => {
        const response = await engineer.agent
          .post(path)
          .set('X-CSRF-Token', engineer.csrf)
          .send(body as object);
        if (response.status >= 300) throw new Error(`${path}: ${JSON.stringify(response.body)}`);
        return response.body;
      };
      const db = await running.database.connect();
      const [h1, h2] = await db.query(
        "SELECT id, heat_number FROM heat WHERE status = 'accepted' AND spec_id = 'ASTM F136' ORDER BY id LIMIT 2",
      );
      ids.h1 = h1.id;
      ids.h2 = h2.id;
      const b1 = await post('/api/bar-pieces', {
        heatId: h1.id,
        markedHeatNumber: h1.heat_number,
        tag: 'TRC-B1',
        diameterMm: '25.4',
        lengthMm: '2000',
        location: 'T',
      });
      ids.b1 = b1.id;
      const cut = await post(`/api/bar-pieces/${b1.id}/cuts`, { pieces: [{ lengthMm: '1000' }, { lengthMm: '997' }] });
      ids.b1a = cut[0].id;
      await post('/api/bar-pieces', {
        heatId: h2.id,
        markedHeatNumber: h2.heat_number,
        tag: 'TRC-B2',
        diameterMm: '25.4',
        lengthMm: '1000',
        location: 'T',
      });
      const part = await post('/api/parts', {
        partNumber: 'TRC-PART',
        revision: 'A',
        description: 'Trace test part',
        gtin: '09521230000031',
        unitLengthMm: '40',
        cutoffAllowanceMm: '2',
        lotPattern: 'TR{SEQ:3}',
        contactCategory: 'general-tissue',
        specifications: [{ specId: 'ASTM F136' }],
        routing: [
          { kind: 'machining', name: 'Turn' },
          { kind: 'passivation', name: 'Passivate', processMethod: 'F86-NITRIC' },
        ],
      });
      ids.part = part.id;
      for (const [name, tag] of [
        ['L1', 'TRC-B1-A'],
        ['L2', 'TRC-B1-B'],
        ['L3', 'TRC-B2'],
      ] as const) {
        const opened = await post('/api/lots', { partId: part.id, plannedQty: 10 });
        lot[name] = { id: opened.id, lotNumber: opened.lotNumber };
        await post(`/api/lots/${opened.id}/material-issues`, { tag, lengthMm: '420' });
        await post(`/api/lots/${opened.id}/operations`, { ...times, stepNo: 10, qtyIn: 10, qtyGood: 10, qtyScrap: 0 });
      }
      const split = await post(`/api/lots/${lot.L1!.id}/splits`, { quantities: [4], reason: 'test split' });
      lot['L1-A'] = { id: split.children[0].id, lotNumber: split.children[0].lotNumber };
      const merged = await post('/api/lots/merges', { lotIds: [lot.L2!.id, lot.L3!.id], reason: 'test merge' });
      lot.M = { id: merged.id, lotNumber: merged.lotNumber };
      const parameters = {
        bath: 'T',
        acidConcentration: '30',
        temperature: '25',
        immersionTime: '35',
        rinseConductivity: '1',
      };
      const r1 = await post('/api/process-runs', {
        kind: 'passivation',
        methodId: 'F86-NITRIC',
        equipment: 'T1',
        operatorName: 'Test',
        runAt: '2026-11-21T08:00:00Z',
        parameters,
        lotIds: [lot.L1!.id, lot['L1-A']!.id],
      });
      const r2 = await post('/api/process-runs', {
        kind: 'passivation',
        methodId: 'F86-NITRIC',
        equipment: 'T1',
        operatorName: 'Test',
        runAt: '2026-11-21T09:00:00Z',
        parameters,
        lotIds: [lot.M!.id],
      });
      ids.r1 = r1.id;
      ids.r2 = r2.id;
    });
    afterAll(() => running.close());

    const backward = async (query: string) => (await auditor.get(`/api/trace/backward?${query}`)).body as BackwardTrace;
    const forward = async (query: string) => (await auditor.get(`/api/trace/forward?${query}`)).body as ForwardTrace;
    const numbers = (...names: string[]) => names.map((name) => lot[name]!.lotNumber).sort();

    it(
      '[TRACE-BACKWARD] when traced back from the split lot, then it reaches its parent, the cut piece and its ' +
        'bar, one heat and one run',
      async () => {
        const trace = await backward(`lot=${lot['L1-A']!.lotNumber}`);
        expect(trace.lots.map((entry) => entry.lotNumber).sort()).toEqual(numbers('L1', 'L1-A'));
        expect(trace.barPieces.map((piece) => piece.tag).sort()).toEqual(['TRC-B1', 'TRC-B1-A']);
        expect(trace.heats.map((heat) => heat.id)).toEqual([ids.h1]);
        expect(trace.runs.map((run) => run.id)).toEqual([ids.r1]);
        expect(trace.certificates.length).toBeGreaterThan(0);
        expect(trace.certificates.every((certificate) => /^[0-9a-f]{64}$/.test(certificate.sha256))).toBe(true);
      },
    );

    it('when traced back from the merged lot, then both heats and all three lots come back', async () => {
      const trace = await backward(`lot=${lot.M!.lotNumber}`);
      expect(trace.lots.map((entry) => entry.lotNumber).sort()).toEqual(numbers('L2', 'L3', 'M'));
      expect(trace.heats.map((heat) => heat.id).sort((a, b) => a - b)).toEqual(
        [ids.h1!, ids.h2!].sort((a, b) => a - b),
      );
      expect(trace.barPieces.map((piece) => piece.tag).sort()).toEqual(['TRC-B1', 'TRC-B1-B', 'TRC-B2']);
      expect(trace.runs.map((run) => run.id)).toEqual([ids.r2]);
    });

    it(
      '[TRACE-UDI] when traced back from a scanned UDI or a Digital Link, then the same lot is found; a bad check ' +
        'digit is refused',
      async () => {
        expect(
          (await backward(`udi=${encodeURIComponent(`(01)09521230000031(10)${lot['L1-A']!.lotNumber}`)}`)).start,
        ).toBe(`UDI (01)09521230000031(10)${lot['L1-A']!.lotNumber}`);
        expect(
          (await backward(`udi=${encodeURIComponent(`https://id.gs1.org/01/09521230000031/10/${lot.M!.lotNumber}`)}`))
            .lots,
        ).toHaveLength(3);
        const bad = await auditor.get(`/api/trace/backward?udi=${encodeURIComponent('(01)09521230000032(10)X')}`);
        expect(bad.status).toBe(400);
        expect(bad.body.error.fields).toEqual({ udi: 'AI 01 (GTIN): the check digit should be 1' });
        // Found by the hostile-input fuzzing: a lot number outside GS1's characters was a 500.
        const foreign = await auditor.get(`/api/trace/backward?lot=${encodeURIComponent('¡')}`);
        expect(foreign.status).toBe(400);
        expect(foreign.body.error.fields).toEqual({ 'query.lot': '“¡” cannot be used in a GS1 lot number' });
      },
    );

    it(
      '[TRACE-SCANNER] when a scanner sends a symbology identifier or a leading GS before the UDI, then the same ' +
        'lot is found',
      async () => {
        const raw = `0109521230000031` + `10${lot['L1-A']!.lotNumber}`;
        for (const sent of [`]d2${raw}`, `]C1${raw}`, `\u001d${raw}`, `]Q3${raw}`]) {
          expect(
            (await backward(`udi=${encodeURIComponent(sent)}`)).lots.map((entry) => entry.lotNumber),
            JSON.stringify(sent),
          ).toContain(lot['L1-A']!.lotNumber);
        }
      },
    );

    it(
      '[TRACE-STARTS] when part of a heat number, bar tag, run number, supplier name, part number or GTIN is ' +
        'typed, then the matching starts come back named, each with its record behind it',
      async () => {
        const [heat] = await running.database.dataSource.query('SELECT heat_number FROM heat WHERE id = ?', [ids.h1]);
        const starts = async (q: string) =>
          (await auditor.get(`/api/trace/starts?q=${encodeURIComponent(q)}`)).body as Array<{
            kind: string;
            id: number;
            label: string;
            detail: string;
          }>;
        const byHeat = await starts(heat.heat_number.slice(0, -1));
        expect(byHeat).toContainEqual(
          expect.objectContaining({
            kind: 'heat',
            id: ids.h1,
            label: heat.heat_number,
            detail: expect.stringMatching(/^Heat from .+ · ASTM F136$/),
          }),
        );
        expect(await starts('TRC-B1')).toContainEqual(
          expect.objectContaining({
            kind: 'piece',
            id: ids.b1,
            label: 'TRC-B1',
            detail: `Bar of heat ${heat.heat_number}`,
          }),
        );
        const [run] = await running.database.dataSource.query('SELECT run_number FROM process_run WHERE id = ?', [
          ids.r1,
        ]);
        expect(await starts(run.run_number)).toContainEqual(
          expect.objectContaining({ kind: 'run', id: ids.r1, detail: 'Passivation run · F86-NITRIC' }),
        );
        expect(
          (await starts('nordvik')).some((start) => start.kind === 'supplier' && /^Supplier, /.test(start.detail)),
        ).toBe(true);
        // LIKE's own characters are searched for as typed, not as wildcards.
        // A part by number or GTIN: as GTIN-14, as the GTIN-13 printed under an EAN-13 bar code (the
        // leading zero dropped, GS1 General Specifications §3.3.2), and as a bracketed element string.
        const isPart = (found: Array<{ kind: string; id: number }>) =>
          found.some((start) => start.kind === 'part' && start.id === ids.part);
        expect(await starts('TRC-PART')).toContainEqual(
          expect.objectContaining({
            kind: 'part',
            id: ids.part,
            label: 'TRC-PART rev A',
            detail: 'Part · Trace test part · GTIN 09521230000031',
          }),
        );
        expect(isPart(await starts('09521230000031'))).toBe(true);
        expect(isPart(await starts('9521230000031'))).toBe(true);
        expect(isPart(await starts('(01)09521230000031'))).toBe(true);
        // A neighbouring GTIN (last digit off by one) is a different trade item and must not match.
        expect(isPart(await starts('9521230000032'))).toBe(false);
        expect(await starts('%')).toEqual([]);
        expect(await starts('_')).toEqual([]);
        expect((await auditor.get('/api/trace/starts?q=')).status).toBe(400);
      },
    );

    it(
      '[TRACE-FORWARD] when traced forward from each heat, piece, run and part, then exactly the lots written out ' +
        'by hand are affected',
      async () => {
        const lotsOf = async (query: string) => (await forward(query)).lots.map((entry) => entry.lotNumber).sort();
        expect(
          (await lotsOf(`heatId=${ids.h1}`)).filter((number) =>
            numbers('L1', 'L1-A', 'L2', 'L3', 'M').includes(number),
          ),
        ).toEqual(numbers('L1', 'L1-A', 'L2', 'M'));
        expect(
          (await lotsOf(`heatId=${ids.h2}`)).filter((number) =>
            numbers('L1', 'L1-A', 'L2', 'L3', 'M').includes(number),
          ),
        ).toEqual(numbers('L3', 'M'));
        expect(await lotsOf(`pieceId=${ids.b1a}`)).toEqual(numbers('L1', 'L1-A'));
        expect(await lotsOf(`pieceId=${ids.b1}`)).toEqual(numbers('L1', 'L1-A', 'L2', 'M'));
        expect(await lotsOf(`runId=${ids.r1}`)).toEqual(numbers('L1', 'L1-A'));
        expect(await lotsOf(`runId=${ids.r2}`)).toEqual(numbers('M'));
        // Every lot made as the part, including those split and merged from its lots.
        expect(await lotsOf(`partId=${ids.part}`)).toEqual(numbers('L1', 'L1-A', 'L2', 'L3', 'M'));
        expect((await forward(`partId=${ids.part}`)).start).toBe('part TRC-PART (GTIN 09521230000031)');
        const refused = await auditor.get(`/api/trace/forward?heatId=${ids.h1}&runId=${ids.r1}`);
        expect(refused.status).toBe(400);
      },
    );

    it(
      '[TRACE-UNITS-ONCE] when traced forward, then a unit passed on to a split or merged lot is counted once in ' +
        'the units made',
      async () => {
        // Worked by hand: L1 started 10 and passed 4 to L1-A (6 + 4 = 10, not 14); L2 passed its 10 to
        // M, which holds them with L3's 10 (6 + 4 + 0 + 20 = 30, not 44).
        expect((await forward(`pieceId=${ids.b1a}`)).totals.made).toBe(10);
        expect((await forward(`pieceId=${ids.b1}`)).totals.made).toBe(30);
        expect((await forward(`runId=${ids.r2}`)).totals.made).toBe(20);
      },
    );

    it(
      '[TRACE-IN-PLANT] when traced forward, then units in plant count an open lot’s work in progress, and none ' +
        'for a lot merged away',
      async () => {
        // Worked by hand: L1 holds 10 − 4 split off = 6; L1-A 4; L2 passed all 10 into M (consumed: 0); M holds 20.
        const inPlant = Object.fromEntries(
          (await forward(`pieceId=${ids.b1}`)).lots.map((entry) => [entry.lotNumber, [entry.status, entry.onHand]]),
        );
        expect(inPlant).toEqual({
          [lot.L1!.lotNumber]: ['open', 6],
          [lot['L1-A']!.lotNumber]: ['open', 4],
          [lot.L2!.lotNumber]: ['consumed', 0],
          [lot.M!.lotNumber]: ['open', 20],
        });
        expect((await forward(`pieceId=${ids.b1}`)).totals.onHand).toBe(30);
      },
    );

    it(
      'when traced forward from a supplier, then every lot of each of its heats is affected, and the heats kept ' +
        'per lot are what a walk of the genealogy finds',
      async () => {
        const db = running.database.dataSource;
        const [{ supplier_id: supplierId }] = await db.query('SELECT supplier_id FROM heat WHERE id = ?', [ids.h1]);
        const heatsOfSupplier: Array<{ id: number }> = await db.query('SELECT id FROM heat WHERE supplier_id = ?', [
          supplierId,
        ]);
        const expected = new Set<string>();
        for (const heat of heatsOfSupplier)
          for (const entry of (await forward(`heatId=${heat.id}`)).lots) expected.add(entry.lotNumber);
        const fromSupplier = (await forward(`supplierId=${supplierId}`)).lots.map((entry) => entry.lotNumber);
        expect(fromSupplier.sort()).toEqual([...expected].sort());
        expect(fromSupplier).toEqual(expect.arrayContaining(numbers('L1', 'L1-A', 'L2', 'M')));
        // lot_heat is written by issue, split and merge; the recursive walk is the definition it must match.
        const kept = await db.query('SELECT heat_id, lot_id FROM lot_heat ORDER BY heat_id, lot_id');
        const walked = await db.query(
          `SELECT heat_id, lot_id FROM (${derivedLotHeatsSql}) AS walked ORDER BY heat_id, lot_id`,
        );
        expect(kept.length).toBeGreaterThan(5);
        expect(kept).toEqual(walked);
      },
    );

    it('when drawn as a graph from the merged lot, then the links are exactly the ones built by hand', async () => {
      const graph = (await auditor.get(`/api/trace/backward/graph?lot=${lot.M!.lotNumber}`)).body as GenealogyGraph & {
        tooLarge: boolean;
        lots: number;
      };
      expect(graph.tooLarge).toBe(false);
      expect(graph.lots).toBe(3);
      const name = new Map(graph.nodes.map((node) => [node.id, node.label]));
      const links = graph.edges.map((edge) => `${name.get(edge.from)} -${edge.kind}-> ${name.get(edge.to)}`).sort();
      const [b1, b2] = (await running.database.dataSource.query(
        "SELECT tag FROM bar_piece WHERE tag IN ('TRC-B1', 'TRC-B2') ORDER BY tag",
      )) as Array<{ tag: string }>;
      const heats = (await running.database.dataSource.query(
        'SELECT h.id, h.heat_number, s.name FROM heat h JOIN supplier s ON s.id = h.supplier_id WHERE h.id IN (?, ?)',
        [ids.h1, ids.h2],
      )) as Array<{ id: number; heat_number: string; name: string }>;
      const heat = (id: number) => heats.find((row) => row.id === id)!;
      const run = (await auditor.get(`/api/process-runs/${ids.r2}`)).body.runNumber as string;
      expect(links).toEqual(
        [
          `${heat(ids.h1!).name} -melted-> Heat ${heat(ids.h1!).heat_number}`,
          `${heat(ids.h2!).name} -melted-> Heat ${heat(ids.h2!).heat_number}`,
          `Heat ${heat(ids.h1!).heat_number} -cut-> Bar ${b1!.tag}`,
          `Heat ${heat(ids.h2!).heat_number} -cut-> Bar ${b2!.tag}`,
          'Bar TRC-B1 -cut-> Bar TRC-B1-B',
          `Bar TRC-B1-B -issued-> Lot ${lot.L2!.lotNumber}`,
          `Bar TRC-B2 -issued-> Lot ${lot.L3!.lotNumber}`,
          `Lot ${lot.L2!.lotNumber} -merged-> Lot ${lot.M!.lotNumber}`,
          `Lot ${lot.L3!.lotNumber} -merged-> Lot ${lot.M!.lotNumber}`,
          `Lot ${lot.M!.lotNumber} -ran-> Run ${run}`,
        ].sort(),
      );
      expect(graph.nodes.filter((node) => node.kind === 'supplier')).toHaveLength(
        new Set(heats.map((row) => row.name)).size,
      );
      const forwardGraph = (await auditor.get(`/api/trace/forward/graph?runId=${ids.r1}`)).body as GenealogyGraph;
      expect(
        forwardGraph.nodes
          .filter((node) => node.kind === 'lot')
          .map((node) => node.label)
          .sort(),
      ).toEqual(numbers('L1', 'L1-A').map((number) => `Lot ${number}`));
    });
  },
);

describe('genealogy consistency over the demo production (property)', () => {
  const running = createTestApp();
  afterAll(() => running.close());

  it(
    '[TRACE-CONSISTENT] when any lot is traced back, then it is in the forward trace of each heat and run in ' +
      'its backward trace',
    async () => {
      const saml = await SamlTestDriver.create(running.config);
      const { agent } = await saml.signIn(running.app, 'kiw-0501');
      const lotNumbers: string[] = (
        await running.database.dataSource.query(
          "SELECT lot_number FROM production_lot WHERE lot_number NOT LIKE 'T%' ORDER BY id",
        )
      ).map((row: { lot_number: string }) => row.lot_number);
      await fc.assert(
        fc.asyncProperty(fc.constantFrom(...lotNumbers), async (lotNumber) => {
          const back = (await agent.get(`/api/trace/backward?lot=${lotNumber}`)).body as BackwardTrace;
          for (const heat of back.heats) {
            const ahead = (await agent.get(`/api/trace/forward?heatId=${heat.id}`)).body as ForwardTrace;
            expect(ahead.lots.map((entry) => entry.lotNumber)).toContain(lotNumber);
          }
          for (const run of back.runs) {
            const ahead = (await agent.get(`/api/trace/forward?runId=${run.id}`)).body as ForwardTrace;
            expect(ahead.lots.map((entry) => entry.lotNumber)).toContain(lotNumber);
          }
        }),
        { numRuns: 25 },
      );
    },
  );
});
