import { queryOptions } from '@tanstack/vue-query';
import { z } from 'zod';
import type { BackwardTrace, ForwardTrace } from '@shared/schemas/trace';
import { apiRequest } from './http';

const typed = <T>() => z.custom<T>((value) => typeof value === 'object' && value !== null);

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
