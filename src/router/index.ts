import { createRouter, createWebHistory, type RouteRecordRaw } from 'vue-router';
import { productAreas, type AreaRouteName } from '../navigation/areas';

export type RouteName = 'overview' | AreaRouteName | 'not-found';

const areaRoutes: RouteRecordRaw[] = productAreas.map((area) => ({
  path: area.path,
  name: area.name,
  component: () => import('../views/AreaNotYetBuiltView.vue'),
  meta: { title: area.title, area: area.name },
}));

export const routes: RouteRecordRaw[] = [
  { path: '/', name: 'overview', component: () => import('../views/OverviewView.vue'), meta: { title: 'Overview' } },
  ...areaRoutes,
  { path: '/:pathMatch(.*)*', name: 'not-found', component: () => import('../views/NotFoundView.vue'), meta: { title: 'Not found' } },
];

export function createAppRouter() {
  const router = createRouter({ history: createWebHistory(), routes });
  router.afterEach((to) => {
    const title = typeof to.meta.title === 'string' ? to.meta.title : '';
    document.title = title ? `${title} · Ingotrace` : 'Ingotrace';
  });
  return router;
}
