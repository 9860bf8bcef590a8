import { useQuery } from '@tanstack/vue-query';
import { healthQuery, organisationQuery } from '../api/system';

export function useHealth() {
  return useQuery(healthQuery());
}

export function useOrganisation() {
  return useQuery(organisationQuery());
}
