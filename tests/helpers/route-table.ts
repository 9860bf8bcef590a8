import type { Express } from 'express';
import type { RouteAccess } from '../../server/src/middleware/access';

export interface RegisteredRoute {
  method: string;
  path: string;
  access: RouteAccess | null;
}

interface LayerLike {
  route?: { path: string; methods: Record<string, boolean>; stack: Array<{ handle: { access?: RouteAccess } }> };
  handle?: { stack?: LayerLike[] };
  rawPath?: string | RegExp;
}

/** Every route registered in the Express app, with the access guard its handlers start with. */
export function routeTable(app: Express): RegisteredRoute[] {
  const routes: RegisteredRoute[] = [];
  const walk = (stack: LayerLike[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        const access = layer.route.stack[0]?.handle.access ?? null;
        for (const method of Object.keys(layer.route.methods))
          routes.push({ method: method.toUpperCase(), path: prefix + layer.route.path, access });
      } else if (layer.handle?.stack) {
        const mount = typeof layer.rawPath === 'string' && layer.rawPath !== '/' ? layer.rawPath : '';
        walk(layer.handle.stack, prefix + mount);
      }
    }
  };
  walk((app as unknown as { router: { stack: LayerLike[] } }).router.stack, '');
  return routes;
}
