import { createRouter, createWebHistory, type RouteRecordRaw } from 'vue-router';
import type { QueryClient } from '@tanstack/vue-query';
import { rolesAllow } from '@shared/auth/permissions';
import { productAreas, type AreaRouteName } from '../navigation/areas';
import { meQuery } from '../api/session';

export type RouteName =
  | 'overview'
  | AreaRouteName
  | 'heat'
  | 'suppliers'
  | 'supplier'
  | 'bar-piece'
  | 'specifications'
  | 'lot'
  | 'parts'
  | 'process-run'
  | 'process-methods'
  | 'nonconformances'
  | 'nonconformance'
  | 'consignees'
  | 'recalls'
  | 'recall'
  | 'reply'
  | 'sign-in'
  | 'signed-out'
  | 'reauthentication-complete'
  | 'not-permitted'
  | 'not-found';

/** Areas that are built; the rest show what they will hold. */
const areaViews: Partial<Record<AreaRouteName, () => Promise<unknown>>> = {
  administration: () => import('../views/PeopleAdministrationView.vue'),
  heats: () => import('../views/HeatsView.vue'),
  'bar-stock': () => import('../views/BarStockView.vue'),
  lots: () => import('../views/LotsView.vue'),
  'process-runs': () => import('../views/ProcessRunsView.vue'),
  release: () => import('../views/ReleaseDeskView.vue'),
  trace: () => import('../views/TraceView.vue'),
  audit: () => import('../views/AuditLedgerView.vue'),
};

const areaRoutes: RouteRecordRaw[] = productAreas.map((area) => ({
  path: area.path,
  name: area.name,
  component: areaViews[area.name] ?? (() => import('../views/AreaNotYetBuiltView.vue')),
  meta: { title: area.title, area: area.name, action: area.action },
}));

export const routes: RouteRecordRaw[] = [
  { path: '/', name: 'overview', component: () => import('../views/OverviewView.vue'), meta: { title: 'Overview' } },
  ...areaRoutes,
  {
    path: '/heats/:heatId(\\d+)',
    name: 'heat',
    component: () => import('../views/HeatDetailView.vue'),
    meta: { title: 'Heat', area: 'heats', action: 'materials.read' },
  },
  {
    path: '/bar-stock/:pieceId(\\d+)',
    name: 'bar-piece',
    component: () => import('../views/BarPieceView.vue'),
    meta: { title: 'Bar piece', area: 'bar-stock', action: 'materials.read' },
  },
  {
    path: '/lots/:lotId(\\d+)',
    name: 'lot',
    component: () => import('../views/LotDetailView.vue'),
    meta: { title: 'Lot', area: 'lots', action: 'lots.read' },
  },
  {
    path: '/suppliers',
    name: 'suppliers',
    component: () => import('../views/SuppliersView.vue'),
    meta: { title: 'Suppliers', area: 'heats', action: 'materials.read' },
  },
  {
    path: '/suppliers/:supplierId(\\d+)',
    name: 'supplier',
    component: () => import('../views/SupplierDetailView.vue'),
    meta: { title: 'Supplier', area: 'heats', action: 'materials.read' },
  },
  {
    path: '/consignees',
    name: 'consignees',
    component: () => import('../views/ConsigneesView.vue'),
    meta: { title: 'Consignees', area: 'lots', action: 'lots.read' },
  },
  {
    path: '/parts',
    name: 'parts',
    component: () => import('../views/PartsView.vue'),
    meta: { title: 'Parts and routings', area: 'lots', action: 'lots.read' },
  },
  {
    path: '/process-methods',
    name: 'process-methods',
    component: () => import('../views/ProcessMethodsView.vue'),
    meta: { title: 'Process methods', area: 'process-runs', action: 'lots.read' },
  },
  {
    path: '/process-runs/:runId(\\d+)',
    name: 'process-run',
    component: () => import('../views/ProcessRunDetailView.vue'),
    meta: { title: 'Process run', area: 'process-runs', action: 'lots.read' },
  },
  {
    path: '/nonconformances',
    name: 'nonconformances',
    component: () => import('../views/NonconformancesView.vue'),
    meta: { title: 'Nonconformances', area: 'lots', action: 'lots.read' },
  },
  {
    path: '/nonconformances/:ncId(\\d+)',
    name: 'nonconformance',
    component: () => import('../views/NonconformanceDetailView.vue'),
    meta: { title: 'Nonconformance', area: 'lots', action: 'lots.read' },
  },
  {
    path: '/recalls',
    name: 'recalls',
    component: () => import('../views/RecallsView.vue'),
    meta: { title: 'Recall investigations', area: 'trace', action: 'recall.read' },
  },
  {
    path: '/recalls/:recallId(\\d+)',
    name: 'recall',
    component: () => import('../views/RecallDetailView.vue'),
    meta: { title: 'Recall investigation', area: 'trace', action: 'recall.read' },
  },
  {
    path: '/specifications',
    name: 'specifications',
    component: () => import('../views/SpecificationsView.vue'),
    meta: { title: 'Specification library', area: 'heats', action: 'materials.read' },
  },
  {
    path: '/sign-in',
    name: 'sign-in',
    component: () => import('../views/SignInView.vue'),
    meta: { title: 'Sign in', public: true },
  },
  {
    path: '/reply/:token',
    name: 'reply',
    component: () => import('../views/ReplyView.vue'),
    meta: { title: 'Recall notice reply', public: true },
  },
  {
    path: '/signed-out',
    name: 'signed-out',
    component: () => import('../views/SignedOutView.vue'),
    meta: { title: 'Signed out', public: true },
  },
  {
    path: '/reauthentication-complete',
    name: 'reauthentication-complete',
    component: () => import('../views/ReauthenticationCompleteView.vue'),
    meta: { title: 'Password confirmed', public: true },
  },
  {
    path: '/not-permitted',
    name: 'not-permitted',
    component: () => import('../views/NotPermittedView.vue'),
    meta: { title: 'Not permitted' },
  },
  {
    path: '/:pathMatch(.*)*',
    name: 'not-found',
    component: () => import('../views/NotFoundView.vue'),
    meta: { title: 'Not found' },
  },
];

export function createAppRouter(queryClient: QueryClient) {
  const router = createRouter({ history: createWebHistory(), routes });
  // The server refuses what a role may not do; the guard only spares people pages they cannot use.
  router.beforeEach(async (to) => {
    if (to.meta.public) return true;
    const me = await queryClient.ensureQueryData(meQuery());
    if (!me) return { name: 'sign-in', query: { returnTo: to.fullPath } };
    if (to.meta.action && !rolesAllow(me.person.roles, to.meta.action))
      return { name: 'not-permitted', query: { from: to.fullPath } };
    return true;
  });
  router.afterEach((to) => {
    const title = typeof to.meta.title === 'string' ? to.meta.title : '';
    document.title = title ? `${title} · Ingotrace` : 'Ingotrace';
  });
  return router;
}
