import { computed, type Ref } from 'vue';
import { useMutation, useQuery, useQueryClient } from '@tanstack/vue-query';
import type { OpenRecallInput, RecallListQuery } from '@shared/schemas/recall';
import * as api from '../api/recall';
import { invalidateAfter } from '../api/invalidation';

export const useRecalls = (query: Ref<RecallListQuery>) => useQuery(computed(() => api.recallListQuery(query.value)));
export const useRecall = (id: Ref<number>) => useQuery(computed(() => api.recallQuery(id.value)));
export const useDrillReport = (id: Ref<number>) => useQuery(computed(() => api.drillReportQuery(id.value)));

/** Opening or re-running places holds, which change lots and their release checklists too. */
function useRecallChange<Input, Output>(change: (input: Input) => Promise<Output>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: change,
    onSuccess: () => invalidateAfter(queryClient, 'recall'),
  });
}

export const useOpenRecall = () => useRecallChange((input: OpenRecallInput) => api.openRecall(input));
export const useRerunRecall = (id: Ref<number>) => useRecallChange(() => api.rerunRecall(id.value));
