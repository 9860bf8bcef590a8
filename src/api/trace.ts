import { queryOptions } from '@tanstack/vue-query';
import type { GenealogyGraph } from '@shared/domain/trace/genealogy-graph';
import { traceStartsSchema, type BackwardTrace, type ForwardTrace } from '@shared/schemas/trace';
import { apiRequest, typed } from './http';

export const backwardTraceQuery = (start: { udi?: string; lot?: string; tag?: string } | null) =>
  queryOptions({
    queryKey: ['trace', 'backward', start] as const,
    queryFn: ({ signal }) =>
      apiRequest(`/trace/backward?${new URLSearchParams(start as Record<string, string>)}`, typed<BackwardTrace>(), {
        signal,
      }),
    enabled: Boolean(start),
    retry: false,
  });

export const forwardTraceQuery = (start: Record<string, string> | null) =>
  queryOptions({
    queryKey: ['trace', 'forward', start] as const,
    queryFn: ({ signal }) =>
      apiRequest(`/trace/forward?${new URLSearchParams(start ?? {})}`, typed<ForwardTrace>(), { signal }),
    enabled: Boolean(start),
    retry: false,
  });

/** Where a forward trace may start, for what the person is typing (asked once they have typed something). */
export const traceStartsQuery = (text: string) =>
  queryOptions({
    queryKey: ['trace', 'starts', text] as const,
    queryFn: ({ signal }) =>
      apiRequest(`/trace/starts?${new URLSearchParams({ q: text })}`, traceStartsSchema, { signal }),
    enabled: text.trim().length > 0,
    staleTime: 30_000,
  });

export type GraphReply = GenealogyGraph & { start: string; lots: number; tooLarge: boolean };

/** The same trace drawn as a graph (asked for only when the graph view is open). */
export const traceGraphQuery = (direction: 'backward' | 'forward', start: Record<string, string> | null) =>
  queryOptions({
    queryKey: ['trace', direction, 'graph', start] as const,
    queryFn: ({ signal }) =>
      apiRequest(`/trace/${direction}/graph?${new URLSearchParams(start ?? {})}`, typed<GraphReply>(), { signal }),
    enabled: Boolean(start),
    retry: false,
  });
