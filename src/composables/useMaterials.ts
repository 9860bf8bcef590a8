import { computed, type Ref } from 'vue';
import { useMutation, useQuery, useQueryClient } from '@tanstack/vue-query';
import { invalidateAfter } from '../api/invalidation';
import type { ScreeningAcknowledgementInput } from '@shared/schemas/screening';
import type {
  HeatCreate,
  HeatListQuery,
  HeatResults,
  ResultsImport,
  SpecificationDraftInput,
  TrendQuery,
} from '@shared/schemas/materials';
import {
  changeSupplierApproval,
  createSupplier,
  acknowledgeScreeningFinding,
  draftSpecificationRevision,
  heatQuery,
  heatsQuery,
  importResults,
  materialKeys,
  specificationDraftsQuery,
  receiveHeat,
  recordHeatResults,
  specificationsQuery,
  supplierScreeningQuery,
  suppliersQuery,
  trendQuery,
  uploadCertificate,
} from '../api/materials';

export const useHeats = (query: Ref<HeatListQuery>) => useQuery(computed(() => heatsQuery(query.value)));
export const useHeat = (id: Ref<number>) => useQuery(computed(() => heatQuery(id.value)));
export const useSuppliers = () => useQuery(suppliersQuery());
export const useSupplierScreening = (supplierId: Ref<number>) =>
  useQuery(computed(() => supplierScreeningQuery(supplierId.value)));
export const useSpecifications = () => useQuery(specificationsQuery());

export function useCreateSupplier() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: createSupplier, onSuccess: () => invalidateAfter(queryClient, 'materials') });
}

export function useChangeSupplierApproval(supplierId: Ref<number>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: Parameters<typeof changeSupplierApproval>[1]) =>
      changeSupplierApproval(supplierId.value, input),
    onSuccess: () => invalidateAfter(queryClient, 'materials'),
  });
}

export function useReceiveHeat() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (heat: HeatCreate) => receiveHeat(heat),
    onSuccess: () => invalidateAfter(queryClient, 'materials'),
  });
}

export function useRecordHeatResults(heatId: Ref<number>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (results: HeatResults) => recordHeatResults(heatId.value, results),
    onSuccess: (detail) => {
      queryClient.setQueryData(materialKeys.heat(heatId.value), detail);
      return invalidateAfter(queryClient, 'materials');
    },
  });
}

export function useUploadCertificate(heatId: Ref<number>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (file: File) => uploadCertificate(heatId.value, file),
    onSuccess: () => invalidateAfter(queryClient, 'materials'),
  });
}

export function useAcknowledgeFinding(heatId: Ref<number>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ScreeningAcknowledgementInput) => acknowledgeScreeningFinding(heatId.value, input),
    onSuccess: () => invalidateAfter(queryClient, 'materials'),
  });
}

export const useTrend = (query: Ref<TrendQuery | null>) =>
  useQuery(
    computed(() => ({
      ...trendQuery(query.value ?? { supplierId: 0, specId: '', element: '' }),
      enabled: query.value !== null,
    })),
  );

export function useImportResults() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (request: ResultsImport) => importResults(request),
    onSuccess: (report) => (report.imported ? invalidateAfter(queryClient, 'materials') : undefined),
  });
}

export const useSpecificationDrafts = () => useQuery(specificationDraftsQuery());

export function useDraftSpecificationRevision() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (draft: SpecificationDraftInput) => draftSpecificationRevision(draft),
    onSuccess: () => invalidateAfter(queryClient, 'materials'),
  });
}
