import { z } from 'zod';
import { productForms } from '../domain/materials/specification';

const reported = z.union([z.string().trim().min(1).max(40), z.number().finite()]);

/** A certificate's reported results, as the evaluation and the evaluate command take them. */
export const certificateInputSchema = z.object({
  spec: z.string().trim().min(1, 'Name the specification, e.g. "ASTM F136"'),
  grade: z.union([z.string().trim().min(1), z.number()]).nullable().optional(),
  form: z.enum(productForms).default('bar'),
  condition: z.string().trim().min(1).default('annealed'),
  sizeMm: reported.nullable().optional(),
  chemistry: z.record(z.string().regex(/^[A-Z][a-z]?$/, 'Chemistry keys are element symbols such as O or Fe'), reported).default({}),
  mechanical: z
    .object({ utsMPa: reported.optional(), ysMPa: reported.optional(), elongationPct: reported.optional(), reductionOfAreaPct: reported.optional() })
    .strict()
    .default({}),
});
export type CertificateInput = z.input<typeof certificateInputSchema>;
export type ParsedCertificateInput = z.output<typeof certificateInputSchema>;

export const itemVerdicts = ['conforms', 'does-not-conform', 'missing'] as const;
export const overallVerdicts = ['conforms', 'does-not-conform', 'incomplete'] as const;
export type ItemVerdict = (typeof itemVerdicts)[number];
export type OverallVerdict = (typeof overallVerdicts)[number];

export interface EvaluationItem {
  item: string;
  kind: 'chemistry' | 'mechanical' | 'requirement' | 'selection';
  reported: string | null;
  rounded: string | null;
  limit: string;
  verdict: ItemVerdict;
  note?: string;
  source: string;
  confidence: 'published' | 'secondary' | 'unconfirmed';
}

export interface EvaluationFlag {
  kind: 'out-of-range' | 'excess-precision' | 'looks-like-ppm' | 'not-in-specification';
  item: string;
  message: string;
}

export interface Evaluation {
  verdict: OverallVerdict;
  items: EvaluationItem[];
  derived: Record<string, { value: string; formula: string; source: string } | string>;
  flags: EvaluationFlag[];
  spec: { id: string; revision: string; edition: string; grade: string | null };
  caution: string;
}
