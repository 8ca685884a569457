/**
 * Every API route is declared once, as data: method, path, who may call it, and the zod schemas of
 * its params, query and body. `mountRoutes` turns the declarations into Express handlers that check
 * sign-in and role, validate input, and answer JSON; the same declarations feed the OpenAPI
 * document, so the published interface cannot drift from what the server enforces.
 */
import type { NextFunction, Request, Response, Router } from 'express';
import { z } from 'zod';
import type { SessionUser } from '../shared/auth.js';
import type { Role } from '../shared/roles.js';
import { AppError, badRequest, forbidden, notSignedIn } from './errors.js';
import { Tenant } from './tenant.js';

/** `public`: anyone; `signed-in`: any role; or the roles allowed. */
export type Access = 'public' | 'signed-in' | readonly Role[];

export interface RouteContext<Params, Query, Body> {
  req: Request;
  res: Response;
  params: Params;
  query: Query;
  body: Body;
  /** Present on every route whose access is not public. */
  user: SessionUser;
  tenant: Tenant;
}

export interface RouteSpec<P extends z.ZodType = z.ZodType, Q extends z.ZodType = z.ZodType, B extends z.ZodType = z.ZodType> {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  /** Express path under /api, e.g. `/sites/:id`. */
  path: string;
  summary: string;
  tag: string;
  access: Access;
  params?: P;
  query?: Q;
  body?: B;
  /** Schema of the JSON answer, for the OpenAPI document. */
  response?: z.ZodType;
  /** Status of a successful answer (200 by default; 204 sends no body). */
  status?: number;
  /** For answers that are not JSON (files): the content type, for the OpenAPI document. */
  produces?: string;
  handler(context: RouteContext<z.infer<P>, z.infer<Q>, z.infer<B>>): Promise<unknown>;
}

/** Keeps the schema types of one declaration together (TypeScript infers P, Q, B from it). */
export function route<P extends z.ZodType = z.ZodUnknown, Q extends z.ZodType = z.ZodUnknown, B extends z.ZodType = z.ZodUnknown>(
  spec: RouteSpec<P, Q, B>,
): RouteSpec {
  return spec as unknown as RouteSpec;
}

export const registeredRoutes: RouteSpec[] = [];

function issuesToError(part: string, error: z.ZodError): AppError {
  const details = error.issues.map((issue) => ({
    field: issue.path.length > 0 ? issue.path.join('.') : part,
    message: issue.message,
  }));
  const first = details[0];
  return badRequest(first ? `${first.field}: ${first.message}` : `${part} is invalid`, details);
}

function parsePart<T extends z.ZodType | undefined>(schema: T, value: unknown, part: string) {
  if (!schema) return value;
  const result = schema.safeParse(value ?? {});
  if (!result.success) throw issuesToError(part, result.error);
  return result.data;
}

export function checkAccess(access: Access, user: SessionUser | undefined): void {
  if (access === 'public') return;
  if (!user) throw notSignedIn();
  if (access !== 'signed-in' && !access.includes(user.role)) throw forbidden();
}

export function mountRoutes(router: Router, specs: RouteSpec[]): void {
  for (const spec of specs) {
    registeredRoutes.push(spec);
    router[spec.method](spec.path, async (req: Request, res: Response, next: NextFunction) => {
      try {
        const user = req.user as SessionUser | undefined;
        checkAccess(spec.access, user);
        const context = {
          req,
          res,
          params: parsePart(spec.params, req.params, 'params'),
          query: parsePart(spec.query, req.query, 'query'),
          body: parsePart(spec.body, req.body, 'body'),
          user: user as SessionUser,
          tenant: user ? new Tenant(user) : (undefined as unknown as Tenant),
        };
        const result = await spec.handler(context);
        if (res.headersSent) return;
        // A handler may set another status itself (e.g. 503 from the health check).
        const status = res.statusCode !== 200 ? res.statusCode : (spec.status ?? 200);
        if (status === 204 || result === undefined) res.status(status === 200 ? 204 : status).end();
        else res.status(status).json(result);
      } catch (error) {
        next(error);
      }
    });
  }
}
