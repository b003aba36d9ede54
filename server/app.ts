import express, { type Express } from 'express';
import helmet from 'helmet';
import session from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import passport from 'passport';
import pg from 'pg';
import path from 'node:path';
import { existsSync } from 'node:fs';
import { csrfSync } from 'csrf-sync';
import type { AppDeps } from './deps';
import { initModels } from './models';
import { pgClientTimeouts } from './db';
import { configurePassport } from './auth/passport';
import { CachedSessionStore } from './auth/session-store';
import { sessionLifetime } from './auth/session-lifetime';
import { requestId } from './middleware/request-id';
import { errorHandler, apiNotFound } from './middleware/error-handler';
import { storableText } from './middleware/storable-text';
import { apiRouter } from './routes';
import { IMPORT_BODY_LIMIT } from './services/procedure-transfer.service';

export const CSRF_HEADER = 'x-csrf-token';

/** Strict CSP: nothing inline, nothing from another origin. */
const contentSecurityPolicy = {
  useDefaults: false,
  directives: {
    defaultSrc: ["'self'"],
    scriptSrc: ["'self'"],
    styleSrc: ["'self'"],
    imgSrc: ["'self'", 'data:', 'blob:'],
    fontSrc: ["'self'"],
    connectSrc: ["'self'"],
    workerSrc: ["'self'"],
    manifestSrc: ["'self'"],
    objectSrc: ["'none'"],
    baseUri: ["'self'"],
    formAction: ["'self'"],
    frameAncestors: ["'none'"],
  },
};

/**
 * The Express app without listen(), so that tests drive it with supertest. `first` adds routes
 * ahead of every middleware (the step benchmark's bare endpoint, on the same app and server).
 */
export function createApp(deps: AppDeps, first?: (app: Express) => void): Express {
  initModels(deps.sequelize);
  configurePassport();
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  first?.(app);
  app.use(requestId);
  app.use(helmet({ contentSecurityPolicy, crossOriginEmbedderPolicy: false }));

  // Static files come before the session: they need none, and a session cookie refreshed on an
  // asset response that raced a sign-in would put the old session back in the browser.
  const dist = path.resolve('dist');
  const hasClient = deps.config.SERVE_CLIENT && existsSync(path.join(dist, 'index.html'));
  if (hasClient) app.use(express.static(dist, { index: false, maxAge: '1h', setHeaders: noCacheForShell }));

  const PgStore = connectPgSimple(session);
  const pool = new pg.Pool({ connectionString: deps.config.DATABASE_URL, max: 10, ...pgClientTimeouts });
  // An idle connection dropped by the database (a restart, a failover) is an event, not a crash:
  // the pool discards it and the next request opens a new one.
  pool.on('error', (err) => deps.log('a session store connection was lost; it will reconnect on the next request', err));
  app.locals.sessionPool = pool;
  app.use(
    session({
      name: 'sw.sid',
      // No touch on every request: each request costs one session read (from a short
      // per-process cache in front of PostgreSQL: see auth/session-store.ts) and no write.
      // sessionLifetime below ends a session idle for SESSION_IDLE_MINUTES or older than
      // SESSION_MAX_HOURS; the cookie and the row last as long as the longest of them.
      store: new CachedSessionStore(new PgStore({ pool, tableName: 'session', createTableIfMissing: false, pruneSessionInterval: 60 * 15, disableTouch: true })),
      secret: deps.config.SESSION_SECRET,
      resave: false,
      saveUninitialized: false,
      rolling: false,
      cookie: {
        httpOnly: true,
        sameSite: 'lax',
        secure: deps.config.appUrl.startsWith('https://'),
        maxAge: deps.config.SESSION_MAX_HOURS * 3_600_000,
      },
    }),
  );
  app.use(passport.initialize());
  app.use(passport.session());
  app.use(sessionLifetime({ idleMs: deps.config.SESSION_IDLE_MINUTES * 60_000, maxMs: deps.config.SESSION_MAX_HOURS * 3_600_000 }));

  const csrf = csrfSync({ size: 32, getTokenFromRequest: (req) => req.headers[CSRF_HEADER] as string | undefined });
  if (deps.reads) app.use('/api', deps.reads.markWrites);
  // A procedure file carries its pictures (base64), so import alone reads a larger body.
  app.use('/api/procedures/import', express.json({ limit: IMPORT_BODY_LIMIT }));
  app.use('/api', express.json({ limit: '5mb' }), storableText);
  app.use('/api', csrf.csrfSynchronisedProtection);
  app.use('/api', apiRouter(deps, csrf.generateToken));
  app.use('/api', apiNotFound);

  if (hasClient) serveClientRoutes(app, dist);
  app.use(errorHandler(deps.log));
  return app;
}

function serveClientRoutes(app: Express, dist: string): void {
  // every non-API path is a client route
  app.get('/{*splat}', (_req, res) => {
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(path.join(dist, 'index.html'));
  });
}

function noCacheForShell(res: express.Response, file: string): void {
  if (file.endsWith('index.html') || file.endsWith('sw.js') || file.endsWith('manifest.webmanifest')) {
    res.setHeader('Cache-Control', 'no-cache');
  }
}
