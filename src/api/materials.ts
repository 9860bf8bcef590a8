import { keepPreviousData, queryOptions } from '@tanstack/vue-query';
import { specificationLibrarySchema } from '@shared/schemas/specification';
import { z } from 'zod';
import {
  heatDetailSchema,
  heatPageSchema,
  heatSummarySchema,
  resultsImportReportSchema,
  specificationDraftViewSchema,
  type SpecificationDraftInput,
  supplierApprovalSchema,
  supplierCreateSchema,
  supplierSchema,
  trendSchema,
  type ResultsImport,
  type HeatCreate,
  type HeatListQuery,
  type HeatResults,
  type TrendQuery,
} from '@shared/schemas/materials';
import { apiRequest, apiUpload } from './http';
import {
  heatScreeningSchema,
  supplierScreeningSchema,
  type ScreeningAcknowledgementInput,
} from '@shared/schemas/screening';
import {
  checkRuleSchema,
  heatAwaitingCheckSchema,
  heatCheckAnalysisSchema,
  type CheckAnalysisInput,
  type CheckRuleInput,
} from '@shared/schemas/check-analysis';

export const materialKeys = {
  all: ['materials'] as const,
  heats: (query: HeatListQuery) => [...materialKeys.all, 'heats', query] as const,
  heat: (id: number) => [...materialKeys.all, 'heat', id] as const,
  suppliers: () => [...materialKeys.all, 'suppliers'] as const,
  specifications: () => [...materialKeys.all, 'specifications'] as const,
  trend: (query: TrendQuery) => [...materialKeys.all, 'trend', query] as const,
  drafts: () => [...materialKeys.all, 'specification-drafts'] as const,
  checkRules: () => [...materialKeys.all, 'check-analysis-rules'] as const,
  checksDue: () => [...materialKeys.all, 'check-analyses-due'] as const,
};

export const heatsQuery = (query: HeatListQuery) =>
  queryOptions({
    queryKey: materialKeys.heats(query),
    queryFn: ({ signal }) => {
      const params = new URLSearchParams({ page: String(query.page), pageSize: String(query.pageSize) });
      if (query.search) params.set('search', query.search);
      if (query.status) params.set('status', query.status);
      return apiRequest(`/heats?${params}`, heatPageSchema, { signal });
    },
    placeholderData: keepPreviousData,
  });

export const heatQuery = (id: number) =>
  queryOptions({
    queryKey: materialKeys.heat(id),
    queryFn: ({ signal }) => apiRequest(`/heats/${id}`, heatDetailSchema, { signal }),
  });

export const suppliersQuery = () =>
  queryOptions({
    queryKey: materialKeys.suppliers(),
    queryFn: ({ signal }) => apiRequest('/suppliers', z.array(supplierSchema), { signal }),
  });

export const specificationsQuery = () =>
  queryOptions({
    queryKey: materialKeys.specifications(),
    queryFn: ({ signal }) => apiRequest('/specifications', specificationLibrarySchema, { signal }),
    staleTime: 5 * 60_000,
  });

export const createSupplier = (input: z.input<typeof supplierCreateSchema>) =>
  apiRequest('/suppliers', supplierSchema, { method: 'POST', body: input });
export const changeSupplierApproval = (supplierId: number, input: z.input<typeof supplierApprovalSchema>) =>
  apiRequest(`/suppliers/${supplierId}/approval`, supplierSchema, { method: 'PUT', body: input });
export const receiveHeat = (heat: HeatCreate) =>
  apiRequest('/heats', heatSummarySchema, { method: 'POST', body: heat });
export const recordHeatResults = (heatId: number, results: HeatResults) =>
  apiRequest(`/heats/${heatId}/results`, heatDetailSchema, { method: 'PUT', body: results });
const attachedSchema = z.object({
  documentId: z.number(),
  sha256: z.string(),
  storedNow: z.boolean(),
  alsoOnHeats: z.array(z.string()),
});
export const supplierScreeningQuery = (supplierId: number) =>
  queryOptions({
    queryKey: [...materialKeys.suppliers(), supplierId, 'screening'],
    queryFn: ({ signal }) => apiRequest(`/suppliers/${supplierId}/screening`, supplierScreeningSchema, { signal }),
  });
export const acknowledgeScreeningFinding = (heatId: number, input: ScreeningAcknowledgementInput) =>
  apiRequest(`/heats/${heatId}/screening-acknowledgements`, heatScreeningSchema, { method: 'POST', body: input });
export const uploadCertificate = (heatId: number, file: File) =>
  apiUpload(`/heats/${heatId}/certificates`, 'certificate', file, attachedSchema);

export const trendQuery = (query: TrendQuery) =>
  queryOptions({
    queryKey: materialKeys.trend(query),
    queryFn: ({ signal }) => {
      const params = new URLSearchParams({
        supplierId: String(query.supplierId),
        specId: query.specId,
        element: query.element,
      });
      if (query.grade) params.set('grade', query.grade);
      return apiRequest(`/trends?${params}`, trendSchema, { signal });
    },
  });

export const importResults = (request: ResultsImport) =>
  apiRequest('/heat-results/imports', resultsImportReportSchema, { method: 'POST', body: request });

export const specificationDraftsQuery = () =>
  queryOptions({
    queryKey: materialKeys.drafts(),
    queryFn: ({ signal }) => apiRequest('/specification-drafts', z.array(specificationDraftViewSchema), { signal }),
  });
export const draftSpecificationRevision = (draft: SpecificationDraftInput) =>
  apiRequest('/specification-drafts', specificationDraftViewSchema, { method: 'POST', body: draft });

const checkRulesSchema = z.object({ rules: z.array(checkRuleSchema) });
export const checkRulesQuery = () =>
  queryOptions({
    queryKey: materialKeys.checkRules(),
    queryFn: ({ signal }) => apiRequest('/check-analysis-rules', checkRulesSchema, { signal }),
  });
export const setCheckRule = (input: CheckRuleInput) =>
  apiRequest('/check-analysis-rules', checkRulesSchema, { method: 'POST', body: input });
export const checksDueQuery = () =>
  queryOptions({
    queryKey: materialKeys.checksDue(),
    queryFn: ({ signal }) =>
      apiRequest('/check-analyses/due', z.object({ heats: z.array(heatAwaitingCheckSchema) }), { signal }),
  });
export const recordCheckAnalysis = (heatId: number, input: CheckAnalysisInput) =>
  apiRequest(`/heats/${heatId}/check-analyses`, heatCheckAnalysisSchema, { method: 'POST', body: input });
