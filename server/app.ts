/**
 * The Express application: security headers, sessions in PostgreSQL, passport, CSRF, the API
 * routes, the OpenAPI document, the built client, and the one error handler.
 */
import compression from 'compression';
import { randomBytes } from 'node:crypto';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import connectPgSimple from 'connect-pg-simple';
import express, { type NextFunction, type Request, type Response } from 'express';
import { rateLimit } from 'express-rate-limit';
import session from 'express-session';
import helmet from 'helmet';
import passport from 'passport';
import pg from 'pg';
import { authRoutes } from './auth/routes.js';
import { caseRoutes } from './cases/routes.js';
import { loadSessionUser } from './auth/session-user.js';
import { healthRoutes } from './health/routes.js';
import { intakeRoutes } from './intake/routes.js';
import { projectRoot, type Config } from './lib/config.js';
import { verifyCsrf } from './lib/csrf.js';
import { CONNECT_TIMEOUT_MS, isDatabaseUnavailable } from './lib/database.js';
import { AppError, tooManyAttempts } from './lib/errors.js';
import { logger } from './lib/logger.js';
import type { Mailer } from './lib/mail.js';
import { buildOpenApiDocument } from './lib/openapi.js';
import { mountRoutes, type RouteSpec } from './lib/routing.js';
import { motorRoutes } from './motors/routes.js';
import { outboxRoutes } from './outbox/routes.js';
import { overviewRoutes } from './overview/routes.js';
import type { SessionUser } from './shared/auth.js';
import { siteRoutes } from './sites/routes.js';
import { designRoutes } from './designs/routes.js';
import { screeningRoutes } from './screening/routes.js';
import { retrofitRoutes } from './retrofits/routes.js';
import { settingsRoutes } from './settings/routes.js';
import { studyRoutes } from './studies/routes.js';
import { userRoutes } from './users/routes.js';

export interface AppOptions {
  config: Config;
  databaseUrl: string;
  mailer: Mailer;
  /** Sign-in attempts allowed per client address in 15 minutes. */
  signInAttemptsPerWindow?: number;
}

const SESSION_HOURS = 12;
/** At most one expiry update of a session row per this interval [ms] (see ThrottledPgStore). */
const TOUCH_EVERY_MS = 60_000;
const packageVersion = (JSON.parse(readFileSync(join(projectRoot, 'package.json'), 'utf8')) as { version: string }).version;

export function allRoutes(mailer: Mailer, publicUrl: string): RouteSpec[] {
  return [...healthRoutes, ...authRoutes, ...overviewRoutes, ...siteRoutes, ...userRoutes(mailer, publicUrl), ...outboxRoutes, ...motorRoutes, ...intakeRoutes, ...studyRoutes, ...screeningRoutes, ...designRoutes, ...settingsRoutes, ...retrofitRoutes(mailer, publicUrl), ...caseRoutes(mailer, publicUrl)];
}

