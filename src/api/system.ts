import { queryOptions } from '@tanstack/vue-query';
import { healthSchema } from '@shared/schemas/health';
import { organisationSchema } from '@shared/schemas/organisation';
import { apiRequest } from './http';

export const systemKeys = {
  all: ['system'] as const,
  health: () => [...systemKeys.all, 'health'] as const,
  organisation: () => [...systemKeys.all, 'organisation'] as const,
};

export const healthQuery = () =>
  queryOptions({
    queryKey: systemKeys.health(),
    queryFn: ({ signal }) => apiRequest('/health', healthSchema, { signal }),
    refetchInterval: 30_000,
    retry: false,
  });

export const organisationQuery = () =>
  queryOptions({
    queryKey: systemKeys.organisation(),
    queryFn: ({ signal }) => apiRequest('/organisation', organisationSchema, { signal }),
    staleTime: 5 * 60_000,
  });
