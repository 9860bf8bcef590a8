import { computed, type ComputedRef, type Ref } from 'vue';
import type { FieldErrors } from '@shared/errors';
import { isApiError } from '../api/http';

/**
 * The field messages of a failed request, from the API's one error shape, keyed as the request
 * named them ("qty", "parameters.temperature"); empty while there is no error. Forms show each
 * beside its field.
 */
export function useFieldErrors(error: Ref<unknown> | (() => unknown)): ComputedRef<FieldErrors> {
  return computed(() => {
    const value = typeof error === 'function' ? error() : error.value;
    return isApiError(value) ? (value.fields ?? {}) : {};
  });
}
