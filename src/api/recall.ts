import { keepPreviousData, queryOptions } from '@tanstack/vue-query';
import {
  drillReportSchema,
  recallDetailSchema,
  recallPageSchema,
  recallRerunSchema,
  type OpenRecallInput,
  type RecallListQuery,
} from '@shared/schemas/recall';
import { apiRequest } from './http';

export const recallKeys = {
  all: ['recalls'] as const,
  list: (query: RecallListQuery) => [...recallKeys.all, 'list', query] as const,
  one: (id: number) => [...recallKeys.all, 'one', id] as const,
  drillReport: (id: number) => [...recallKeys.all, 'drill-report', id] as const,
};

export const recallListQuery = (query: RecallListQuery) =>
  queryOptions({
    queryKey: recallKeys.list(query),
    queryFn: ({ signal }) =>
      apiRequest(
        `/recalls?${new URLSearchParams(
          Object.entries(query)
            .filter(([, value]) => value !== undefined)
            .map(([key, value]) => [key, String(value)]),
        )}`,
        recallPageSchema,
        { signal },
      ),
    placeholderData: keepPreviousData,
  });

export const recallQuery = (id: number) =>
  queryOptions({
    queryKey: recallKeys.one(id),
    queryFn: ({ signal }) => apiRequest(`/recalls/${id}`, recallDetailSchema, { signal }),
  });

export const openRecall = (input: OpenRecallInput) =>
  apiRequest('/recalls', recallDetailSchema, { method: 'POST', body: input });
export const rerunRecall = (id: number) =>
  apiRequest(`/recalls/${id}/reruns`, recallRerunSchema, { method: 'POST', body: {} });

/** Where the browser downloads an export of a snapshot (the server records each export in the ledger). */
export const recallExportUrl = (id: number, format: 'csv' | 'pdf', snapshotId?: number) =>
  `/api/recalls/${id}/export?format=${format}${snapshotId ? `&snapshot=${snapshotId}` : ''}`;

export const drillReportQuery = (id: number) =>
  queryOptions({
    queryKey: recallKeys.drillReport(id),
    queryFn: ({ signal }) => apiRequest(`/recalls/${id}/drill-report`, drillReportSchema, { signal }),
  });
export const drillReportUrl = (id: number, format: 'csv' | 'pdf') => `/api/recalls/${id}/drill-report?format=${format}`;
