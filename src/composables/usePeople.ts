import { computed, type Ref } from 'vue';
import { useMutation, useQuery, useQueryClient } from '@tanstack/vue-query';
import type { ActivationChange, PeopleQuery, RoleChange } from '@shared/schemas/people';
import { changePersonActivation, changePersonRoles, peopleKeys, peopleListQuery, peopleSettingsQuery } from '../api/people';

export function usePeopleList(query: Ref<PeopleQuery>) {
  return useQuery(computed(() => peopleListQuery(query.value)));
}

export const usePeopleSettings = () => useQuery(peopleSettingsQuery());

export function useChangePersonRoles() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ personId, change }: { personId: number; change: RoleChange }) => changePersonRoles(personId, change),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: peopleKeys.all }),
  });
}

export function useChangePersonActivation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ personId, change }: { personId: number; change: ActivationChange }) => changePersonActivation(personId, change),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: peopleKeys.all }),
  });
}
