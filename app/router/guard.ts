// The navigation guard: loads the session once, sends anonymous users to sign-in (and back after),
// and users without the screen's role to the "not allowed" page.
import type { Pinia } from 'pinia';
import type { NavigationGuardWithThis, RouteLocationNormalized, RouteLocationRaw } from 'vue-router';
import type { Role } from 'shared/roles';
import { useSessionStore } from 'stores/session-store';

declare module 'vue-router' {
  interface RouteMeta {
    /** Only these roles may open the screen (absent: every signed-in user). */
    roles?: readonly Role[];
    /** Open without signing in. */
    public?: true;
  }
}

/** The roles a route needs: every matched record's `meta.roles` must admit the user. */
export function rolesAllow(route: Pick<RouteLocationNormalized, 'matched'>, role: Role): boolean {
  return route.matched.every((record) => !record.meta.roles || record.meta.roles.includes(role));
}

/** Where a redirect back to `to` may safely go: only paths inside the app. */
export function safeRedirect(value: unknown): string | null {
  return typeof value === 'string' && value.startsWith('/') && !value.startsWith('//') ? value : null;
}

export function createAuthGuard(pinia: Pinia): NavigationGuardWithThis<undefined> {
  return async (to): Promise<true | RouteLocationRaw> => {
    const session = useSessionStore(pinia);
    try {
      await session.ensureLoaded();
    } catch {
      // Server unreachable: treat as signed out; the sign-in page says what is wrong when used.
    }

    if (to.meta.public) {
      if (to.name === 'sign-in' && session.user) {
        return safeRedirect(to.query.redirect) ?? { name: 'overview' };
      }
      return true;
    }
    if (!session.user) {
      return to.fullPath === '/'
        ? { name: 'sign-in' }
        : { name: 'sign-in', query: { redirect: to.fullPath } };
    }
    if (!rolesAllow(to, session.user.role)) {
      return { name: 'not-allowed', query: { from: to.fullPath } };
    }
    return true;
  };
}
