import { keepPreviousData, queryOptions } from '@tanstack/vue-query';
import {
  peoplePageSchema,
  peopleSettingsSchema,
  personSchema,
  roleChangeOutcomeSchema,
  type ActivationChange,
  type PeopleQuery,
  type RoleChange,
} from '@shared/schemas/people';
import { apiRequest } from './http';

export const peopleKeys = {
  all: ['people'] as const,
  list: (query: PeopleQuery) => [...peopleKeys.all, 'list', query] as const,
  settings: () => [...peopleKeys.all, 'settings'] as const,
};

export const peopleSettingsQuery = () =>
  queryOptions({
    queryKey: peopleKeys.settings(),
    queryFn: ({ signal }) => apiRequest('/people/settings', peopleSettingsSchema, { signal }),
  });

export const peopleListQuery = (query: PeopleQuery) =>
  queryOptions({
    queryKey: peopleKeys.list(query),
    queryFn: ({ signal }) => {
      const params = new URLSearchParams({
        page: String(query.page),
        pageSize: String(query.pageSize),
        status: query.status,
      });
      if (query.search) params.set('search', query.search);
      return apiRequest(`/people?${params}`, peoplePageSchema, { signal });
    },
    placeholderData: keepPreviousData,
  });

export function changePersonRoles(personId: number, change: RoleChange) {
  return apiRequest(`/people/${personId}/roles`, roleChangeOutcomeSchema, { method: 'PUT', body: change });
}

export function changePersonActivation(personId: number, change: ActivationChange) {
  return apiRequest(`/people/${personId}/activation`, personSchema, { method: 'PUT', body: change });
}
