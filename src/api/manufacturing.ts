import { keepPreviousData, queryOptions } from '@tanstack/vue-query';
import { z } from 'zod';
import { processMethodViewSchema, type MethodValidationInput } from '@shared/schemas/process-methods';
import {
  lotDetailSchema,
  nonconformanceSummarySchema,
  processRunDetailSchema,
  processRunSummarySchema,
} from '@shared/schemas/lot-detail';
import {
  consigneeSchema,
  lotSplitSchema,
  lotsMergedSchema,
  materialIssuedSchema,
  materialReturnedSchema,
  operationFileAttachedSchema,
  operationRecordedSchema,
  shipmentRecordedSchema,
} from '@shared/schemas/manufacturing-replies';
import { pageOf } from '@shared/schemas/page';
import {
  lotPageSchema,
  lotSummarySchema,
  partSchema,
  type ConsigneeContactInput,
  type ConsigneeInput,
  type DispositionInput,
  type LotListQuery,
  type LotOpen,
  type MaterialMovementInput,
  type MergeInput,
  type NonconformanceInput,
  type NonconformanceListQuery,
  type OperationInput,
  type PartCreate,
  type ProcessRunInput,
  type ProcessRunListQuery,
  type ShipmentInput,
  type SplitInput,
} from '@shared/schemas/manufacturing';
import { apiRequest, apiUpload } from './http';

export const manufacturingKeys = {
  all: ['manufacturing'] as const,
  parts: () => [...manufacturingKeys.all, 'parts'] as const,
  lots: (query: LotListQuery) => [...manufacturingKeys.all, 'lots', query] as const,
  lot: (id: number) => [...manufacturingKeys.all, 'lot', id] as const,
  runs: (query: ProcessRunListQuery) => [...manufacturingKeys.all, 'runs', query] as const,
  run: (id: number) => [...manufacturingKeys.all, 'run', id] as const,
  methods: () => [...manufacturingKeys.all, 'methods'] as const,
  nonconformances: (query: NonconformanceListQuery) => [...manufacturingKeys.all, 'ncs', query] as const,
  nonconformance: (id: number) => [...manufacturingKeys.all, 'nc', id] as const,
  consignees: () => [...manufacturingKeys.all, 'consignees'] as const,
};

const search = (values: Record<string, string | number | undefined>) => {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(values))
    if (value !== undefined && value !== '') params.set(key, String(value));
  return params.toString();
};

export const partsQuery = () =>
  queryOptions({
    queryKey: manufacturingKeys.parts(),
    queryFn: ({ signal }) => apiRequest('/parts', z.array(partSchema), { signal }),
  });
export const lotsQuery = (query: LotListQuery) =>
  queryOptions({
    queryKey: manufacturingKeys.lots(query),
    queryFn: ({ signal }) => apiRequest(`/lots?${search({ ...query })}`, lotPageSchema, { signal }),
    placeholderData: keepPreviousData,
  });
export const lotQuery = (id: number) =>
  queryOptions({
    queryKey: manufacturingKeys.lot(id),
    queryFn: ({ signal }) => apiRequest(`/lots/${id}`, lotDetailSchema, { signal }),
  });
export const processRunsQuery = (query: ProcessRunListQuery) =>
  queryOptions({
    queryKey: manufacturingKeys.runs(query),
    queryFn: ({ signal }) =>
      apiRequest(`/process-runs?${search({ ...query })}`, pageOf(processRunSummarySchema), { signal }),
    placeholderData: keepPreviousData,
  });
export const processRunQuery = (id: number) =>
  queryOptions({
    queryKey: manufacturingKeys.run(id),
    queryFn: ({ signal }) => apiRequest(`/process-runs/${id}`, processRunDetailSchema, { signal }),
  });
export const processMethodsQuery = () =>
  queryOptions({
    queryKey: manufacturingKeys.methods(),
    queryFn: ({ signal }) => apiRequest('/process-methods', z.array(processMethodViewSchema), { signal }),
  });
export const nonconformancesQuery = (query: NonconformanceListQuery) =>
  queryOptions({
    queryKey: manufacturingKeys.nonconformances(query),
    queryFn: ({ signal }) =>
      apiRequest(`/nonconformances?${search({ ...query })}`, pageOf(nonconformanceSummarySchema), { signal }),
    placeholderData: keepPreviousData,
  });
export const nonconformanceQuery = (id: number) =>
  queryOptions({
    queryKey: manufacturingKeys.nonconformance(id),
    queryFn: ({ signal }) => apiRequest(`/nonconformances/${id}`, nonconformanceSummarySchema, { signal }),
  });
export const consigneesQuery = () =>
  queryOptions({
    queryKey: manufacturingKeys.consignees(),
    queryFn: ({ signal }) => apiRequest('/consignees', z.array(consigneeSchema), { signal }),
  });

export const recordMethodValidation = (methodId: string, input: MethodValidationInput) =>
  apiRequest(`/process-methods/${encodeURIComponent(methodId)}/validations`, processMethodViewSchema, {
    method: 'POST',
    body: input,
  });
export const createPart = (part: PartCreate) => apiRequest('/parts', partSchema, { method: 'POST', body: part });
export const openLot = (lot: LotOpen) => apiRequest('/lots', lotSummarySchema, { method: 'POST', body: lot });
export const issueMaterial = (lotId: number, movement: MaterialMovementInput) =>
  apiRequest(`/lots/${lotId}/material-issues`, materialIssuedSchema, {
    method: 'POST',
    body: movement,
  });
export const returnMaterial = (lotId: number, movement: MaterialMovementInput) =>
  apiRequest(`/lots/${lotId}/material-returns`, materialReturnedSchema, { method: 'POST', body: movement });
export const recordOperation = (lotId: number, operation: OperationInput) =>
  apiRequest(`/lots/${lotId}/operations`, operationRecordedSchema, {
    method: 'POST',
    body: operation,
  });
export const splitLot = (lotId: number, split: SplitInput) =>
  apiRequest(`/lots/${lotId}/splits`, lotSplitSchema, {
    method: 'POST',
    body: split,
  });
export const mergeLots = (merge: MergeInput) =>
  apiRequest('/lots/merges', lotsMergedSchema, { method: 'POST', body: merge });
export const shipLot = (lotId: number, shipment: ShipmentInput) =>
  apiRequest(`/lots/${lotId}/shipments`, shipmentRecordedSchema, { method: 'POST', body: shipment });
export const recordProcessRun = (run: ProcessRunInput) =>
  apiRequest('/process-runs', processRunDetailSchema, { method: 'POST', body: run });
export const raiseNonconformance = (nc: NonconformanceInput) =>
  apiRequest('/nonconformances', nonconformanceSummarySchema, { method: 'POST', body: nc });
export const proposeDisposition = (id: number, disposition: DispositionInput) =>
  apiRequest(`/nonconformances/${id}/disposition`, nonconformanceSummarySchema, {
    method: 'PUT',
    body: disposition,
  });
export const createConsignee = (consignee: ConsigneeInput) =>
  apiRequest('/consignees', consigneeSchema, { method: 'POST', body: consignee });
export const changeConsigneeContact = (consigneeId: number, contact: ConsigneeContactInput) =>
  apiRequest(`/consignees/${consigneeId}/contact`, consigneeSchema, { method: 'PUT', body: contact });
export const attachOperationFile = (lotId: number, operationId: number, file: File) =>
  apiUpload(`/lots/${lotId}/operations/${operationId}/files`, 'file', file, operationFileAttachedSchema);
