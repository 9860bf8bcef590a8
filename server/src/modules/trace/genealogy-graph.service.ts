import type { DataSource, EntityManager } from 'typeorm';
import { genealogyGraph } from '@shared/domain/trace/genealogy-graph';
import type { BackwardQuery, ForwardStart, GraphReply } from '@shared/schemas/trace';
import { relationsOfLots } from './genealogy-graph.repository';
import { backwardTrace, forwardTraceIn } from './trace.service';

/** Beyond this many lots a drawing stops helping; the table view shows the same data. */
export const GRAPH_LOT_LIMIT = 400;

async function graphOf(manager: EntityManager, start: string, lotIds: number[]): Promise<GraphReply> {
  if (lotIds.length > GRAPH_LOT_LIMIT) return { start, lots: lotIds.length, tooLarge: true, nodes: [], edges: [] };
  return { start, lots: lotIds.length, tooLarge: false, ...genealogyGraph(await relationsOfLots(manager, lotIds)) };
}

export async function backwardGraph(dataSource: DataSource, query: BackwardQuery): Promise<GraphReply> {
  const trace = await backwardTrace(dataSource, query);
  return graphOf(
    dataSource.manager,
    trace.start,
    trace.lots.map((lot) => lot.id),
  );
}

export async function forwardGraph(dataSource: DataSource, start: ForwardStart): Promise<GraphReply> {
  const trace = await forwardTraceIn(dataSource.manager, start);
  return graphOf(
    dataSource.manager,
    trace.start,
    trace.lots.map((lot) => lot.id),
  );
}
