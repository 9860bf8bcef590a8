import type { Response } from 'supertest';

/**
 * A part with two steps (turn, then final inspection at n = 5, Ac 0, Re 1), so that a lot can be
 * brought to "ready for release" in a few calls. Each test file gives its own number and GTIN.
 */
export function twoStepPart(own: { partNumber: string; description: string; gtin: string; lotPattern: string }) {
  return {
    ...own,
    revision: 'A',
    unitLengthMm: '30',
    cutoffAllowanceMm: '2',
    contactCategory: 'general-tissue',
    specifications: [{ specId: 'ASTM F136' }],
    routing: [
      { kind: 'machining', name: 'Turn' },
      { kind: 'inspection', name: 'Final inspection', sampleSize: 5, acceptNumber: 0, rejectNumber: 1 },
    ],
  };
}

const times = {
  operatorName: 'Test',
  workCentre: 'Cell 1',
  startedAt: '2026-11-20T08:00:00Z',
  endedAt: '2026-11-20T09:00:00Z',
};

/** Opens a lot of 20 from the bar, records both steps without loss and prints its 20 labels. */
export async function readyLotOf(
  post: (path: string, body: unknown) => Promise<Response>,
  partId: number,
  barTag: string,
): Promise<{ id: number; lotNumber: string }> {
  const lot = (await post('/api/lots', { partId, plannedQty: 20 })).body as { id: number; lotNumber: string };
  await post(`/api/lots/${lot.id}/material-issues`, { tag: barTag, lengthMm: '640' });
  await post(`/api/lots/${lot.id}/operations`, { ...times, stepNo: 10, qtyIn: 20, qtyGood: 20, qtyScrap: 0 });
  await post(`/api/lots/${lot.id}/operations`, {
    ...times,
    stepNo: 20,
    qtyIn: 20,
    qtyGood: 20,
    qtyScrap: 0,
    inspected: 5,
    defectsFound: 0,
  });
  await post(`/api/lots/${lot.id}/labels`, { kind: 'print', qty: 20 });
  return { id: lot.id, lotNumber: lot.lotNumber };
}
