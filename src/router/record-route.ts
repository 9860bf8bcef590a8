import type { RouteLocationNamedRaw } from 'vue-router';

/** The record pages and the parameter each takes: a typo in a name or a parameter fails to compile. */
export const recordRouteParams = {
  heat: 'heatId',
  'bar-piece': 'pieceId',
  lot: 'lotId',
  supplier: 'supplierId',
  'process-run': 'runId',
  nonconformance: 'ncId',
  recall: 'recallId',
} as const;
export type RecordRouteName = keyof typeof recordRouteParams;

/** Where a record's page is, by route name: `router.push(recordRoute('lot', { lotId }))`. */
export function recordRoute<Name extends RecordRouteName>(
  name: Name,
  params: Record<(typeof recordRouteParams)[Name], number>,
): RouteLocationNamedRaw {
  return { name, params: Object.fromEntries(Object.entries(params).map(([key, value]) => [key, String(value)])) };
}
