import { z } from 'zod';
import { materialFamilies } from '../domain/materials/specification';
import { contactCategories } from '../domain/manufacturing/contact-categories';

const confidence = z.enum(['published', 'secondary-source', 'unconfirmed', 'firm-validated']);

/** Recording (or withdrawing) the firm's own validation of a method for a material outside its published scope. */
export const methodValidationInputSchema = z.object({
  materialFamily: z.enum(materialFamilies, { error: 'Choose the material' }),
  stands: z.boolean().default(true),
  reference: z.string().trim().min(3, 'Name the validation report, e.g. VR-2026-014').max(120),
  reason: z.string().trim().min(10, 'Say what the validation showed (at least 10 characters)').max(1000),
});
export type MethodValidationInput = z.input<typeof methodValidationInputSchema>;

export const firmMethodValidationSchema = z.object({
  methodId: z.string(),
  family: z.enum(materialFamilies),
  reference: z.string(),
  reason: z.string(),
  recordedBy: z.string(),
  recordedAt: z.string(),
});
export type FirmMethodValidationView = z.infer<typeof firmMethodValidationSchema>;

export const processMethodViewSchema = z.object({
  id: z.string(),
  kind: z.enum(['passivation', 'cleaning']),
  title: z.string(),
  basis: z.string(),
  materialScope: z.object({ families: z.array(z.enum(materialFamilies)), source: z.string(), confidence }),
  parameters: z.array(
    z.object({
      key: z.string(),
      label: z.string(),
      unit: z.string(),
      min: z.string().optional(),
      max: z.string().optional(),
      text: z.boolean().optional(),
      byContactCategory: z
        .array(z.object({ category: z.enum(contactCategories), max: z.string(), source: z.string() }))
        .optional(),
      source: z.string(),
      confidence,
    }),
  ),
  pairings: z
    .array(
      z.object({
        label: z.string(),
        minC: z.string(),
        maxC: z.string(),
        minMinutes: z.string(),
        source: z.string(),
        confidence,
      }),
    )
    .optional(),
  /** The firm's own validations that stand for this method (materials beyond its published scope). */
  firmValidations: z.array(firmMethodValidationSchema),
});
export type ProcessMethodView = z.infer<typeof processMethodViewSchema>;
