import { useMutation } from '@tanstack/vue-query';
import * as api from '../api/trace';

/** A bulk trace writes only its audit trail event; nothing else goes stale. */
export const useBulkTrace = () => useMutation({ mutationFn: (text: string) => api.bulkTrace(text) });
