import { z } from 'zod';
import { lotNumberProblem } from '../domain/gs1/gtin';
import { checkedString } from './checked-string';

const id = z.coerce.number().int().positive().max(4_294_967_295);
const day = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'A date as YYYY-MM-DD');

/** Finding where a forward trace starts, by the numbers people hold: heat number, bar tag, run number, supplier name. */
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

export interface TracedLot {
  id: number;
  lotNumber: string;
  partNumber: string;
  status: string;
  origin: string;
  parents: string[];
  made: number | null;
  released: number;
  shipped: number;
  /** Released units not shipped: what is still on the shelf. */
  onHand: number;
}

export interface BackwardTrace {
  start: string;
  lots: TracedLot[];
  barPieces: Array<{ id: number; tag: string; heatId: number; parentTag: string | null }>;
  heats: Array<{
    id: number;
    heatNumber: string;
    status: string;
    specId: string;
    supplierId: number;
    supplier: string;
    approval: string;
    verdict: string | null;
  }>;
  certificates: Array<{ heatId: number; documentId: number; name: string; sha256: string }>;
  runs: Array<{ id: number; runNumber: string; kind: string; methodId: string; inWindow: boolean; runAt: string }>;
  nonconformances: Array<{
    id: number;
    ncNumber: string;
    subjectType: string;
    status: string;
    disposition: string | null;
  }>;
  signatures: Array<{
    recordType: string;
    recordId: string;
    meaning: string;
    manifestation: string;
    contentHash: string;
  }>;
}

export interface ForwardTrace {
  start: string;
  lots: TracedLot[];
  totals: { made: number; released: number; shipped: number; onHand: number };
  consignees: Array<{ id: number; name: string; kind: string; country: string; units: number; lots: number }>;
}
