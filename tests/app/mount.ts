// Mounting helpers for component tests: Quasar (with Notify and Dialog), a fresh pinia, the app's
// routes on an in-memory history, and a fake fetch that answers by method and path.
import { mount, flushPromises, type ComponentMountingOptions } from '@vue/test-utils';
import { createPinia, setActivePinia, type Pinia } from 'pinia';
import * as QuasarAll from 'quasar';
import { Dialog, Notify, Quasar } from 'quasar';
import { afterEach, vi } from 'vitest';
import { createMemoryHistory, createRouter, type RouteRecordRaw, type Router } from 'vue-router';
import { defineComponent, h, type Component, type Plugin } from 'vue';
import type { SessionUser } from 'shared/auth';
import type { Role } from 'shared/roles';
import { api } from 'src/api/client';
import routes from 'src/router/routes';
import { createAuthGuard } from 'src/router/guard';
import { useSessionStore } from 'stores/session-store';

export interface FakeResponse {
  status?: number;
  body?: unknown;
}

export type FakeRoutes = Record<string, FakeResponse | ((init: RequestInit, url: URL) => FakeResponse)>;

/** Replace fetch: keys are "METHOD /path" (no query). Unknown requests answer 404. */
export function fakeFetch(table: FakeRoutes) {
  const calls: { method: string; url: URL; init: RequestInit }[] = [];
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
    const url = new URL(String(input), 'http://localhost');
    const method = (init.method ?? 'GET').toUpperCase();
    calls.push({ method, url, init });
    const entry = table[`${method} ${url.pathname}`];
    const answer = typeof entry === 'function' ? entry(init, url) : entry;
    const status = answer?.status ?? (answer ? 200 : 404);
    const body =
      answer?.body ?? (answer ? undefined : { error: { code: 'not-found', message: `${method} ${url.pathname} was not found.` } });
    return new Response(status === 204 || body === undefined ? null : JSON.stringify(body), {
      status,
      headers: { 'Content-Type': 'application/json' },
    });
  });
  vi.stubGlobal('fetch', fetchMock);
  return { fetchMock, calls };
}

export function demoUser(role: Role): SessionUser {
  return {
    id: 7,
    email: `${role}@kestrel.example`,
    name: `Demo ${role}`,
    role,
    organization: { id: 1, name: 'Kestrel Valley Foods' },
  };
}

export interface AppHarness {
  pinia: Pinia;
  router: Router;
}

/** Pinia, the app's routes and guard; optionally signed in as `role`. */
export function createHarness(role: Role | null): AppHarness {
  const pinia = createPinia();
  setActivePinia(pinia);
  api.setCsrfToken(null);
  const session = useSessionStore(pinia);
  if (role) session.setSession({ user: demoUser(role), csrfToken: 'test-token' });
  else session.loaded = true;
  // Start on a blank public screen: the app's '/' would lazily load the Overview in the background,
  // and a test that ends before that import settles fails at teardown.
  const history = createMemoryHistory();
  history.replace(HARNESS_START);
  const router = createRouter({
    history,
    routes: [{ path: HARNESS_START, component: BlankScreen, meta: { public: true } }, ...trackedRoutes],
  });
  router.beforeEach(createAuthGuard(pinia));
  return { pinia, router };
}

const HARNESS_START = '/__harness-start';
const BlankScreen = defineComponent({ name: 'HarnessStart', setup: () => () => h('div') });

/*
 * Every lazy page a test opens is imported in the background; the file's environment must outlive
 * those imports, so each one is remembered and awaited after every test.
 */
const pendingPageLoads = new Set<Promise<unknown>>();

function trackLazyPages(records: readonly RouteRecordRaw[]): RouteRecordRaw[] {
  return records.map((record) => {
    const tracked = { ...record } as RouteRecordRaw & { component?: unknown; children?: RouteRecordRaw[] };
    const load = tracked.component;
    if (typeof load === 'function' && !('setup' in load) && !('render' in load)) {
      tracked.component = () => {
        const loading = (load as () => Promise<unknown>)();
        pendingPageLoads.add(loading);
        void loading.finally(() => pendingPageLoads.delete(loading)).catch(() => undefined);
        return loading;
      };
    }
    if (tracked.children) tracked.children = trackLazyPages(tracked.children);
    return tracked as RouteRecordRaw;
  });
}

const trackedRoutes = trackLazyPages(routes);

afterEach(async () => {
  while (pendingPageLoads.size > 0) await Promise.allSettled([...pendingPageLoads]);
});

/** Stub for the chart: ApexCharts needs a real canvas and layout. */
export const ChartPanelStub = defineComponent({
  name: 'ChartPanel',
  props: { series: { type: Array, default: () => [] } },
  setup: (props) => () => h('div', { 'data-testid': 'chart-stub' }, JSON.stringify(props.series)),
});

/**
 * Mount a page the way the app shows it: inside QLayout > QPageContainer (QPage needs both).
 */
export function mountInLayout(
  page: Component,
  harness: AppHarness,
  options: ComponentMountingOptions<Component> = {},
  pageProps: Record<string, unknown> = {},
) {
  const Wrapper = defineComponent({
    setup: () => () =>
      h(
        // Resolved globally by the Quasar plugin.
        resolveQ('QLayout'),
        { view: 'hHh lpR fFf' },
        { default: () => h(resolveQ('QPageContainer'), null, { default: () => h(page, pageProps) }) },
      ),
  });
  return mount(Wrapper, {
    ...options,
    global: {
      plugins: [quasarPlugin, harness.pinia, harness.router],
      stubs: { ChartPanel: ChartPanelStub },
      ...options.global,
    },
    attachTo: document.body,
  });
}

function resolveQ(name: 'QLayout' | 'QPageContainer'): Component {
  return QuasarAll[name] as Component;
}

/*
 * The app's build imports Quasar components per template (Quasar's Vite plugin); here every
 * component and directive is registered globally instead.
 */
const quasarComponents = Object.fromEntries(
  Object.entries(QuasarAll).filter(([name, value]) => /^Q[A-Z]/.test(name) && typeof value === 'object' && value !== null && ('setup' in value || 'render' in value)),
);
const quasarDirectives = { ClosePopup: QuasarAll.ClosePopup, Ripple: QuasarAll.Ripple };
const quasarPlugin: [Plugin, ...unknown[]] = [
  Quasar,
  { plugins: { Notify, Dialog }, components: quasarComponents, directives: quasarDirectives },
];

export function mountWithApp(component: Component, harness: AppHarness, options: ComponentMountingOptions<Component> = {}) {
  return mount(component, {
    ...options,
    global: {
      plugins: [quasarPlugin, harness.pinia, harness.router],
      stubs: { ChartPanel: ChartPanelStub },
      ...options.global,
    },
    attachTo: document.body,
  });
}

export { flushPromises };
