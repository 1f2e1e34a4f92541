import {
  createRouter,
  createWebHistory,
  type RouteLocationNormalized,
  type Router,
  type RouterHistory,
} from 'vue-router';
import { onUnauthorized } from '@/api/client';
import { useSessionStore } from '@/stores/session';
import { routes } from './routes';

function documentTitle(route: RouteLocationNormalized): string {
  const title = route.meta.title;
  const name = typeof title === 'function' ? title(route) : title;
  return name ? `${name} · Brimwatch` : 'Brimwatch';
}

/**
 * Builds the app's router. Guards here are for convenience only: the server
 * decides access. Needs an active Pinia, since a 401 clears the session store.
 */
export function createBrimwatchRouter(history: RouterHistory = createWebHistory()): Router {
  const router = createRouter({ history, routes });

  router.afterEach((to) => {
    document.title = documentTitle(to);
  });

  // The single place that reacts to an expired or missing session.
  onUnauthorized(() => {
    useSessionStore().forget();
    const here = router.currentRoute.value;
    if (here.name !== 'sign-in') void router.push({ name: 'sign-in', query: { next: here.fullPath } });
  });

  return router;
}
