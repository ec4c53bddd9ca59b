import express, { type Express } from 'express';
import helmet from 'helmet';
import cors from 'cors';
import fs from 'node:fs';
import path from 'node:path';
import type { Config } from './config';
import type { Db } from './db/knex';
import type { AppContext } from './context';
import { OpenApiRegistry } from './openapi';
import { createCsrf, createPassport, createSessionMiddleware } from './auth/session';
import { errorHandler, notFoundApi } from './http/errors';
import { serverTiming } from './http/timing';
import { apiSecurityHeaders } from './http/security-headers';
import { authRoutes } from './routes/auth';
import { memberRoutes } from './routes/members';
import { apiRoutes } from './routes';

export const API_VERSION = '1.0.0';

export interface CreateAppOptions {
  db: Db;
  config: Config;
  /** secret for session cookies */
  sessionSecret: string;
  /** absolute folder of the exported web build; omitted: API only */
  webDir?: string;
  log?: (msg: string, err?: unknown) => void;
  /** sweep of expired sessions, ms (0: none) */
  sessionCleanupMs?: number;
}

/** The Express app: API under /api/v1 and the exported web build. Never listens. */
export function createApp(opts: CreateAppOptions): { app: Express; close: () => void } {
  const log = opts.log ?? ((m: string, e?: unknown) => console.error(m, e ?? ''));
  const { db, config } = opts;
  const app = express();
  app.disable('x-powered-by');
  // API answers are never cached (Cache-Control: no-store), so hashing every body for an
  // ETag is wasted work; static files get their own ETags from express.static
  app.set('etag', false);
  if (config.TRUST_PROXY) app.set('trust proxy', config.TRUST_PROXY);
  app.use(serverTiming);

  app.use('/api', apiSecurityHeaders(config.HTTPS));

  const { middleware: sessionMw, store } = createSessionMiddleware({
    db, secret: opts.sessionSecret, secureCookies: config.HTTPS, cleanupIntervalMs: opts.sessionCleanupMs ?? 0,
    cacheMs: config.SESSION_CACHE_MS,
  });
  const passport = createPassport(db);
  const csrf = createCsrf();
  const registry = new OpenApiRegistry();
  const ctx: AppContext = { db, config, registry, passport, csrf, log, sessions: store };

  const api = express.Router();
  if (config.DEV_WEB_ORIGIN && config.NODE_ENV === 'development') {
    // `npm run dev`: the Metro dev server on its own port calls this API with the cookie
    api.use(cors({ origin: config.DEV_WEB_ORIGIN, credentials: true, allowedHeaders: ['Content-Type', 'X-CSRF-Token'] }));
  }
  api.use(express.json({ limit: `${config.BODY_LIMIT_KB}kb`, strict: true, type: ['application/json', 'application/*+json'] }));
  api.use(sessionMw, passport.session());
  api.use('/auth', authRoutes(ctx));
  // every other state-changing request made with the cookie must carry the CSRF token
  api.use(csrf.csrfSynchronisedProtection);
  api.use('/workspaces/:workspaceId/members', memberRoutes(ctx));
  api.use(apiRoutes(ctx));

  registry.add({ method: 'get', path: '/api/v1/openapi.json', tag: 'meta', auth: 'none',
    summary: 'This document: every route of the API with its request and answer schemas' });
  const openapi = JSON.stringify(registry.document(API_VERSION));
  api.get('/openapi.json', (_req, res) => {
    res.type('application/json').send(openapi);
  });
  registry.add({ method: 'get', path: '/api/v1/health', tag: 'meta', auth: 'none', summary: 'Liveness and database check' });
  api.get('/health', async (_req, res) => {
    await db.raw('SELECT 1');
    res.json({ ok: true });
  });
  api.use(notFoundApi);
  api.use(errorHandler(log));
  app.use('/api/v1', api);
  app.use('/api', notFoundApi, errorHandler(log));

  // the web app's pages and files
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          // react-native-web writes inline styles; fonts and images come from our origin
          'style-src': ["'self'", "'unsafe-inline'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          'font-src': ["'self'", 'data:'],
          'upgrade-insecure-requests': config.HTTPS ? [] : null,
        },
      },
      strictTransportSecurity: config.HTTPS,
    }),
  );

  if (opts.webDir && fs.existsSync(path.join(opts.webDir, 'index.html'))) {
    const webDir = opts.webDir;
    app.use(express.static(webDir, { index: false, maxAge: '1h' }));
    // single-page fallback: every non-API path gets index.html (deep links, reloads)
    app.get('/{*splat}', (_req, res) => {
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(path.join(webDir, 'index.html'));
    });
  } else {
    app.get('/', (_req, res) => {
      res.type('text/plain').send('Samplewright API is running; the web build is missing (run `npm run build:web`).');
    });
  }
  app.use(errorHandler(log));

  return {
    app,
    close: () => {
      if (store.nextDbCleanup) clearTimeout(store.nextDbCleanup);
    },
  };
}
