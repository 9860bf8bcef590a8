import { queryOptions } from '@tanstack/vue-query';
import { z } from 'zod';
import { reauthenticationStatusSchema } from '@shared/schemas/reauthentication';
import {
  signaturePreparationSchema,
  signatureSchema,
  type SignatureIntent,
  type SignatureRequest,
} from '@shared/schemas/signatures';
import { apiRequest } from './http';

export const signatureKeys = {
  all: ['signatures'] as const,
  type: (recordType: string) => [...signatureKeys.all, recordType] as const,
  record: (recordType: string, recordId?: string) =>
    [...signatureKeys.type(recordType), recordId ?? '(newest)'] as const,
};

/** One record's signatures, or without recordId the newest signatures of the record type. */
export const recordSignaturesQuery = (recordType: string, recordId?: string) =>
  queryOptions({
    queryKey: signatureKeys.record(recordType, recordId),
    queryFn: ({ signal }) =>
      apiRequest(
        `/signatures?${new URLSearchParams(recordId ? { recordType, recordId } : { recordType })}`,
        z.array(signatureSchema),
        { signal },
      ),
  });

export function prepareSignature(intent: SignatureIntent) {
  return apiRequest('/signatures/preparations', signaturePreparationSchema, { method: 'POST', body: intent });
}

export function startReauthentication(purpose: string, bindingHash: string) {
  return apiRequest('/reauthentications', reauthenticationStatusSchema, {
    method: 'POST',
    body: { purpose, bindingHash, returnTo: '/reauthentication-complete' },
  });
}

export function reauthenticationStatus(id: string) {
  return apiRequest(`/reauthentications/${id}`, reauthenticationStatusSchema);
}

export function cancelReauthentication(id: string) {
  return apiRequest(`/reauthentications/${id}/cancel`, reauthenticationStatusSchema, { method: 'POST' });
}

export function submitSignature(request: SignatureRequest) {
  return apiRequest('/signatures', signatureSchema, { method: 'POST', body: request });
}
