import { computed, type Ref } from 'vue';
import { useMutation, useQuery, useQueryClient } from '@tanstack/vue-query';
import type {
  ConsigneeInput,
  DispositionInput,
  LotListQuery,
  LotOpen,
  MaterialMovementInput,
  MergeInput,
  NonconformanceInput,
  NonconformanceListQuery,
  OperationInput,
  PartCreate,
  ProcessRunInput,
  ProcessRunListQuery,
  ShipmentInput,
  SplitInput,
} from '@shared/schemas/manufacturing';
import type { MethodValidationInput } from '@shared/schemas/process-methods';
import * as api from '../api/manufacturing';
import { invalidateAfter } from '../api/invalidation';

export const useParts = () => useQuery(api.partsQuery());
export const useLots = (query: Ref<LotListQuery>) => useQuery(computed(() => api.lotsQuery(query.value)));
export const useLot = (id: Ref<number>) => useQuery(computed(() => api.lotQuery(id.value)));
export const useProcessRuns = (query: Ref<ProcessRunListQuery>) =>
  useQuery(computed(() => api.processRunsQuery(query.value)));
export const useProcessRun = (id: Ref<number>) => useQuery(computed(() => api.processRunQuery(id.value)));
export const useProcessMethods = () => useQuery(api.processMethodsQuery());
export const useNonconformances = (query: Ref<NonconformanceListQuery>) =>
  useQuery(computed(() => api.nonconformancesQuery(query.value)));
export const useNonconformance = (id: Ref<number>) => useQuery(computed(() => api.nonconformanceQuery(id.value)));
export const useConsignees = () => useQuery(api.consigneesQuery());

/** Every manufacturing change can touch lots, runs, nonconformances and bar stock at once. */
function useRecordChange<Input, Output>(change: (input: Input) => Promise<Output>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: change,
    onSuccess: () => invalidateAfter(queryClient, 'manufacturing'),
  });
}

export const useRecordMethodValidation = () =>
  useRecordChange((input: { methodId: string } & MethodValidationInput) =>
    api.recordMethodValidation(input.methodId, input),
  );
export const useCreatePart = () => useRecordChange((part: PartCreate) => api.createPart(part));
export const useOpenLot = () => useRecordChange((lot: LotOpen) => api.openLot(lot));
export const useIssueMaterial = (lotId: Ref<number>) =>
  useRecordChange((movement: MaterialMovementInput) => api.issueMaterial(lotId.value, movement));
export const useReturnMaterial = (lotId: Ref<number>) =>
  useRecordChange((movement: MaterialMovementInput) => api.returnMaterial(lotId.value, movement));
export const useRecordOperation = (lotId: Ref<number>) =>
  useRecordChange((operation: OperationInput) => api.recordOperation(lotId.value, operation));
export const useSplitLot = (lotId: Ref<number>) =>
  useRecordChange((split: SplitInput) => api.splitLot(lotId.value, split));
export const useMergeLots = () => useRecordChange((merge: MergeInput) => api.mergeLots(merge));
export const useShipLot = (lotId: Ref<number>) =>
  useRecordChange((shipment: ShipmentInput) => api.shipLot(lotId.value, shipment));
export const useRecordProcessRun = () => useRecordChange((run: ProcessRunInput) => api.recordProcessRun(run));
export const useRaiseNonconformance = () => useRecordChange((nc: NonconformanceInput) => api.raiseNonconformance(nc));
export const useProposeDisposition = (id: Ref<number>) =>
  useRecordChange((disposition: DispositionInput) => api.proposeDisposition(id.value, disposition));
export const useCreateConsignee = () => useRecordChange((consignee: ConsigneeInput) => api.createConsignee(consignee));
export const useChangeConsigneeContact = () =>
  useRecordChange((change: { consigneeId: number; contactEmail: string | null }) =>
    api.changeConsigneeContact(change.consigneeId, { contactEmail: change.contactEmail }),
  );
export const useAttachOperationFile = (lotId: Ref<number>) =>
  useRecordChange((input: { operationId: number; file: File }) =>
    api.attachOperationFile(lotId.value, input.operationId, input.file),
  );
