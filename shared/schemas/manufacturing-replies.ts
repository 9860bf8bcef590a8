import { z } from 'zod';

// What the manufacturing record's writes answer (what the screens confirm to the person).

export const materialIssuedSchema = z.object({ tag: z.string(), heatNumber: z.string(), lengthMm: z.string() });
export const materialReturnedSchema = z.object({ tag: z.string(), lengthMm: z.string() });
export const operationRecordedSchema = z.object({
  id: z.number(),
  verdict: z.enum(['accept', 'reject']).nullable(),
  why: z.string().nullable(),
});
export const lotSplitSchema = z.object({
  children: z.array(z.object({ id: z.number(), lotNumber: z.string(), qty: z.number() })),
  remaining: z.number(),
});
export const lotsMergedSchema = z.object({ id: z.number(), lotNumber: z.string(), qty: z.number() });
export const shipmentRecordedSchema = z.object({
  id: z.number(),
  lot: z.string(),
  consignee: z.string(),
  qty: z.number(),
  remaining: z.number(),
});
export const consigneeSchema = z.object({
  id: z.number(),
  name: z.string(),
  kind: z.string(),
  country: z.string(),
  contactEmail: z.string().nullable(),
  shipments: z.number(),
});
export type Consignee = z.infer<typeof consigneeSchema>;
export const operationFileAttachedSchema = z.object({
  documentId: z.number(),
  name: z.string(),
  sha256: z.string(),
  mediaType: z.string(),
});
