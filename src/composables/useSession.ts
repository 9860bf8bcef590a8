import { computed } from 'vue';
import { useMutation, useQuery } from '@tanstack/vue-query';
import { rolesAllow, type Action } from '@shared/auth/permissions';
import { meQuery, signOut } from '../api/session';

export function useSession() {
  const me = useQuery(meQuery());
  const person = computed(() => me.data.value?.person ?? null);
  const can = (action: Action) => rolesAllow(person.value?.roles ?? [], action);
  return { me, person, can };
}

export function useSignOut() {
  return useMutation({
    mutationFn: signOut,
    onSuccess: ({ redirectUrl }) => {
      window.location.assign(redirectUrl);
    },
  });
}
