import { beforeAll, describe, expect, it } from 'vitest';
import type { z } from 'zod';
import {
  lotDetailSchema,
  nonconformanceSummarySchema,
  processRunDetailSchema,
  processRunSummarySchema,
} from '@shared/schemas/lot-detail';
import { consigneeSchema } from '@shared/schemas/manufacturing-replies';
import { lotPageSchema } from '@shared/schemas/manufacturing';
import { pageOf } from '@shared/schemas/page';
import { drillReportSchema, recallDetailSchema, recallPageSchema } from '@shared/schemas/recall';
import { releaseQueuePageSchema, releaseViewSchema } from '@shared/schemas/release';
import { backwardTraceSchema, forwardTraceSchema, graphReplySchema } from '@shared/schemas/trace';
import { specificationLibrarySchema } from '@shared/schemas/specification';
import { createTestApp } from '../helpers/test-app';
import { SamlTestDriver } from '../helpers/saml-round-trip';

type Agent = Awaited<ReturnType<SamlTestDriver['signIn']>>['agent'];

// The client parses every reply through these schemas; here the running server's replies on the
// demo records are held to them, so that a field the server drops or renames fails a test, not a screen.
describe('response contracts', () => {
  const running = createTestApp();
  let auditor: Agent;
  const ids: Record<string, number> = {};

  beforeAll(async () => {
    const saml = await SamlTestDriver.create(running.config);
    auditor = (await saml.signIn(running.app, 'kiw-0401')).agent;
    const db = await running.database.connect();
    const one = async (sql: string) => Number(((await db.query(sql)) as Array<{ id: number }>)[0]!.id);
    ids.releasedLot = await one("SELECT id FROM production_lot WHERE status = 'released' ORDER BY id LIMIT 1");
    ids.heat = await one("SELECT id FROM heat WHERE status = 'accepted' ORDER BY id LIMIT 1");
    ids.run = await one('SELECT id FROM process_run ORDER BY id LIMIT 1');
    ids.nonconformance = await one('SELECT id FROM nonconformance ORDER BY id LIMIT 1');
    ids.drill = await one("SELECT id FROM recall_investigation WHERE mode = 'drill' ORDER BY id LIMIT 1");
  });

  async function replyTo<Schema extends z.ZodType>(path: string, schema: Schema) {
    const response = await auditor.get(path);
    expect(response.status, path).toBe(200);
    const parsed = schema.safeParse(response.body);
    expect(parsed.success ? [] : parsed.error.issues.slice(0, 5), path).toEqual([]);
    return parsed.data as z.infer<Schema>;
  }

  it('[CONTRACT-LOTS] the lot list, a lot, process runs and nonconformances answer as their schemas say', async () => {
    expect((await replyTo('/api/lots', lotPageSchema)).items.length).toBeGreaterThan(0);
    const lot = await replyTo(`/api/lots/${ids.releasedLot}`, lotDetailSchema);
    expect(lot.operations.length).toBeGreaterThan(0);
    await replyTo('/api/process-runs', pageOf(processRunSummarySchema));
    await replyTo(`/api/process-runs/${ids.run}`, processRunDetailSchema);
    await replyTo('/api/nonconformances', pageOf(nonconformanceSummarySchema));
    await replyTo(`/api/nonconformances/${ids.nonconformance}`, nonconformanceSummarySchema);
    await replyTo('/api/consignees', consigneeSchema.array());
    const library = await replyTo('/api/specifications', specificationLibrarySchema);
    expect(library.specifications.map((specification) => specification.id)).toContain('ASTM F136');
  });

  it('[CONTRACT-TRACE] backward, forward and graph traces answer as their schemas say', async () => {
    const lot = await replyTo(`/api/lots/${ids.releasedLot}`, lotDetailSchema);
    const backward = await replyTo(`/api/trace/backward?lot=${encodeURIComponent(lot.lotNumber)}`, backwardTraceSchema);
    expect(backward.heats.length).toBeGreaterThan(0);
    expect((await replyTo(`/api/trace/forward?heatId=${ids.heat}`, forwardTraceSchema)).lots.length).toBeGreaterThan(0);
    await replyTo(`/api/trace/forward/graph?heatId=${ids.heat}`, graphReplySchema);
  });

  it(
    '[CONTRACT-RELEASE-RECALL] the release view and desk, recalls and a drill report answer as their schemas ' + 'say',
    async () => {
      const view = await replyTo(`/api/lots/${ids.releasedLot}/release`, releaseViewSchema);
      expect(view.status).toBe('released');
      await replyTo('/api/release-queue?queue=released', releaseQueuePageSchema);
      expect((await replyTo('/api/recalls', recallPageSchema)).items.length).toBeGreaterThan(0);
      await replyTo(`/api/recalls/${ids.drill}`, recallDetailSchema);
      await replyTo(`/api/recalls/${ids.drill}/drill-report`, drillReportSchema);
    },
  );

  it('[CONTRACT-REFUSES] a reply missing a field the schema requires does not pass', async () => {
    const lot = (await auditor.get(`/api/lots/${ids.releasedLot}`)).body as Record<string, unknown>;
    const { unitChain: _dropped, ...withoutChain } = lot;
    expect(lotDetailSchema.safeParse(withoutChain).success).toBe(false);
    expect(lotDetailSchema.safeParse({ ...lot, status: 'shipped-somewhere' }).success).toBe(false);
  });
});
