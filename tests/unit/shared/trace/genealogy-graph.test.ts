import { describe, expect, it } from 'vitest';
import { genealogyGraph, type GenealogyRelations } from '@shared/domain/trace/genealogy-graph';

// The expected graphs are drawn by hand from the relations (common practice, no source).
const relations: GenealogyRelations = {
  suppliers: [{ id: 1, name: 'Mill A' }],
  heats: [{ id: 10, heatNumber: 'H-1', supplierId: 1, status: 'accepted', specId: 'ASTM F136' }],
  pieces: [
    { id: 100, tag: 'B1', heatId: 10, parentId: null },
    { id: 101, tag: 'B1-A', heatId: 10, parentId: 100 },
  ],
  lots: [
    { id: 1000, lotNumber: 'L1', partNumber: 'P', status: 'consumed', held: false },
    { id: 1001, lotNumber: 'L1-A', partNumber: 'P', status: 'released', held: true },
  ],
  lotLinks: [{ parentId: 1000, childId: 1001, kind: 'split', qty: 4 }],
  issues: [{ pieceId: 101, lotId: 1000 }],
  runs: [{ id: 7, runNumber: 'PV-1', kind: 'passivation', inWindow: false }],
  runLots: [{ runId: 7, lotId: 1001 }],
  consignees: [{ id: 3, name: 'Clinic', country: 'NO' }],
  shipments: [
    { lotId: 1001, consigneeId: 3, units: 2 },
    { lotId: 1001, consigneeId: 3, units: 1 },
    // A shipment of a lot outside the set draws nothing.
    { lotId: 9999, consigneeId: 3, units: 5 },
  ],
};

describe('the genealogy graph', () => {
  const graph = genealogyGraph(relations);

  it('when built, then every record is one node of its kind, flagged where it needs attention', () => {
    expect(graph.nodes.map((node) => [node.id, node.kind, node.flagged])).toEqual([
      ['supplier:1', 'supplier', false],
      ['heat:10', 'heat', false],
      ['piece:100', 'piece', false],
      ['piece:101', 'piece', false],
      ['lot:1000', 'lot', false],
      ['lot:1001', 'lot', true],
      ['run:7', 'run', true],
      ['consignee:3', 'consignee', false],
    ]);
    expect(graph.nodes.find((node) => node.id === 'lot:1001')?.detail).toBe('P · released · on hold');
  });

  it(
    'when built, then links run from the mill to the consignee, with the shipments of one lot to one consignee ' +
      'summed',
    () => {
      expect(graph.edges.map((edge) => [edge.from, edge.to, edge.kind, edge.label])).toEqual([
        ['supplier:1', 'heat:10', 'melted', 'melted'],
        ['heat:10', 'piece:100', 'cut', 'bar'],
        ['piece:100', 'piece:101', 'cut', 'cut'],
        ['piece:101', 'lot:1000', 'issued', 'issued'],
        ['lot:1000', 'lot:1001', 'split', 'split · 4 units'],
        ['lot:1001', 'run:7', 'ran', 'ran in'],
        ['lot:1001', 'consignee:3', 'shipped', '3 units'],
      ]);
    },
  );

  it('when a link names a record that is not in the set, then it is left out rather than drawn to nowhere', () => {
    const ids = new Set(graph.nodes.map((node) => node.id));
    expect(graph.edges.every((edge) => ids.has(edge.from) && ids.has(edge.to))).toBe(true);
  });
});
