import { computed, type Ref } from 'vue';
import { useMutation, useQuery, useQueryClient } from '@tanstack/vue-query';
import { invalidateAfter } from '../api/invalidation';
import type { ActivationChange, PeopleQuery, RoleChange } from '@shared/schemas/people';
import { changePersonActivation, changePersonRoles, peopleListQuery, peopleSettingsQuery } from '../api/people';

export function usePeopleList(query: Ref<PeopleQuery>) {
  return useQuery(computed(() => peopleListQuery(query.value)));
}

export const usePeopleSettings = () => useQuery(peopleSettingsQuery());

export function useChangePersonRoles() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ personId, change }: { personId: number; change: RoleChange }) => changePersonRoles(personId, change),
    onSuccess: () => invalidateAfter(queryClient, 'people'),
  });
}

export function useChangePersonActivation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ personId, change }: { personId: number; change: ActivationChange }) =>
      changePersonActivation(personId, change),
    onSuccess: () => invalidateAfter(queryClient, 'people'),
  });
}
