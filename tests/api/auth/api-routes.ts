import type express from 'express';
import { permissionOf, type Permission } from '../../../backend/src/auth/permission';

export interface ApiRoute {
  method: string;
  path: string;
  permission: Permission | undefined;
}

interface Layer {
  rawPath?: unknown;
  handle: { stack?: Layer[] } & ((...args: unknown[]) => unknown);
  route?: { path: unknown; methods: Record<string, boolean>; stack: { method?: string; handle: unknown }[] };
}

/**
 * Every route the app answers under /api, read from Express's own router
 * stack (not from a list someone keeps), with the permission its first handler declares.
 */
export function apiRoutes(app: express.Express): ApiRoute[] {
  const found: ApiRoute[] = [];
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack, '', found);
  return found.filter((r) => r.path.startsWith('/api/'));
}

function walk(stack: Layer[], prefix: string, found: ApiRoute[]): void {
  for (const layer of stack) {
    if (layer.route) {
      for (const method of Object.keys(layer.route.methods)) {
        const first = layer.route.stack.find((l) => l.method === method || l.method === undefined);
        found.push({ method: method.toUpperCase(), path: prefix + String(layer.route.path), permission: permissionOf(first?.handle) });
      }
    } else if (Array.isArray(layer.handle.stack)) {
      const mount = typeof layer.rawPath === 'string' && layer.rawPath !== '/' ? layer.rawPath : '';
      walk(layer.handle.stack, prefix + mount, found);
    }
  }
}
