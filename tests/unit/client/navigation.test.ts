import { mount, flushPromises } from '@vue/test-utils';
import PrimeVue from 'primevue/config';
import { createMemoryHistory, createRouter } from 'vue-router';
import { describe, expect, it } from 'vitest';
import { productAreas } from '../../../src/navigation/areas';
import { routes } from '../../../src/router';
import AreaNotYetBuiltView from '../../../src/views/AreaNotYetBuiltView.vue';
import AppNavigationRail from '../../../src/components/AppNavigationRail.vue';
import { createPinia } from 'pinia';

async function mountAt(path: string, component: object) {
  const router = createRouter({ history: createMemoryHistory(), routes });
  await router.push(path);
  const wrapper = mount(component, { global: { plugins: [router, createPinia(), PrimeVue] } });
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

  it('when the rail is shown, then it links to the overview and to every area in chain order', async () => {
    const wrapper = await mountAt('/', AppNavigationRail);
    const links = wrapper.findAll('a').map((link) => [link.text(), link.attributes('href')]);
    expect(links).toEqual([['Overview', '/'], ...productAreas.map((area) => [area.title, area.path])]);
  });

  it('when an area is not built yet, then its page says so and lists what it will hold', async () => {
    const wrapper = await mountAt('/trace', AreaNotYetBuiltView);
    expect(wrapper.find('h1').text()).toBe('Trace and recall');
    expect(wrapper.text()).toContain('this area is not built in this version of Ingotrace');
    expect(wrapper.findAll('li').length).toBe(productAreas.find((area) => area.name === 'trace')?.plannedWork.length);
  });
});
