import { keepPreviousData, queryOptions } from '@tanstack/vue-query';
import {
  labelsCountedSchema,
  releaseQueuePageSchema,
  releaseSubmittedSchema,
  releaseViewSchema,
  type LabelMovement,
  type ReleaseQueueQuery,
} from '@shared/schemas/release';
import { apiRequest } from './http';

export type { ReleaseView } from '@shared/schemas/release';

export const releaseKeys = {
  all: ['release'] as const,
  lot: (id: number) => [...releaseKeys.all, 'lot', id] as const,
  queue: (query: ReleaseQueueQuery) => [...releaseKeys.all, 'queue', query] as const,
};

export const releaseViewQuery = (lotId: number) =>
  queryOptions({
    queryKey: releaseKeys.lot(lotId),
    queryFn: ({ signal }) => apiRequest(`/lots/${lotId}/release`, releaseViewSchema, { signal }),
  });
export const releaseQueueQuery = (query: ReleaseQueueQuery) =>
  queryOptions({
    queryKey: releaseKeys.queue(query),
    queryFn: ({ signal }) =>
      apiRequest(
        `/release-queue?queue=${query.queue}&page=${query.page}&pageSize=${query.pageSize}`,
        releaseQueuePageSchema,
        { signal },
      ),
    placeholderData: keepPreviousData,
  });
export const submitForRelease = (lotId: number) =>
  apiRequest(`/lots/${lotId}/release-submissions`, releaseSubmittedSchema, { method: 'POST', body: {} });
export const recordLabels = (lotId: number, movement: LabelMovement) =>
  apiRequest(`/lots/${lotId}/labels`, labelsCountedSchema, { method: 'POST', body: movement });
