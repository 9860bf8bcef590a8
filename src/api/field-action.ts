import { queryOptions } from '@tanstack/vue-query';
import {
  fieldActionViewSchema,
  noticePreviewSchema,
  replyPageSchema,
  type FieldActionInput,
  type NoticeReplyInput,
  type ReturnedGoodsInput,
} from '@shared/schemas/field-action';
import { apiRequest } from './http';
import { recallKeys } from './recall';

export const fieldActionKeys = {
  one: (recallId: number) => [...recallKeys.all, 'field-action', recallId] as const,
  notice: (recallId: number, noticeId: number) => [...recallKeys.all, 'notice', recallId, noticeId] as const,
  reply: (token: string) => ['reply', token] as const,
};

export const fieldActionQuery = (recallId: number) =>
  queryOptions({
    queryKey: fieldActionKeys.one(recallId),
    queryFn: ({ signal }) => apiRequest(`/recalls/${recallId}/field-action`, fieldActionViewSchema, { signal }),
  });

export const noticePreviewQuery = (recallId: number, noticeId: number) =>
  queryOptions({
    queryKey: fieldActionKeys.notice(recallId, noticeId),
    queryFn: ({ signal }) => apiRequest(`/recalls/${recallId}/notices/${noticeId}`, noticePreviewSchema, { signal }),
  });

export const setFieldAction = (recallId: number, input: FieldActionInput) =>
  apiRequest(`/recalls/${recallId}/field-action`, fieldActionViewSchema, { method: 'PUT', body: input });
export const prepareNotices = (recallId: number) =>
  apiRequest(`/recalls/${recallId}/notices`, fieldActionViewSchema, { method: 'POST', body: {} });
export const receiveReturnedGoods = (recallId: number, input: ReturnedGoodsInput) =>
  apiRequest(`/recalls/${recallId}/returned-goods`, fieldActionViewSchema, { method: 'POST', body: input });
export const noticePdfUrl = (recallId: number, noticeId: number) => `/api/recalls/${recallId}/notices/${noticeId}/pdf`;

/** A consignee's reply page: no session, the link's token is the credential. */
export const replyPageQuery = (token: string) =>
  queryOptions({
    queryKey: fieldActionKeys.reply(token),
    queryFn: ({ signal }) => apiRequest(`/replies/${token}`, replyPageSchema, { signal }),
    retry: false,
  });
export const sendReply = (token: string, input: NoticeReplyInput) =>
  apiRequest(`/replies/${token}`, replyPageSchema, { method: 'POST', body: input });

/** Where the browser downloads a genealogy as EPCIS 2.0 JSON-LD (each export is recorded in the audit trail). */
export const recallEpcisUrl = (recallId: number) => `/api/recalls/${recallId}/epcis`;
export const lotEpcisUrl = (lotId: number) => `/api/lots/${lotId}/epcis`;
export const fieldActionReportUrl = (recallId: number, format: 'csv' | 'pdf') =>
  `/api/recalls/${recallId}/field-action/report?format=${format}`;
