import { computed, type Ref } from 'vue';
import { useMutation, useQuery, useQueryClient } from '@tanstack/vue-query';
import type { LabelMovement, ReleaseQueueQuery } from '@shared/schemas/release';
import * as api from '../api/release';
import { invalidateAfter } from '../api/invalidation';

export const useReleaseView = (lotId: Ref<number>) => useQuery(computed(() => api.releaseViewQuery(lotId.value)));
export const useReleaseQueue = (query: Ref<ReleaseQueueQuery>) =>
  useQuery(computed(() => api.releaseQueueQuery(query.value)));

function useReleaseChange<Input, Output>(change: (input: Input) => Promise<Output>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: change,
    onSuccess: () => invalidateAfter(queryClient, 'release'),
  });
}

export const useSubmitForRelease = (lotId: Ref<number>) => useReleaseChange(() => api.submitForRelease(lotId.value));
export const useRecordLabels = (lotId: Ref<number>) =>
  useReleaseChange((movement: LabelMovement) => api.recordLabels(lotId.value, movement));
