import { flushPromises, mount } from '@vue/test-utils';
import PrimeVue from 'primevue/config';
import { createPinia } from 'pinia';
import { QueryClient, VueQueryPlugin } from '@tanstack/vue-query';
import { createMemoryHistory, createRouter } from 'vue-router';
import { vi } from 'vitest';
import type { Component } from 'vue';
import type { Role } from '@shared/auth/roles';
import { allowedActions } from '@shared/auth/permissions';
import { routes } from '../../../../src/router';
import { sessionKeys } from '../../../../src/api/session';
import { systemKeys } from '../../../../src/api/system';

/** One answer of the stand-in server: status and JSON body for a method and path. */
export interface StubbedReply {
  method?: string;
  path: string | RegExp;
  status?: number;
  body: unknown;
}

/**
 * The browser's fetch answered from a list (component tests run without a server; the API
 * itself is tested against the real one in tests/api). Records each request it was asked.
 */
export function stubFetch(replies: StubbedReply[]) {
  const asked: Array<{ method: string; path: string; body: unknown }> = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: string, init?: RequestInit) => {
      const method = init?.method ?? 'GET';
      const path = input.replace(/^\/api/, '');
      asked.push({ method, path, body: init?.body ? JSON.parse(String(init.body)) : undefined });
      const reply = replies.find(
        (candidate) =>
          (candidate.method ?? 'GET') === method &&
          (typeof candidate.path === 'string' ? candidate.path === path : candidate.path.test(path)),
      );
      if (!reply) return new Response(JSON.stringify({ error: { code: 'NOT_FOUND', message: path } }), { status: 404 });
      return new Response(JSON.stringify(reply.body), {
        status: reply.status ?? 200,
        headers: { 'Content-Type': 'application/json' },
      });
    }),
  );
  return asked;
}

/** Mounts a component inside the app's plugins, signed in with the given roles, on the plant's clock. */
export async function mountInApp(
  component: Component,
  options: { props?: Record<string, unknown>; roles?: Role[]; timeZone?: string; path?: string } = {},
) {
  const roles = options.roles ?? ['qa-approver'];
  const router = createRouter({ history: createMemoryHistory(), routes });
  await router.push(options.path ?? '/');
  const queryClient = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  queryClient.setQueryData(sessionKeys.me(), {
    person: { id: 7, name: 'Test Approver', email: 'approver@example.test', roles },
    actions: allowedActions(roles),
    csrfToken: 'token',
    session: { idleMinutes: 15, absoluteExpiresAt: '2026-12-06T00:00:00.000Z' },
  });
  queryClient.setQueryData(systemKeys.organisation(), {
    name: 'Test Works',
    site: 'Test plant',
    address: 'Nowhere 1',
    gs1CompanyPrefix: null,
    timeZone: options.timeZone ?? 'Europe/London',
  });
  const wrapper = mount(component, {
    props: options.props,
    attachTo: document.body,
    global: { plugins: [router, createPinia(), PrimeVue, [VueQueryPlugin, { queryClient }]] },
  });
  await flushPromises();
  return wrapper;
}
