import { z } from 'zod';

export const organisationSchema = z.object({
  name: z.string(),
  site: z.string(),
  address: z.string(),
  gs1CompanyPrefix: z.string().nullable(),
  /** IANA time zone of the plant: dates and times people read are on its clock. */
  timeZone: z.string(),
});

export type OrganisationSummary = z.infer<typeof organisationSchema>;
