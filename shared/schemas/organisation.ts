import { z } from 'zod';

export const organisationSchema = z.object({
  name: z.string(),
  site: z.string(),
  address: z.string(),
  gs1CompanyPrefix: z.string().nullable(),
});

export type OrganisationSummary = z.infer<typeof organisationSchema>;
