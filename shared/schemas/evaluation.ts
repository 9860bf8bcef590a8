import { z } from 'zod';
import { conditionOf, confidences, productConditions, productForms } from '../domain/materials/specification';

const reported = z.union([z.string().trim().min(1).max(40), z.number().finite()]);

const conditionInput = z
  .string()
  .trim()
  .transform((text, context) => {
    const condition = conditionOf(text);
    if (!condition) context.addIssue({ code: 'custom', message: `Choose one of: ${productConditions.join(', ')}` });
    return condition ?? z.NEVER;
  });

/** A certificate's reported results, as the evaluation and the evaluate command take them. */
export const certificateInputSchema = z.object({
  spec: z.string().trim().min(1, 'Name the specification, e.g. "ASTM F136"'),
  grade: z
    .union([z.string().trim().min(1), z.number()])
    .nullable()
    .optional(),
  form: z.enum(productForms).default('bar'),
  /** One of the controlled conditions; "Annealed" and "cold worked" name annealed and cold-worked. */
  condition: conditionInput.default('annealed'),
  sizeMm: reported.nullable().optional(),
  chemistry: z
    .record(z.string().regex(/^[A-Z][a-z]?$/, 'Chemistry keys are element symbols such as O or Fe'), reported)
    .default({}),
  mechanical: z
    .object({
      utsMPa: reported.optional(),
      ysMPa: reported.optional(),
      elongationPct: reported.optional(),
      reductionOfAreaPct: reported.optional(),
    })
    .strict()
    .default({}),
});
export type CertificateInput = z.input<typeof certificateInputSchema>;
export type ParsedCertificateInput = z.output<typeof certificateInputSchema>;

export const itemVerdicts = ['conforms', 'does-not-conform', 'cannot-be-evaluated'] as const;
export const overallVerdicts = ['conforms', 'does-not-conform', 'cannot-be-evaluated'] as const;
export type ItemVerdict = (typeof itemVerdicts)[number];
export type OverallVerdict = (typeof overallVerdicts)[number];

/** Why an item cannot be evaluated. */
export const cannotEvaluateReasons = ['no-requirement', 'missing-value', 'unverified-written-form'] as const;
export type CannotEvaluateReason = (typeof cannotEvaluateReasons)[number];

export const verdictLabels: Record<OverallVerdict, string> = {
  conforms: 'Conforms',
  'does-not-conform': 'Does not conform',
  'cannot-be-evaluated': 'Cannot be evaluated',
};

export const reasonLabels: Record<CannotEvaluateReason, string> = {
  'no-requirement': 'No requirement for this form, condition or size',
  'missing-value': 'Value not reported',
  'unverified-written-form': 'Decided only by the unverified written form of the limit',
};

export const evaluationItemSchema = z.object({
  item: z.string(),
  kind: z.enum(['chemistry', 'mechanical', 'requirement', 'selection']),
  reported: z.string().nullable(),
  rounded: z.string().nullable(),
  limit: z.string(),
  verdict: z.enum(itemVerdicts),
  reason: z.enum(cannotEvaluateReasons).optional(),
  note: z.string().optional(),
  source: z.string(),
  confidence: z.enum(confidences),
  /** The limit's value or written form is unverified: check it against the licensed standard. */
  unverified: z.boolean().default(false),
});
export type EvaluationItem = z.output<typeof evaluationItemSchema>;

export const evaluationFlagSchema = z.object({
  kind: z.enum(['out-of-range', 'excess-precision', 'looks-like-ppm', 'not-in-specification']),
  item: z.string(),
  message: z.string(),
});
export type EvaluationFlag = z.infer<typeof evaluationFlagSchema>;

const derivedIndexSchema = z.object({ value: z.string(), formula: z.string(), source: z.string() });

export const evaluationSchema = z.object({
  verdict: z.enum(overallVerdicts),
  items: z.array(evaluationItemSchema),
  derived: z.record(z.string(), z.union([derivedIndexSchema, z.string()])),
  flags: z.array(evaluationFlagSchema),
  spec: z.object({ id: z.string(), revision: z.string(), edition: z.string(), grade: z.string().nullable() }),
  /** Form, condition and size the mechanical requirements were chosen by. */
  basis: z.object({ form: z.string(), condition: z.string(), sizeMm: z.string().nullable() }).optional(),
  /** Items whose limit is unverified: the verdict rests on them. */
  restsOnUnverified: z.array(z.string()).default([]),
  caution: z.string(),
});
export type Evaluation = z.output<typeof evaluationSchema>;

/**
 * Reads an evaluation as stored. Evaluations stored before "cannot be evaluated" existed said
 * "incomplete" overall and "missing" per item: both read as cannot be evaluated (missing value).
 */
export function readStoredEvaluation(stored: unknown): Evaluation {
  const raw = stored as { verdict?: string; items?: Array<Record<string, unknown>> };
  const legacy = {
    ...raw,
    verdict: raw.verdict === 'incomplete' ? 'cannot-be-evaluated' : raw.verdict,
    items: (raw.items ?? []).map((item) =>
      item.verdict === 'missing' ? { ...item, verdict: 'cannot-be-evaluated', reason: 'missing-value' } : item,
    ),
  };
  return evaluationSchema.parse(legacy);
}
