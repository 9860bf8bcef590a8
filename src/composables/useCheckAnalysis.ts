import type { Ref } from 'vue';
import { useMutation, useQuery, useQueryClient } from '@tanstack/vue-query';
import { invalidateAfter } from '../api/invalidation';
import type { CheckAnalysisInput, CheckRuleInput } from '@shared/schemas/check-analysis';
import { checkRulesQuery, checksDueQuery, recordCheckAnalysis, setCheckRule } from '../api/materials';

export const useCheckRules = () => useQuery(checkRulesQuery());
export const useChecksDue = () => useQuery(checksDueQuery());

/** A rule changes which heats are due everywhere: every heat and list is read again. */
export function useSetCheckRule() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CheckRuleInput) => setCheckRule(input),
    onSuccess: () => invalidateAfter(queryClient, 'materials'),
  });
}

export function useRecordCheckAnalysis(heatId: Ref<number>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CheckAnalysisInput) => recordCheckAnalysis(heatId.value, input),
    onSuccess: () => invalidateAfter(queryClient, 'materials'),
  });
}
