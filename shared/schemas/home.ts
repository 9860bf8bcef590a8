import { z } from 'zod';

/** One kind of work waiting for the signed-in person: how much, since when, and where to do it. */
export const workItemSchema = z.object({
  key: z.string(),
  title: z.string(),
  explanation: z.string(),
  count: z.number(),
  oldestSince: z.string().nullable(),
  link: z.string(),
});
export type WorkItem = z.infer<typeof workItemSchema>;

export const plantFiguresSchema = z.object({
  sinceDay: z.string(),
  releaseLeadTime: z.array(z.object({ month: z.string(), lots: z.number(), medianDays: z.number() })),
  nonconformances: z.object({
    bySupplier: z.array(z.object({ name: z.string(), count: z.number() })),
    byCause: z.array(z.object({ name: z.string(), count: z.number() })),
  }),
  firstPassYield: z.array(
    z.object({ part: z.string(), lots: z.number(), started: z.number(), good: z.number(), percent: z.number() }),
  ),
});
export type PlantFigures = z.infer<typeof plantFiguresSchema>;

export const homeSchema = z.object({ work: z.array(workItemSchema), figures: plantFiguresSchema.nullable() });
export type Home = z.infer<typeof homeSchema>;
