// Typed route names: `router.push({ name: 'flet' })` fails the type check.
import type { RouteLocationNormalized, RouteRecordInfo } from 'vue-router';

type NoParams = Record<never, never>;

export interface RouteNamedMap {
  fleet: RouteRecordInfo<'fleet', '/fleet', NoParams, NoParams>;
  alerts: RouteRecordInfo<'alerts', '/alerts', NoParams, NoParams>;
  history: RouteRecordInfo<'history', '/history', NoParams, NoParams>;
  planner: RouteRecordInfo<'planner', '/planner', NoParams, NoParams>;
  uploads: RouteRecordInfo<'uploads', '/uploads', NoParams, NoParams>;
  admin: RouteRecordInfo<'admin', '/admin', NoParams, NoParams>;
  sketch: RouteRecordInfo<'sketch', '/sketches/:id', { id: string | number }, { id: string }>;
  'sketch-new': RouteRecordInfo<'sketch-new', '/sketches/new', NoParams, NoParams>;
  'sketch-edit': RouteRecordInfo<'sketch-edit', '/sketches/:id/edit', { id: string | number }, { id: string }>;
  'sign-in': RouteRecordInfo<'sign-in', '/sign-in', NoParams, NoParams>;
  'not-found': RouteRecordInfo<'not-found', '/:path(.*)*', { path: string | string[] }, { path: string[] }>;
}

export type RouteName = keyof RouteNamedMap;

declare module 'vue-router' {
  interface TypesConfig {
    RouteNamedMap: RouteNamedMap;
  }
  interface RouteMeta {
    /** The page's name in the tab title, "<title> · Brimwatch". */
    title?: string | ((route: RouteLocationNormalized) => string);
  }
}
