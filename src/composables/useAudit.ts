import { computed, type Ref } from 'vue';
import { useMutation, useQuery } from '@tanstack/vue-query';
import type { LedgerQuery } from '@shared/schemas/audit';
import { exportLedgerBundle, ledgerActionsQuery, ledgerEventsQuery, runVerification } from '../api/audit';

export function useLedgerEvents(query: Ref<LedgerQuery>) {
  return useQuery(computed(() => ledgerEventsQuery(query.value)));
}

export function useLedgerActions() {
  return useQuery(ledgerActionsQuery());
}

export function useLedgerVerification() {
  return useMutation({ mutationFn: runVerification });
}

export function useExportLedgerBundle() {
  return useMutation({ mutationFn: exportLedgerBundle });
}
