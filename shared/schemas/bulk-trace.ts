import { z } from 'zod';

const bulkLotSchema = z.object({
  id: z.number(),
  lotNumber: z.string(),
  partNumber: z.string(),
  gtin: z.string(),
  status: z.string(),
  onHold: z.boolean(),
  openRecalls: z.array(z.string()),
  heats: z.array(z.string()),
});

/** One line of a bulk trace: what was read and what it names. */
export const bulkTraceLineSchema = z.discriminatedUnion('outcome', [
  z.object({ line: z.number(), input: z.string(), outcome: z.literal('found'), lot: bulkLotSchema }),
  z.object({ line: z.number(), input: z.string(), outcome: z.literal('unknown'), reason: z.string() }),
  z.object({ line: z.number(), input: z.string(), outcome: z.literal('malformed'), reason: z.string() }),
]);

export const bulkTraceReplySchema = z.object({
  summary: z.object({
    lines: z.number(),
    found: z.number(),
    unknown: z.number(),
    malformed: z.number(),
    onHold: z.number(),
    inOpenRecall: z.number(),
  }),
  lines: z.array(bulkTraceLineSchema),
});
export type BulkTraceReply = z.infer<typeof bulkTraceReplySchema>;
