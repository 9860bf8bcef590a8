import { computed, type Ref } from 'vue';
import { useMutation, useQuery, useQueryClient } from '@tanstack/vue-query';
import type { FieldActionInput, NoticeReplyInput, ReturnedGoodsInput } from '@shared/schemas/field-action';
import * as api from '../api/field-action';
import { invalidateAfter } from '../api/invalidation';

export const useFieldAction = (recallId: Ref<number>) => useQuery(computed(() => api.fieldActionQuery(recallId.value)));
export const useNoticePreview = (recallId: Ref<number>, noticeId: Ref<number>) =>
  useQuery(computed(() => api.noticePreviewQuery(recallId.value, noticeId.value)));

/** Every change answers with the whole field action; holds placed by returned goods change lots too. */
function useFieldActionChange<Input>(
  recallId: Ref<number>,
  change: (input: Input) => ReturnType<typeof api.prepareNotices>,
) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: change,
    onSuccess: async (view) => {
      queryClient.setQueryData(api.fieldActionKeys.one(recallId.value), view);
      await invalidateAfter(queryClient, 'recall');
    },
  });
}

export const useSetFieldAction = (recallId: Ref<number>) =>
  useFieldActionChange(recallId, (input: FieldActionInput) => api.setFieldAction(recallId.value, input));
export const usePrepareNotices = (recallId: Ref<number>) =>
  useFieldActionChange(recallId, () => api.prepareNotices(recallId.value));
export const useReceiveReturnedGoods = (recallId: Ref<number>) =>
  useFieldActionChange(recallId, (input: ReturnedGoodsInput) => api.receiveReturnedGoods(recallId.value, input));

export const useReplyPage = (token: Ref<string>) => useQuery(computed(() => api.replyPageQuery(token.value)));
export function useSendReply(token: Ref<string>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: NoticeReplyInput) => api.sendReply(token.value, input),
    onSuccess: (page) => queryClient.setQueryData(api.fieldActionKeys.reply(token.value), page),
  });
}
