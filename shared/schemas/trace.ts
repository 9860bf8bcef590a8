import { z } from 'zod';
import { lotNumberProblem } from '../domain/gs1/gtin';
import { checkedString } from './checked-string';
import type { GraphEdge, GraphNode } from '../domain/trace/genealogy-graph';

const id = z.coerce.number().int().positive().max(4_294_967_295);
const day = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'A date as YYYY-MM-DD');

/**
 * Finding where a forward trace starts, by the numbers people hold: heat number, bar tag, run number, supplier name.
 */
export const traceStartQuerySchema = z.object({
  q: z
    .string()
    .trim()
    .min(1, 'Type part of a heat number, bar tag, run number, supplier name, part number or GTIN')
    .max(60),
});
export const traceStartKinds = ['heat', 'piece', 'run', 'supplier', 'part'] as const;
export const traceStartSchema = z.object({
  kind: z.enum(traceStartKinds),
  id: z.number().int(),
  label: z.string(),
  detail: z.string(),
});
export type TraceStart = z.infer<typeof traceStartSchema>;
export const traceStartsSchema = z.array(traceStartSchema);

export const backwardQuerySchema = z
  .object({
    udi: z.string().trim().min(1).max(300).optional(),
    // Lot numbers are stored as GS1 AI 10 allows them; anything else cannot name a lot.
    lot: checkedString(z.string().trim(), lotNumberProblem).optional(),
    tag: z.string().trim().min(3).max(40).optional(),
  })
  .refine((query) => Boolean(query.udi ?? query.lot ?? query.tag), {
    message: 'Give a UDI, a lot number or a bar tag',
    path: ['udi'],
  });
export type BackwardQuery = z.infer<typeof backwardQuerySchema>;

export const forwardQuerySchema = z
  .object({
    heatId: id.optional(),
    pieceId: id.optional(),
    runId: id.optional(),
    supplierId: id.optional(),
    partId: id.optional(),
    from: day.optional(),
    to: day.optional(),
  })
  .refine(
    (query) =>
      [query.heatId, query.pieceId, query.runId, query.supplierId, query.partId].filter((value) => value !== undefined)
        .length === 1,
    {
      message: 'Start from exactly one of a heat, a bar piece, a run, a supplier or a part',
      path: ['heatId'],
    },
  );
export type ForwardStart = z.infer<typeof forwardQuerySchema>;

export const tracedLotSchema = z.object({
  id: z.number(),
  lotNumber: z.string(),
  partNumber: z.string(),
  status: z.string(),
  origin: z.string(),
  parents: z.array(z.string()),
  made: z.number().nullable(),
  released: z.number(),
  shipped: z.number(),
  /** Released units not shipped: what is still on the shelf. */
  onHand: z.number(),
});
export type TracedLot = z.infer<typeof tracedLotSchema>;

export const backwardTraceSchema = z.object({
  start: z.string(),
  lots: z.array(tracedLotSchema),
  barPieces: z.array(
    z.object({ id: z.number(), tag: z.string(), heatId: z.number(), parentTag: z.string().nullable() }),
  ),
  heats: z.array(
    z.object({
      id: z.number(),
      heatNumber: z.string(),
      status: z.string(),
      specId: z.string(),
      supplierId: z.number(),
      supplier: z.string(),
      approval: z.string(),
      verdict: z.string().nullable(),
    }),
  ),
  certificates: z.array(z.object({ heatId: z.number(), documentId: z.number(), name: z.string(), sha256: z.string() })),
  runs: z.array(
    z.object({
      id: z.number(),
      runNumber: z.string(),
      kind: z.string(),
      methodId: z.string(),
      inWindow: z.boolean(),
      runAt: z.string(),
    }),
  ),
  nonconformances: z.array(
    z.object({
      id: z.number(),
      ncNumber: z.string(),
      subjectType: z.string(),
      status: z.string(),
      disposition: z.string().nullable(),
    }),
  ),
  signatures: z.array(
    z.object({
      recordType: z.string(),
      recordId: z.string(),
      meaning: z.string(),
      manifestation: z.string(),
      contentHash: z.string(),
    }),
  ),
});
export type BackwardTrace = z.infer<typeof backwardTraceSchema>;

export const traceConsigneeSchema = z.object({
  id: z.number(),
  name: z.string(),
  kind: z.string(),
  country: z.string(),
  units: z.number(),
  lots: z.number(),
});

export const forwardTraceSchema = z.object({
  start: z.string(),
  lots: z.array(tracedLotSchema),
  totals: z.object({ made: z.number(), released: z.number(), shipped: z.number(), onHand: z.number() }),
  consignees: z.array(traceConsigneeSchema),
});
export type ForwardTrace = z.infer<typeof forwardTraceSchema>;

const graphNodeSchema = z.object({
  id: z.string(),
  kind: z.enum(['supplier', 'heat', 'piece', 'lot', 'run', 'consignee']),
  label: z.string(),
  detail: z.string(),
  link: z.string().nullable(),
  flagged: z.boolean(),
}) satisfies z.ZodType<GraphNode>;

const graphEdgeSchema = z.object({
  id: z.string(),
  from: z.string(),
  to: z.string(),
  kind: z.enum(['melted', 'cut', 'issued', 'split', 'merged', 'ran', 'shipped']),
  label: z.string(),
}) satisfies z.ZodType<GraphEdge>;

/** A trace drawn as a graph; beyond the drawing's limit, only the count of lots. */
export const graphReplySchema = z.object({
  start: z.string(),
  lots: z.number(),
  tooLarge: z.boolean(),
  nodes: z.array(graphNodeSchema),
  edges: z.array(graphEdgeSchema),
});
export type GraphReply = z.infer<typeof graphReplySchema>;
