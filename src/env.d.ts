/// <reference types="vite/client" />
import 'vue-router';
import type { Action } from '@shared/auth/permissions';

declare module 'vue-router' {
  interface RouteMeta {
    title?: string;
    area?: string;
    action?: Action;
    /** Reachable without signing in, shown without the navigation. */
    public?: boolean;
  }
}
