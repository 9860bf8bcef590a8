import { keepPreviousData, queryOptions } from '@tanstack/vue-query';
import type { Readiness } from '@shared/domain/release/readiness';
import {
  releaseQueuePageSchema,
  type AuditTrail,
  type LabelMovement,
  type ReleaseQueueQuery,
} from '@shared/schemas/release';
import { apiRequest, typed } from './http';

export interface ReleaseView {
  lotId: number;
  lotNumber: string;
  status: string;
  readiness: Readiness;
  dossier: Record<string, unknown>;
  dossierHash: string;
  submissions: Array<{
    id: number;
    submittedAt: string;
    submittedBy: string;
    outcome: string;
    changedSinceSubmission: boolean;
  }>;
  reviewedCurrent: boolean;
  auditTrail: AuditTrail;
}

export const releaseKeys = {
  all: ['release'] as const,
  lot: (id: number) => [...releaseKeys.all, 'lot', id] as const,
  queue: (query: ReleaseQueueQuery) => [...releaseKeys.all, 'queue', query] as const,
};

export const releaseViewQuery = (lotId: number) =>
  queryOptions({
    queryKey: releaseKeys.lot(lotId),
    queryFn: ({ signal }) => apiRequest(`/lots/${lotId}/release`, typed<ReleaseView>(), { signal }),
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
  apiRequest(`/lots/${lotId}/release-submissions`, typed<{ status: string }>(), { method: 'POST', body: {} });
export const recordLabels = (lotId: number, movement: LabelMovement) =>
  apiRequest(`/lots/${lotId}/labels`, typed<{ netLabels: number }>(), { method: 'POST', body: movement });
