import { z } from 'zod';

export const findingKinds = [
  'identical-results',
  'near-identical-results',
  'bunched-at-limit',
  'same-document',
  'precision-change',
] as const;

export const findingKindLabels: Record<(typeof findingKinds)[number], string> = {
  'identical-results': 'Identical results',
  'near-identical-results': 'Results identical but for one value',
  'bunched-at-limit': 'Values bunched just inside a limit',
  'same-document': 'One certificate document for several heats',
  'precision-change': 'Reported precision changed',
};

export const screeningFindingSchema = z.object({
  kind: z.enum(findingKinds),
  key: z.string(),
  heatNumbers: z.array(z.string()),
  property: z.string().optional(),
  explanation: z.string(),
  statistic: z.object({ name: z.string(), value: z.number(), threshold: z.number() }).optional(),
  acknowledgement: z.object({ by: z.string(), at: z.string(), reason: z.string() }).nullable(),
});
export type ScreeningFinding = z.infer<typeof screeningFindingSchema>;

/** The findings that involve one heat, from screening all heats of its supplier and specification. */
export const heatScreeningSchema = z.object({
  heatsScreened: z.number().int(),
  findings: z.array(screeningFindingSchema),
});
export type HeatScreening = z.infer<typeof heatScreeningSchema>;

/**
 * Every specification and grade a supplier delivers, screened; each finding with its heats and their acknowledgement.
 */
export const supplierScreeningSchema = z.object({
  supplier: z.object({
    id: z.number().int(),
    name: z.string(),
    country: z.string(),
    approval: z.enum(['approved', 'conditional', 'disqualified']),
  }),
  groups: z.array(
    z.object({
      specId: z.string(),
      grade: z.string().nullable(),
      heatsScreened: z.number().int(),
      findings: z.array(
        screeningFindingSchema.omit({ heatNumbers: true, acknowledgement: true }).extend({
          heats: z.array(z.object({ id: z.number().int(), heatNumber: z.string(), acknowledged: z.boolean() })),
        }),
      ),
    }),
  ),
});
export type SupplierScreening = z.infer<typeof supplierScreeningSchema>;

export const screeningAcknowledgementSchema = z.object({
  findingKey: z.string().trim().min(1, 'Choose the finding').max(160),
  reason: z.string().trim().min(10, 'Say what you checked, in at least 10 characters').max(1000),
});
export type ScreeningAcknowledgementInput = z.input<typeof screeningAcknowledgementSchema>;
