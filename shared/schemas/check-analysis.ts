import { z } from 'zod';
import { reasonSchema } from './people';

export const checkItemVerdicts = ['within-limit', 'within-tolerance', 'beyond-tolerance', 'not-measured'] as const;

export const checkEvaluationSchema = z.object({
  verdict: z.enum(['conforms', 'does-not-conform']),
  items: z.array(
    z.object({
      element: z.string(),
      value: z.string().nullable(),
      rounded: z.string().nullable(),
      heatLimit: z.string(),
      checkLimit: z.string(),
      verdict: z.enum(checkItemVerdicts),
      note: z.string().optional(),
    }),
  ),
});

export const checkRuleSettingsSchema = z.object({
  everyNthHeat: z.number().int().min(1).max(1000).nullable(),
  everyHeatWhenConditional: z.boolean(),
});

/** A rule in force, with the scope it was set for (null: any) and who set it. */
export const checkRuleSchema = checkRuleSettingsSchema.extend({
  id: z.number().int(),
  supplierId: z.number().int().nullable(),
  supplierName: z.string().nullable(),
  specId: z.string().nullable(),
  reason: z.string(),
  setBy: z.string(),
  setAt: z.string(),
});
export type CheckRuleView = z.infer<typeof checkRuleSchema>;

export const checkRuleInputSchema = z
  .object({
    supplierId: z.number().int().positive().max(4_294_967_295).nullable(),
    specId: z.string().trim().min(1).max(40).nullable(),
    everyNthHeat: z
      .number({ message: 'A whole number of heats, or none' })
      .int('A whole number of heats')
      .min(1, 'At least 1')
      .max(1000, 'At most 1000')
      .nullable(),
    everyHeatWhenConditional: z.boolean({ message: 'Say whether every heat from a conditional supplier is checked' }),
    reason: reasonSchema,
  })
  .strict();
export type CheckRuleInput = z.input<typeof checkRuleInputSchema>;

export const checkAnalysisInputSchema = z
  .object({
    laboratory: z.string().trim().min(2, 'Name the laboratory').max(160),
    reportReference: z.string().trim().min(1, 'Give the laboratory report’s reference').max(80),
    chemistry: z.record(
      z.string().regex(/^[A-Z][a-z]?$/, 'An element symbol such as O or Fe'),
      z.union([z.string().trim().min(1).max(40), z.number()]),
    ),
  })
  .strict();
export type CheckAnalysisInput = z.input<typeof checkAnalysisInputSchema>;

export const checkAnalysisRecordSchema = z.object({
  id: z.number().int(),
  laboratory: z.string(),
  reportReference: z.string(),
  results: z.record(z.string(), z.string()),
  evaluation: checkEvaluationSchema,
  recordedBy: z.string(),
  recordedAt: z.string(),
});

/** What the heat page shows: whether a check is required, why, under which rule, and the checks recorded. */
export const heatCheckAnalysisSchema = z.object({
  status: z.enum(['not-required', 'awaiting', 'conforms', 'does-not-conform']),
  required: z.boolean(),
  why: z.string(),
  position: z.number().int(),
  rule: checkRuleSchema.nullable(),
  /** Elements of the heat's grade with a product-analysis tolerance or a limit, in specification order. */
  elements: z.array(z.object({ element: z.string(), heatLimit: z.string(), checkLimit: z.string() })),
  analyses: z.array(checkAnalysisRecordSchema),
});
export type HeatCheckAnalysis = z.infer<typeof heatCheckAnalysisSchema>;

export const heatAwaitingCheckSchema = z.object({
  heatId: z.number().int(),
  heatNumber: z.string(),
  supplier: z.string(),
  specId: z.string(),
  receivedAt: z.string(),
  why: z.string(),
});
export type HeatAwaitingCheck = z.infer<typeof heatAwaitingCheckSchema>;