export function createApp(options: AppOptions) {
  const { config } = options;
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', config.trustProxy);

  // Text answers (the client's scripts and styles, JSON) go out compressed, as every browser accepts.
  // Not the sign-in answers: they carry the CSRF token, which a compressed reply could leak (BREACH).
  app.use(compression({ filter: (req, res) => !req.path.startsWith('/api/auth/') && compression.filter(req, res) }));
  // A fresh nonce per response lets the charting library add its own <style> elements (it takes
  // the nonce from the page) while every other inline style stays forbidden.
  app.use((_req, res, next) => {
    res.locals.cspNonce = randomBytes(16).toString('base64');
    next();
  });
  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          styleSrc: ["'self'", (_req, res) => `'nonce-${(res as Response).locals.cspNonce as string}'`],
          fontSrc: ["'self'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          connectSrc: ["'self'"],
          workerSrc: ["'self'", 'blob:'],
          frameSrc: ["'self'"],
          objectSrc: ["'none'"],
          baseUri: ["'self'"],
          formAction: ["'self'"],
          frameAncestors: ["'none'"],
        },
      },
      crossOriginEmbedderPolicy: false,
    }),
  );

  const PgStore = connectPgSimple(session);
  /**
   * With `rolling`, express-session touches the store on every request: an UPDATE of the session
   * row per API call. The expiry only needs to follow activity to the minute (sessions last
   * SESSION_HOURS), so each session is written at most once a minute per process; under load this
   * removes one of the ~6 queries of a typical request.
   */
  class ThrottledPgStore extends PgStore {
    private readonly lastTouch = new Map<string, number>();
    override touch(sid: string, sess: session.SessionData, callback?: () => void): void {
      const now = Date.now();
      const last = this.lastTouch.get(sid);
      if (last !== undefined && now - last < TOUCH_EVERY_MS) {
        callback?.();
        return;
      }
      if (this.lastTouch.size >= 50_000) this.lastTouch.clear();
      this.lastTouch.set(sid, now);
      super.touch(sid, sess, callback);
    }
  }
  const sessionPool = new pg.Pool({ connectionString: options.databaseUrl, max: 4, connectionTimeoutMillis: CONNECT_TIMEOUT_MS });
  sessionPool.on('error', (error) => logger.warn('session pool error', { error: error.message }));
  app.use(
    session({
      name: 'statorline.sid',
      store: new ThrottledPgStore({ pool: sessionPool, tableName: 'session', createTableIfMissing: false, pruneSessionInterval: 15 * 60 }),
      secret: config.sessionSecret,
      resave: false,
      saveUninitialized: false,
      rolling: true,
      cookie: { httpOnly: true, sameSite: 'lax', secure: config.cookieSecure, maxAge: SESSION_HOURS * 3600_000 },
    }),
  );

  passport.serializeUser((user, done) => done(null, (user as SessionUser).id));
  passport.deserializeUser((id: number, done) => {
    loadSessionUser(id)
      .then((user) => done(null, user ?? false))
      .catch((error: Error) => done(error));
  });
  app.use(passport.initialize());
  app.use(passport.session());

  app.use('/api', express.json({ limit: '2mb' }));
  app.use(
    '/api/auth/login',
    rateLimit({
      windowMs: 15 * 60_000,
      limit: options.signInAttemptsPerWindow ?? 30,
      standardHeaders: 'draft-7',
      legacyHeaders: false,
      handler: (_req, _res, next, limitOptions) =>
        next(
          tooManyAttempts(
            `Too many sign-in attempts from this address. Wait ${Math.ceil(limitOptions.windowMs / 60_000)} minutes and try again.`,
            Math.ceil(limitOptions.windowMs / 1000),
          ),
        ),
    }),
  );
  app.use('/api', verifyCsrf);

  const routes = allRoutes(options.mailer, config.publicUrl);
  const api = express.Router();
  mountRoutes(api, routes);
  api.get('/openapi.json', (_req, res) => {
    res.json(buildOpenApiDocument(routes, packageVersion));
  });
  api.use((req, _res, next) => next(new AppError('not-found', `No API route ${req.method} ${req.path}.`, 404)));
  app.use('/api', api);

  if (existsSync(join(config.clientDir, 'index.html'))) {
    app.use(express.static(config.clientDir, { index: false, maxAge: '1h' }));
    const indexHtml = readFileSync(join(config.clientDir, 'index.html'), 'utf8');
    // Client-side routes (history mode): any other GET gets the app's page, with this response's nonce.
    app.get('/{*splat}', (_req, res) => {
      res.type('html').setHeader('Cache-Control', 'no-store');
      res.send(indexHtml.replace('<head>', `<head><meta name="csp-nonce" content="${res.locals.cspNonce as string}">`));
    });
  }

  app.use((error: unknown, req: Request, res: Response, _next: NextFunction) => {
    let appError: AppError;
    if (error instanceof AppError) appError = error;
    else if (error instanceof SyntaxError && 'body' in error) appError = new AppError('invalid-json', 'The request body is not valid JSON.', 400);
    else if (isDatabaseUnavailable(error)) {
      logger.warn('database unavailable', { path: req.path, error: error instanceof Error ? error.message : String(error) });
      appError = new AppError('unavailable', 'The database is not answering; try again in a moment.', 503);
    } else if ((error as { type?: string }).type === 'entity.too.large') appError = new AppError('too-large', 'The request body is too large.', 413);
    else {
      logger.error('unexpected error', { path: req.path, error: error instanceof Error ? (error.stack ?? error.message) : String(error) });
      appError = new AppError('internal', 'Something went wrong on the server; it has been logged.', 500);
    }
    res.status(appError.status).json({ error: { code: appError.code, message: appError.message, details: appError.details } });
  });

  return { app, close: () => sessionPool.end() };
}
