import type { Request } from 'express';
import { route, type RouteSpec } from '../lib/routing.js';
import { csrfToken } from '../lib/csrf.js';
import { acceptInvitationBody, changePasswordBody, csrfResponse, loginBody, meResponse } from '../shared/auth.js';
import type { SessionUser } from '../shared/auth.js';
import { acceptInvitation, authenticate, changePassword, endSessions } from './service.js';

/** Ends the request's session: passport's logout, then the row in the session store. */
function endThisSession(req: Request): Promise<void> {
  return new Promise<void>((resolve, reject) => {
    req.logout((logoutError) => {
      if (logoutError) return reject(logoutError as Error);
      req.session.destroy((destroyError) => (destroyError ? reject(destroyError as Error) : resolve()));
    });
  });
}

/** Signs the user in on a fresh session id (passport 0.7 regenerates it) and issues a new CSRF token. */
function signIn(req: Request, user: SessionUser): Promise<{ user: SessionUser; csrfToken: string }> {
  return new Promise((resolve, reject) => {
    req.login(user, (error) => {
      if (error) return reject(error as Error);
      resolve({ user, csrfToken: csrfToken(req) });
    });
  });
}

export const authRoutes: RouteSpec[] = [
  route({
    method: 'get',
    path: '/auth/csrf',
    summary: 'CSRF token for the x-csrf-token header of state-changing requests',
    tag: 'auth',
    access: 'public',
    response: csrfResponse,
    handler: async ({ req }) => ({ token: csrfToken(req) }),
  }),
  route({
    method: 'post',
    path: '/auth/login',
    summary: 'Sign in with e-mail and password (sets the session cookie)',
    tag: 'auth',
    access: 'public',
    body: loginBody,
    response: meResponse,
    handler: async ({ req, body }) => signIn(req, await authenticate(body.email, body.password)),
  }),
  route({
    method: 'get',
    path: '/auth/me',
    summary: 'The signed-in user and a CSRF token',
    tag: 'auth',
    access: 'signed-in',
    response: meResponse,
    handler: async ({ req, user }) => ({ user, csrfToken: csrfToken(req) }),
  }),
  route({
    method: 'post',
    path: '/auth/logout',
    summary: 'Sign out (ends the session)',
    tag: 'auth',
    access: 'public',
    status: 204,
    handler: ({ req }) => endThisSession(req),
  }),
  route({
    method: 'post',
    path: '/auth/logout-everywhere',
    summary: 'Sign out everywhere: ends every session of the signed-in user, in every browser, this one included',
    tag: 'auth',
    access: 'signed-in',
    status: 204,
    handler: async ({ req, user }) => {
      await endSessions(user.id);
      await endThisSession(req);
    },
  }),
  route({
    method: 'post',
    path: '/auth/password',
    summary: 'Change the signed-in user’s password (ends the user’s sessions in other browsers)',
    tag: 'auth',
    access: 'signed-in',
    body: changePasswordBody,
    status: 204,
    handler: async ({ req, user, body }) => changePassword(user.id, body.currentPassword, body.newPassword, req.sessionID),
  }),
  route({
    method: 'post',
    path: '/auth/invitations/accept',
    summary: 'Accept an invitation: set name and password, then signed in',
    tag: 'auth',
    access: 'public',
    body: acceptInvitationBody,
    response: meResponse,
    handler: async ({ req, body }) => signIn(req, await acceptInvitation(body.token, body.name, body.password)),
  }),
];

