// Mounts components the way the app does: Quasar, Pinia and a router in
// memory, and pages inside QLayout > QPageContainer, where QPage can render.
import { mount, flushPromises } from '@vue/test-utils';
import { createPinia, setActivePinia } from 'pinia';
import { Quasar, QLayout, QPageContainer } from 'quasar';
import { defineComponent, h, type Component } from 'vue';
import { createMemoryHistory, RouterView, type Router } from 'vue-router';
import { createBrimwatchRouter } from '@/router';

export interface Mounted {
  wrapper: ReturnType<typeof mount>;
  router: Router;
}

async function withRouter(root: Component, path: string): Promise<Mounted> {
  const pinia = createPinia();
  setActivePinia(pinia);
  const router = createBrimwatchRouter(createMemoryHistory());
  await router.push(path);
  await router.isReady();
  const wrapper = mount(root, { attachTo: document.body, global: { plugins: [Quasar, pinia, router] } });
  await flushPromises();
  return { wrapper, router };
}

/** The whole app shell at `path`. */
export async function mountApp(path = '/'): Promise<Mounted> {
  const App = (await import('@/App.vue')).default;
  return withRouter(App, path);
}

/** The page the router shows at `path`, without the shell's bars. */
export async function mountPage(path: string): Promise<Mounted> {
  const Shell = defineComponent({
    render: () => h(QLayout, { view: 'hHh lpR fFf' }, () => h(QPageContainer, () => h(RouterView))),
  });
  const mounted = await withRouter(Shell, path);
  // Lazy pages resolve after the first navigation settles.
  await flushPromises();
  return mounted;
}
