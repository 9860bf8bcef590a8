import { bulkTraceReplySchema } from '@shared/schemas/bulk-trace';
import { queryOptions } from '@tanstack/vue-query';
import { backwardTraceSchema, forwardTraceSchema, graphReplySchema, traceStartsSchema } from '@shared/schemas/trace';
import { apiRequest } from './http';

export const backwardTraceQuery = (start: { udi?: string; lot?: string; tag?: string } | null) =>
  queryOptions({
    queryKey: ['trace', 'backward', start] as const,
    queryFn: ({ signal }) =>
      apiRequest(`/trace/backward?${new URLSearchParams(start as Record<string, string>)}`, backwardTraceSchema, {
        signal,
      }),
    enabled: Boolean(start),
    retry: false,
  });

export const forwardTraceQuery = (start: Record<string, string> | null) =>
  queryOptions({
    queryKey: ['trace', 'forward', start] as const,
    queryFn: ({ signal }) =>
      apiRequest(`/trace/forward?${new URLSearchParams(start ?? {})}`, forwardTraceSchema, { signal }),
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

export type { GraphReply } from '@shared/schemas/trace';

/** The same trace drawn as a graph (asked for only when the graph view is open). */
export const traceGraphQuery = (direction: 'backward' | 'forward', start: Record<string, string> | null) =>
  queryOptions({
    queryKey: ['trace', direction, 'graph', start] as const,
    queryFn: ({ signal }) =>
      apiRequest(`/trace/${direction}/graph?${new URLSearchParams(start ?? {})}`, graphReplySchema, { signal }),
    enabled: Boolean(start),
    retry: false,
  });

/** Many UDIs or lot numbers at once, as the text they came in (one a line). */
export const bulkTrace = (text: string) => apiRequest('/trace/bulk', bulkTraceReplySchema, { method: 'POST', text });
