import { describe, expect, it } from 'vitest';
import { ref } from 'vue';
import { ApiError } from '../../../src/api/http';
import { useFieldErrors } from '../../../src/composables/useFieldErrors';

// The API's one error shape (code, message, fields); the product's own contract, no published source.
describe('field messages from a failed request', () => {
  it('when the request failed with field messages, then each field has its message; otherwise there are none', () => {
    const error = ref<unknown>(null);
    const fields = useFieldErrors(error);
    expect(fields.value).toEqual({});
    error.value = new ApiError(422, 'VALIDATION_FAILED', 'Some fields are not valid', {
      qty: 'At most 5',
      'parameters.temperature': 'Write a number',
    });
    expect(fields.value).toEqual({ qty: 'At most 5', 'parameters.temperature': 'Write a number' });
    error.value = new Error('network down');
    expect(fields.value).toEqual({});
  });
});
