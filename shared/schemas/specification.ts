import { z } from 'zod';
import {
  confidences,
  materialFamilies,
  productConditions,
  productForms,
  type Specification,
} from '../domain/materials/specification';

// A specification's limit set as the library stores it and the screens show it (the types are
// the domain's; the schema checks a reply against them).

const valueSourceSchema = z.object({ reference: z.string(), confidence: z.enum(confidences) });
const mechanicalPropertySchema = z.enum(['utsMPa', 'ysMPa', 'elongationPct', 'reductionOfAreaPct']);

const elementLimitSchema = z.object({
  element: z.string(),
  min: z.string().optional(),
  max: z.string().optional(),
  source: valueSourceSchema,
  writtenFormUnverified: z.boolean().optional(),
  tolerance: z.object({ under: z.string().optional(), over: z.string().optional() }).optional(),
});

const mechanicalSetSchema = z.object({
  forms: z.array(z.enum(productForms)),
  condition: z.string(),
  size: z
    .object({
      fromMm: z.string(),
      fromInclusive: z.boolean(),
      toMm: z.string().optional(),
      toInclusive: z.boolean().optional(),
    })
    .optional(),
  limits: z.array(
    z.object({ property: mechanicalPropertySchema, min: z.string(), writtenFormUnverified: z.boolean().optional() }),
  ),
  notRequired: z.array(z.object({ property: mechanicalPropertySchema, why: z.string() })).optional(),
  source: valueSourceSchema,
});

const weightedSumSchema = z.object({
  id: z.string(),
  label: z.string(),
  terms: z.array(z.object({ element: z.string(), factor: z.string() })),
  min: z.string().optional(),
  max: z.string().optional(),
  source: valueSourceSchema,
  writtenFormUnverified: z.boolean().optional(),
});

export const specificationSchema = z.object({
  id: z.string(),
  title: z.string(),
  family: z.enum(materialFamilies),
  revision: z.string(),
  edition: z.string(),
  scope: z
    .object({
      forms: z.array(z.enum(productForms)),
      conditions: z.array(z.enum(productConditions)),
      source: valueSourceSchema,
    })
    .optional(),
  grades: z.array(
    z.object({
      grade: z.string().nullable(),
      uns: z.string().nullable(),
      chemistry: z.array(elementLimitSchema),
      weightedSums: z.array(weightedSumSchema),
      mechanical: z.array(mechanicalSetSchema),
      mechanicalProperties: z.array(mechanicalPropertySchema).optional(),
    }),
  ),
  notes: z.array(z.string()),
}) satisfies z.ZodType<Specification>;

/** The specification library as the screens read it, with the caution shown beside shipped limits. */
export const specificationLibrarySchema = z.object({
  caution: z.string(),
  specifications: z.array(specificationSchema),
});
