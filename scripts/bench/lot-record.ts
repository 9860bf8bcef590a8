// npm run bench:lot-record: how long the lot page's record takes to assemble and the lot list to
// page, on the demo scenario in a scratch database on the test profile's MariaDB, including a lot
// with 200 material records. Prints a table and, last, one JSON line.
import { loadConfig, loadDotEnv, testProfileEnvironment } from '../../server/src/config/env';
import { lotOpenSchema, materialMovementSchema } from '../../shared/schemas/manufacturing';
import { barReceiptSchema } from '../../shared/schemas/materials';
import { createDataSource } from '../../server/src/db/connection-options';
import { findPersonBySubject } from '../../server/src/modules/people/people.repository';
import { issueMaterial, listLots, openLot, returnMaterial } from '../../server/src/modules/manufacturing/lots.service';
import { lotDetail } from '../../server/src/modules/manufacturing/lot-detail.service';
import { bootstrapDatabase } from '../lib/bootstrap-database';
import { fail, log } from '../lib/run';
import { seedDemoScenario } from '../seed/demo-scenario';
import { seedDemoMaterials } from '../seed/demo-materials';
import { seedDemoManufacturing } from '../seed/demo-manufacturing';
import { seedDemoRelease } from '../seed/demo-release';
import { checkpointTriggers } from '../../server/src/modules/ledger/ledger-checkpoints';
import { receiveBar } from '../../server/src/modules/materials/bar-stock.service';
import { packetData, renderReleasePacket } from '../../server/src/modules/release/release-packet';

async function timed(runs: number, work: () => Promise<unknown>): Promise<{ medianMs: number; p95Ms: number }> {
  const samples: number[] = [];
  for (let run = 0; run < runs; run++) {
    const started = performance.now();
    await work();
    samples.push(performance.now() - started);
  }
  samples.sort((a, b) => a - b);
  return {
    medianMs: Math.round(samples[Math.floor(runs / 2)]! * 10) / 10,
    p95Ms: Math.round(samples[Math.floor(runs * 0.95)]! * 10) / 10,
  };
}

async function main(): Promise<void> {
  loadDotEnv();
  Object.assign(process.env, testProfileEnvironment(), { DB_NAME: 'ingotrace_bench_lots' });
  const config = loadConfig();
  const server = await bootstrapDatabase(config, { reset: true, relaxedDurability: true });
  const dataSource = createDataSource(config, 'app');
  await dataSource.initialize();
  try {
    log('seeding the demo scenario…');
    const seedStarted = performance.now();
    checkpointTriggers.onRelease = false;
    await seedDemoScenario(dataSource, config.roleMap);
    await seedDemoMaterials(dataSource);
    await seedDemoManufacturing(dataSource);
    await seedDemoRelease(dataSource);
    const seedSeconds = Math.round((performance.now() - seedStarted) / 100) / 10;
    const engineer = (await findPersonBySubject(dataSource.manager, 'kiw-0101'))!;
    const actor = { id: engineer.id, name: engineer.name, role: 'manufacturing-engineer' };
    const origin = { requestId: 'bench', clientAddress: null };
    const [{ id: partId }] = await dataSource.query("SELECT id FROM part WHERE part_number = 'KIW-CS35-40'");
    const [{ id: heatId, heat_number: heatNumber }] = await dataSource.query(
      "SELECT id, heat_number FROM heat WHERE status = 'accepted' AND spec_id = 'ASTM F136' ORDER BY id LIMIT 1",
    );
    await receiveBar(
      dataSource,
      barReceiptSchema.parse({
        heatId,
        markedHeatNumber: heatNumber,
        tag: 'BENCH-BAR-1',
        diameterMm: '25.4',
        lengthMm: '3000',
        location: 'bench',
      }),
      engineer,
      actor,
      origin,
    );
    const big = await openLot(dataSource, lotOpenSchema.parse({ partId, plannedQty: 40 }), engineer, actor, origin);
    log('recording 200 material movements on one lot…');
    for (let index = 0; index < 100; index++) {
      await issueMaterial(
        dataSource,
        big.id,
        materialMovementSchema.parse({ tag: 'BENCH-BAR-1', lengthMm: '20' }),
        engineer,
        actor,
        origin,
      );
      await returnMaterial(
        dataSource,
        big.id,
        materialMovementSchema.parse({ tag: 'BENCH-BAR-1', lengthMm: '1.5' }),
        engineer,
        actor,
        origin,
      );
    }
    const [{ id: typical }] = await dataSource.query(
      'SELECT o.lot_id AS id FROM lot_operation o GROUP BY o.lot_id HAVING COUNT(*) = 6 ORDER BY o.lot_id LIMIT 1',
    );
    const [{ lots }] = await dataSource.query('SELECT COUNT(*) AS lots FROM production_lot');
    // The largest released demo lot by units; the first render also loads the fonts.
    const [largest] = await dataSource.query(
      "SELECT id, lot_number, released_qty FROM production_lot WHERE status = 'released' ORDER BY " +
        'released_qty DESC, id LIMIT 1',
    );
    const packet = async () => renderReleasePacket(await packetData(dataSource.manager, largest.id, config.PUBLIC_URL));
    const firstStarted = performance.now();
    const bytes = (await packet()).length;
    const packetFirstMs = Math.round(performance.now() - firstStarted);
    const figures = {
      lots: Number(lots),
      seedSeconds,
      typicalLotRecord: await timed(50, () => lotDetail(dataSource, typical)),
      lotWith200Records: await timed(50, () => lotDetail(dataSource, big.id)),
      lotListPage: await timed(50, () =>
        listLots(dataSource, { page: 1, pageSize: 20, sort: 'openedAt', order: 'desc' }),
      ),
      releasePacket: {
        lot: largest.lot_number as string,
        units: Number(largest.released_qty),
        bytes,
        firstMs: packetFirstMs,
        ...(await timed(10, packet)),
      },
    };
    process.stdout.write(`\ndemo scenario: ${figures.lots} lots, seeded in ${figures.seedSeconds} s\n`);
    process.stdout.write(
      `lot record, complete routing:   median ${figures.typicalLotRecord.medianMs} ms, p95 ` +
        `${figures.typicalLotRecord.p95Ms} ms\n`,
    );
    process.stdout.write(
      `lot record, 200 material rows:  median ${figures.lotWith200Records.medianMs} ms, p95 ` +
        `${figures.lotWith200Records.p95Ms} ms\n`,
    );
    process.stdout.write(
      `lot list, first page of 20:     median ${figures.lotListPage.medianMs} ms, p95 ` +
        `${figures.lotListPage.p95Ms} ms\n`,
    );
    process.stdout.write(
      `release packet, lot ${figures.releasePacket.lot} (${figures.releasePacket.units} units, ` +
        `${figures.releasePacket.bytes} bytes): first ${figures.releasePacket.firstMs} ms, then median ` +
        `${figures.releasePacket.medianMs} ms, p95 ${figures.releasePacket.p95Ms} ms\n`,
    );
    process.stdout.write(`${JSON.stringify(figures)}\n`);
  } finally {
    await dataSource.destroy();
    await server.adminSql('DROP DATABASE IF EXISTS `ingotrace_bench_lots`;');
    await server.stop();
  }
}

main().catch(fail('bench:lot-record'));
