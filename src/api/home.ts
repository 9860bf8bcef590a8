import { queryOptions } from '@tanstack/vue-query';
import { homeSchema } from '@shared/schemas/home';
import { apiRequest } from './http';

export const homeKeys = { all: ['home'] as const };

/** The signed-in person's waiting work and the plant's figures; kept fresh while the home is open. */
export const homeQuery = () =>
  queryOptions({
    queryKey: homeKeys.all,
    queryFn: ({ signal }) => apiRequest('/home', homeSchema, { signal }),
    refetchInterval: 60_000,
  });
