// Wires the app's one API client (src/api/client.ts) into the app: a lost session (401) clears the
// session store and sends the user to sign-in, and the navigation guard checks sign-in and roles.
import { defineBoot } from '#q-app/wrappers';
import { api } from 'src/api/client';
import { createAuthGuard } from 'src/router/guard';
import { useSessionStore } from 'stores/session-store';

export default defineBoot(({ app, router, store }) => {
  const session = useSessionStore(store);

  api.onUnauthorized(() => {
    session.clear();
    const current = router.currentRoute.value;
    if (!current.meta.public) {
      void router.push({ name: 'sign-in', query: { redirect: current.fullPath } });
    }
  });

  router.beforeEach(createAuthGuard(store));

  app.config.globalProperties.$api = api;
});

declare module 'vue' {
  interface ComponentCustomProperties {
    $api: typeof api;
  }
}

export { api };
