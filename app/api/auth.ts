// Sign-in, session and account calls (`/api/auth/...`).
import type { z } from 'zod';
import type { acceptInvitationBody, changePasswordBody, loginBody, meResponse } from 'shared/auth';
import { api } from './client';

export type LoginInput = z.input<typeof loginBody>;
export type MeResponse = z.infer<typeof meResponse>;
export type ChangePasswordInput = z.input<typeof changePasswordBody>;
export type AcceptInvitationInput = z.input<typeof acceptInvitationBody>;

// A 401 from these calls is an answer ("wrong password", "not signed in"), not a lost session.
const noAuthHook = { auth: false } as const;

export const authApi = {
  me: () => api.request<MeResponse>('GET', '/api/auth/me', noAuthHook),
  login: (input: LoginInput) => api.post<MeResponse>('/api/auth/login', input, noAuthHook),
  logout: () => api.post<void>('/api/auth/logout', undefined, noAuthHook),
  /** Ends every session of the user, in every browser (this one too). */
  logoutEverywhere: () => api.post<void>('/api/auth/logout-everywhere', undefined, noAuthHook),
  changePassword: (input: ChangePasswordInput) => api.post<void>('/api/auth/password', input),
  acceptInvitation: (input: AcceptInvitationInput) =>
    api.post<MeResponse>('/api/auth/invitations/accept', input, noAuthHook),
};
