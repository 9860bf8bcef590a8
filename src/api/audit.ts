import { keepPreviousData, queryOptions } from '@tanstack/vue-query';
import { ledgerActionsSchema, ledgerPageSchema, verificationSchema, type LedgerQuery } from '@shared/schemas/audit';
import { apiDownload, apiRequest } from './http';

export const auditKeys = {
  all: ['audit'] as const,
  events: (query: LedgerQuery) => [...auditKeys.all, 'events', query] as const,
  actions: () => [...auditKeys.all, 'actions'] as const,
  verification: () => [...auditKeys.all, 'verification'] as const,
};

/** The query string for ledger filters (shared by the table, the CSV link and the history view). */
export function ledgerSearchParams(query: Partial<LedgerQuery>): URLSearchParams {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query))
    if (value !== undefined && value !== '') params.set(key, String(value));
  return params;
}

export const ledgerEventsQuery = (query: LedgerQuery) =>
  queryOptions({
    queryKey: auditKeys.events(query),
    queryFn: ({ signal }) => apiRequest(`/audit/events?${ledgerSearchParams(query)}`, ledgerPageSchema, { signal }),
    placeholderData: keepPreviousData,
  });

export const ledgerActionsQuery = () =>
  queryOptions({
    queryKey: auditKeys.actions(),
    queryFn: ({ signal }) => apiRequest('/audit/actions', ledgerActionsSchema, { signal }),
    staleTime: 60_000,
  });

export function runVerification() {
  return apiRequest('/audit/verification', verificationSchema);
}

/** The verifiable bundle of the whole ledger (recorded as an export in the ledger itself). */
export const exportLedgerBundle = () => apiDownload('/audit/export', 'ingotrace-ledger-export.json');
