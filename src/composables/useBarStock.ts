import { computed, type Ref } from 'vue';
import { useMutation, useQuery, useQueryClient } from '@tanstack/vue-query';
import { invalidateAfter } from '../api/invalidation';
import type { BarCut, BarListQuery, BarReceipt } from '@shared/schemas/materials';
import { barCutAllowanceQuery, barPieceQuery, barPiecesQuery, cutBar, receiveBar } from '../api/bar-stock';

export const useBarPieces = (query: Ref<BarListQuery>) => useQuery(computed(() => barPiecesQuery(query.value)));
export const useBarPiece = (id: Ref<number>) => useQuery(computed(() => barPieceQuery(id.value)));
export const useBarCutAllowance = () => useQuery(barCutAllowanceQuery());

export function useReceiveBar() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (receipt: BarReceipt) => receiveBar(receipt),
    onSuccess: () => invalidateAfter(queryClient, 'bar-stock'),
  });
}

export function useCutBar(id: Ref<number>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (cut: BarCut) => cutBar(id.value, cut),
    onSuccess: () => invalidateAfter(queryClient, 'bar-stock'),
  });
}
