import { queryOptions } from '@tanstack/vue-query';
import type { BackwardTrace, ForwardTrace } from '@shared/schemas/trace';
import { apiRequest, typed } from './http';


export const backwardTraceQuery = (start: { udi?: string; lot?: string; tag?: string } | null) =>
  queryOptions({
    queryKey: ['trace', 'backward', start] as const,
    queryFn: ({ signal }) => apiRequest(`/trace/backward?${new URLSearchParams(start as Record<string, string>)}`, typed<BackwardTrace>(), { signal }),
    enabled: Boolean(start),
    retry: false,
  });

export const forwardTraceQuery = (start: Record<string, string> | null) =>
  queryOptions({
    queryKey: ['trace', 'forward', start] as const,
    queryFn: ({ signal }) => apiRequest(`/trace/forward?${new URLSearchParams(start ?? {})}`, typed<ForwardTrace>(), { signal }),
    enabled: Boolean(start),
    retry: false,
  });
