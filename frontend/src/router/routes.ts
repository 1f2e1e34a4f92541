import type { RouteRecordRaw } from 'vue-router';
import './route-names';

// Pages load on demand so the first screen stays small.
export const routes: RouteRecordRaw[] = [
  { path: '/', redirect: { name: 'fleet' } },
  { path: '/fleet', name: 'fleet', component: () => import('@/pages/FleetPage.vue'), meta: { title: 'Fleet' } },
  { path: '/alerts', name: 'alerts', component: () => import('@/pages/AlertsPage.vue'), meta: { title: 'Alerts' } },
  { path: '/history', name: 'history', component: () => import('@/pages/HistoryPage.vue'), meta: { title: 'History' } },
  { path: '/planner', name: 'planner', component: () => import('@/pages/PlannerPage.vue'), meta: { title: 'Planner' } },
  { path: '/uploads', name: 'uploads', component: () => import('@/pages/UploadsPage.vue'), meta: { title: 'Uploads' } },
  { path: '/admin', name: 'admin', component: () => import('@/pages/AdminPage.vue'), meta: { title: 'Admin' } },
  {
    path: '/sketches/new',
    name: 'sketch-new',
    component: () => import('@/pages/SketchFormPage.vue'),
    meta: { title: 'Register a sketch' },
  },
  {
    path: '/sketches/:id(\\d+)',
    name: 'sketch',
    component: () => import('@/pages/SketchPage.vue'),
    meta: { title: (route) => ('id' in route.params ? `Sketch ${route.params.id}` : 'Sketch') },
  },
  {
    path: '/sketches/:id(\\d+)/edit',
    name: 'sketch-edit',
    component: () => import('@/pages/SketchFormPage.vue'),
    meta: { title: (route) => ('id' in route.params ? `Change sketch ${route.params.id}` : 'Change a sketch') },
  },
  { path: '/sign-in', name: 'sign-in', component: () => import('@/pages/SignInPage.vue'), meta: { title: 'Sign in' } },
  {
    path: '/:path(.*)*',
    name: 'not-found',
    component: () => import('@/pages/NotFoundPage.vue'),
    meta: { title: 'Page not found' },
  },
];
