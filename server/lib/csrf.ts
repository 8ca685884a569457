/**
 * CSRF protection by a synchronizer token: a random token kept in the session, read by the client
 * from GET /api/auth/csrf and sent back in the x-csrf-token header of every state-changing request.
 * A cross-site form or script cannot read the token, so its requests are refused.
 */
import { randomBytes, timingSafeEqual } from 'node:crypto';
import type { NextFunction, Request, Response } from 'express';
import { AppError } from './errors.js';

declare module 'express-session' {
  interface SessionData {
    csrfToken?: string;
  }
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

export function csrfToken(req: Request): string {
  req.session.csrfToken ??= randomBytes(32).toString('base64url');
  return req.session.csrfToken;
}

export function verifyCsrf(req: Request, _res: Response, next: NextFunction): void {
  if (SAFE_METHODS.has(req.method)) return next();
  const expected = req.session?.csrfToken;
  const sent = req.get('x-csrf-token');
  if (expected && sent && sent.length === expected.length && timingSafeEqual(Buffer.from(sent), Buffer.from(expected))) {
    return next();
  }
  next(new AppError('csrf', 'The request has no valid CSRF token: reload the page (GET /api/auth/csrf) and try again.', 403));
}
