import { keepPreviousData, queryOptions } from '@tanstack/vue-query';
import { z } from 'zod';
import {
  barCutAllowanceSchema,
  barPageSchema,
  barPieceSchema,
  type BarCut,
  type BarListQuery,
  type BarReceipt,
} from '@shared/schemas/materials';
import { apiRequest } from './http';

export const barKeys = {
  all: ['bar-pieces'] as const,
  list: (query: BarListQuery) => [...barKeys.all, 'list', query] as const,
  piece: (id: number) => [...barKeys.all, 'piece', id] as const,
  cutAllowance: () => ['bar-cut-allowance'] as const,
};

export const barCutAllowanceQuery = () =>
  queryOptions({
    queryKey: barKeys.cutAllowance(),
    queryFn: ({ signal }) => apiRequest('/bar-cut-allowance', barCutAllowanceSchema, { signal }),
    staleTime: Infinity,
  });

export const barPiecesQuery = (query: BarListQuery) =>
  queryOptions({
    queryKey: barKeys.list(query),
    queryFn: ({ signal }) => {
      const params = new URLSearchParams({
        page: String(query.page),
        pageSize: String(query.pageSize),
        inStockOnly: query.inStockOnly,
      });
      if (query.search) params.set('search', query.search);
      if (query.heatId) params.set('heatId', String(query.heatId));
      return apiRequest(`/bar-pieces?${params}`, barPageSchema, { signal });
    },
    placeholderData: keepPreviousData,
  });

export const barPieceQuery = (id: number) =>
  queryOptions({
    queryKey: barKeys.piece(id),
    queryFn: ({ signal }) => apiRequest(`/bar-pieces/${id}`, barPieceSchema, { signal }),
  });

export const receiveBar = (receipt: BarReceipt) =>
  apiRequest('/bar-pieces', barPieceSchema, { method: 'POST', body: receipt });
export const cutBar = (id: number, cut: BarCut) =>
  apiRequest(`/bar-pieces/${id}/cuts`, z.array(barPieceSchema), { method: 'POST', body: cut });
