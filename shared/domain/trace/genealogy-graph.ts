/**
 * The genealogy as a graph: suppliers → heats → bar pieces (and the pieces cut from them) → lots
 * (through splits and merges) → the runs they went through and the consignees they shipped to.
 * Built from plain relations so that it is tested without a database.
 */
export type GraphNodeKind = 'supplier' | 'heat' | 'piece' | 'lot' | 'run' | 'consignee';
export type GraphEdgeKind = 'melted' | 'cut' | 'issued' | 'split' | 'merged' | 'ran' | 'shipped';

export interface GraphNode {
  id: string;
  kind: GraphNodeKind;
  label: string;
  detail: string;
  /** The product page of the record, if it has one. */
  link: string | null;
  /** Something about the record needs attention: a heat not accepted, a run out of its window, a held lot. */
  flagged: boolean;
}

export interface GraphEdge {
  id: string;
  from: string;
  to: string;
  kind: GraphEdgeKind;
  label: string;
}

export interface GenealogyRelations {
  suppliers: Array<{ id: number; name: string }>;
  heats: Array<{ id: number; heatNumber: string; supplierId: number; status: string; specId: string }>;
  pieces: Array<{ id: number; tag: string; heatId: number; parentId: number | null }>;
  lots: Array<{ id: number; lotNumber: string; partNumber: string; status: string; held: boolean }>;
  lotLinks: Array<{ parentId: number; childId: number; kind: 'split' | 'merge'; qty: number }>;
  issues: Array<{ pieceId: number; lotId: number }>;
  runs: Array<{ id: number; runNumber: string; kind: string; inWindow: boolean }>;
  runLots: Array<{ runId: number; lotId: number }>;
  consignees: Array<{ id: number; name: string; country: string }>;
  shipments: Array<{ lotId: number; consigneeId: number; units: number }>;
}

export interface GenealogyGraph {
  nodes: GraphNode[];
  edges: GraphEdge[];
}

const key = (kind: GraphNodeKind, id: number) => `${kind}:${id}`;

export function genealogyGraph(relations: GenealogyRelations): GenealogyGraph {
  const nodes = new Map<string, GraphNode>();
  const add = (node: GraphNode) => nodes.set(node.id, node);
  for (const supplier of relations.suppliers)
    add({
      id: key('supplier', supplier.id),
      kind: 'supplier',
      label: supplier.name,
      detail: 'supplier',
      link: null,
      flagged: false,
    });
  for (const heat of relations.heats)
    add({
      id: key('heat', heat.id),
      kind: 'heat',
      label: `Heat ${heat.heatNumber}`,
      detail: `${heat.specId} · ${heat.status}`,
      link: `/heats/${heat.id}`,
      flagged: heat.status !== 'accepted',
    });
  for (const piece of relations.pieces)
    add({
      id: key('piece', piece.id),
      kind: 'piece',
      label: `Bar ${piece.tag}`,
      detail: piece.parentId ? 'cut piece' : 'bar',
      link: `/bar-stock/${piece.id}`,
      flagged: false,
    });
  for (const lot of relations.lots) {
    add({
      id: key('lot', lot.id),
      kind: 'lot',
      label: `Lot ${lot.lotNumber}`,
      detail: `${lot.partNumber} · ${lot.status}${lot.held ? ' · on hold' : ''}`,
      link: `/lots/${lot.id}`,
      flagged: lot.held,
    });
  }
  for (const run of relations.runs)
    add({
      id: key('run', run.id),
      kind: 'run',
      label: `Run ${run.runNumber}`,
      detail: `${run.kind}${run.inWindow ? '' : ' · outside its window'}`,
      link: `/process-runs/${run.id}`,
      flagged: !run.inWindow,
    });
  for (const consignee of relations.consignees)
    add({
      id: key('consignee', consignee.id),
      kind: 'consignee',
      label: consignee.name,
      detail: consignee.country,
      link: null,
      flagged: false,
    });

  const edges = new Map<string, GraphEdge>();
  const link = (from: string, to: string, kind: GraphEdgeKind, label: string) => {
    if (!nodes.has(from) || !nodes.has(to)) return;
    const id = `${from}>${to}`;
    const existing = edges.get(id);
    if (existing && kind === 'shipped') {
      // Several shipments of one lot to one consignee: one link with the total.
      existing.label = `${Number(existing.label.split(' ')[0]) + Number(label.split(' ')[0])} units`;
      return;
    }
    edges.set(id, { id, from, to, kind, label });
  };
  for (const heat of relations.heats) link(key('supplier', heat.supplierId), key('heat', heat.id), 'melted', 'melted');
  for (const piece of relations.pieces) {
    if (piece.parentId !== null) link(key('piece', piece.parentId), key('piece', piece.id), 'cut', 'cut');
    else link(key('heat', piece.heatId), key('piece', piece.id), 'cut', 'bar');
  }
  for (const issue of relations.issues) link(key('piece', issue.pieceId), key('lot', issue.lotId), 'issued', 'issued');
  for (const lotLink of relations.lotLinks) {
    const kind = lotLink.kind === 'merge' ? 'merged' : 'split';
    link(key('lot', lotLink.parentId), key('lot', lotLink.childId), kind, `${kind} · ${lotLink.qty} units`);
  }
  for (const runLot of relations.runLots) link(key('lot', runLot.lotId), key('run', runLot.runId), 'ran', 'ran in');
  for (const shipment of relations.shipments)
    link(key('lot', shipment.lotId), key('consignee', shipment.consigneeId), 'shipped', `${shipment.units} units`);
  return { nodes: [...nodes.values()], edges: [...edges.values()] };
}
