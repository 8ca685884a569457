// Who is signed in, with which role and organisation, and the CSRF token of the session.
import { defineStore } from 'pinia';
import { computed, ref } from 'vue';
import type { SessionUser } from 'shared/auth';
import { EDITORS, OUTBOX_READERS, type Role } from 'shared/roles';
import { authApi, type AcceptInvitationInput, type ChangePasswordInput, type LoginInput, type MeResponse } from 'src/api/auth';
import { api, ApiError } from 'src/api/client';

export const useSessionStore = defineStore('session', () => {
  const user = ref<SessionUser | null>(null);
  const csrfToken = ref<string | null>(null);
  /** True once `/api/auth/me` has answered (signed in or not). */
  const loaded = ref(false);
  let loading: Promise<void> | null = null;

  const signedIn = computed(() => user.value !== null);
  const canEdit = computed(() => hasRole(...EDITORS));
  const canReadOutbox = computed(() => hasRole(...OUTBOX_READERS));

  function hasRole(...roles: readonly Role[]): boolean {
    return user.value !== null && roles.includes(user.value.role);
  }

  function setSession(session: MeResponse): void {
    user.value = session.user;
    csrfToken.value = session.csrfToken;
    api.setCsrfToken(session.csrfToken);
    loaded.value = true;
  }

  /** Forget the user locally (after sign-out or when the server says the session is gone). */
  function clear(): void {
    user.value = null;
    csrfToken.value = null;
    api.setCsrfToken(null);
  }

  /** Ask the server who is signed in; a 401 means nobody. */
  async function loadMe(): Promise<void> {
    try {
      setSession(await authApi.me());
    } catch (error) {
      if (!(error instanceof ApiError && error.status === 401)) throw error;
      clear();
    } finally {
      loaded.value = true;
    }
  }

  /** Load the session once per page load; later calls share the first request. */
  function ensureLoaded(): Promise<void> {
    if (loaded.value) return Promise.resolve();
    loading ??= loadMe().finally(() => {
      loading = null;
    });
    return loading;
  }

  async function login(input: LoginInput): Promise<SessionUser> {
    const session = await authApi.login(input);
    setSession(session);
    return session.user;
  }

  async function logout(): Promise<void> {
    try {
      await authApi.logout();
    } finally {
      clear();
    }
  }

  /** Sign out in every browser: the server ends all of the user's sessions. */
  async function logoutEverywhere(): Promise<void> {
    try {
      await authApi.logoutEverywhere();
    } finally {
      clear();
    }
  }

  async function acceptInvitation(input: AcceptInvitationInput): Promise<SessionUser> {
    const session = await authApi.acceptInvitation(input);
    setSession(session);
    return session.user;
  }

  function changePassword(input: ChangePasswordInput): Promise<void> {
    return authApi.changePassword(input);
  }

  return {
    user,
    csrfToken,
    loaded,
    signedIn,
    canEdit,
    canReadOutbox,
    hasRole,
    setSession,
    clear,
    loadMe,
    ensureLoaded,
    login,
    logout,
    logoutEverywhere,
    acceptInvitation,
    changePassword,
  };
});
