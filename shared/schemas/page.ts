import { z } from 'zod';

/** The one envelope of every paged list: the page's items, how many match in all, which page and its size. */
export const pageOf = <Item extends z.ZodType>(item: Item) =>
  z.object({
    items: z.array(item),
    total: z.number().int(),
    page: z.number().int(),
    pageSize: z.number().int(),
  });
