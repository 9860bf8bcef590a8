import { mount, flushPromises } from '@vue/test-utils';
import PrimeVue from 'primevue/config';
import { createPinia } from 'pinia';
import { QueryClient, VueQueryPlugin } from '@tanstack/vue-query';
import { createMemoryHistory, createRouter } from 'vue-router';
import { describe, expect, it } from 'vitest';
import type { Role } from '@shared/auth/roles';
import { allowedActions } from '@shared/auth/permissions';
import { productAreas } from '../../../src/navigation/areas';
import { routes } from '../../../src/router';
import { sessionKeys } from '../../../src/api/session';
import AreaNotYetBuiltView from '../../../src/views/AreaNotYetBuiltView.vue';
import AppNavigationRail from '../../../src/components/AppNavigationRail.vue';

async function mountAt(path: string, component: object, roles: Role[] = ['auditor']) {
  const router = createRouter({ history: createMemoryHistory(), routes });
  await router.push(path);
  const queryClient = new QueryClient();
  queryClient.setQueryData(sessionKeys.me(), {
    person: { id: 1, name: 'Test Person', email: 't@example.test', roles },
    actions: allowedActions(roles),
    csrfToken: 'token',
    session: { idleMinutes: 15, absoluteExpiresAt: '2026-12-02T00:00:00.000Z' },
  });
  const wrapper = mount(component, {
    global: { plugins: [router, createPinia(), PrimeVue, [VueQueryPlugin, { queryClient }]] },
  });
  await flushPromises();
  return wrapper;
}

describe('navigation', () => {
  it('when the router is built, then every product area has its own route and path', () => {
    for (const area of productAreas) {
      expect(routes.find((route) => route.name === area.name)?.path).toBe(area.path);
    }
    expect(new Set(productAreas.map((area) => area.path)).size).toBe(productAreas.length);
  });

  it('when an auditor sees the rail, then it links to the overview and to every area in chain order', async () => {
    const wrapper = await mountAt('/', AppNavigationRail, ['auditor']);
    const links = wrapper.findAll('a').map((link) => [link.text(), link.attributes('href')]);
    expect(links).toEqual([['Overview', '/'], ...productAreas.map((area) => [area.title, area.path])]);
  });

  it('when an administrator sees the rail, then only the overview and administration show', async () => {
    const wrapper = await mountAt('/', AppNavigationRail, ['administrator']);
    expect(wrapper.findAll('a').map((link) => link.text())).toEqual(['Overview', 'Administration']);
  });

  it('when an area is not built yet, then its page says so and lists what it will hold', async () => {
    const wrapper = await mountAt('/trace', AreaNotYetBuiltView);
    expect(wrapper.find('h1').text()).toBe('Trace and recall');
    expect(wrapper.text()).toContain('this area is not built in this version of Ingotrace');
    expect(wrapper.findAll('li').length).toBe(productAreas.find((area) => area.name === 'trace')?.plannedWork.length);
  });
});
