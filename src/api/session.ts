import { queryOptions } from '@tanstack/vue-query';
import { z } from 'zod';
import { meSchema, type Me } from '@shared/schemas/people';
import { apiRequest, isApiError, setCsrfToken } from './http';

export const sessionKeys = {
  all: ['session'] as const,
  me: () => [...sessionKeys.all, 'me'] as const,
};

/** The signed-in person, or null when nobody is signed in. */
export async function fetchMe(signal?: AbortSignal): Promise<Me | null> {
  try {
    const me = await apiRequest('/me', meSchema, { signal });
    setCsrfToken(me.csrfToken);
    return me;
  } catch (error) {
    if (isApiError(error) && error.status === 401) {
      setCsrfToken(null);
      return null;
    }
    throw error;
  }
}

export const meQuery = () =>
  queryOptions({
    queryKey: sessionKeys.me(),
    queryFn: ({ signal }) => fetchMe(signal),
    staleTime: 60_000,
    retry: false,
  });

const signOutSchema = z.object({ redirectUrl: z.string() });

/** Ends the session here; returns where the browser goes to end it at the identity provider. */
export function signOut(): Promise<{ redirectUrl: string }> {
  return apiRequest('/logout', signOutSchema, { method: 'POST', base: '/auth' });
}
