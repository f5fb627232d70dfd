/**
 * Builds the Express app from a context, without listening (tests drive it with supertest).
 */
import express, { type Express } from 'express';
import session from 'express-session';
import helmet from 'helmet';
import { adminRouter } from './admin/router.js';
import { authRouter, SESSION_COOKIE } from './auth/router.js';
import { briefsRouter } from './briefs/router.js';
import { critiqueRouter } from './critique/router.js';
import { createPassport } from './auth/passport.js';
import { authService } from './auth/service.js';
import { createSessionStore } from './auth/session-store.js';
import type { AppContext } from './context.js';
import { apiNotFound, errorMiddleware } from './http/error-middleware.js';
import { jsonOrMultipart, sameOrigin } from './http/guards.js';
import { RouteRegistry, defineRoutes, type RouteEntry } from './http/routes.js';
import { invitationsRouter } from './invitations/router.js';
import { materialsRouter } from './materials/router.js';
import { notificationsRouter } from './notifications/router.js';
import { revisionsRouter } from './revisions/router.js';
import { clientRouter } from './static.js';
import { studiosRouter } from './studios/router.js';
import { thumbnailsRouter } from './thumbnails/router.js';

const SESSION_MAX_AGE_MS = 14 * 24 * 60 * 60 * 1000;
const ROUTES = Symbol('planewright.routes');

export function createApp(ctx: AppContext): Express {
  const app = express();
  const logError = ctx.logError ?? ((e: unknown) => console.error(e));
  const registry = new RouteRegistry();
  (app as unknown as Record<symbol, RouteRegistry>)[ROUTES] = registry;
  app.disable('x-powered-by');
  if (ctx.config.trustProxy !== undefined) {
    const t = ctx.config.trustProxy;
    app.set('trust proxy', /^\d+$/.test(t) ? Number(t) : t === 'true' ? true : t);
  }

  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: true,
        directives: {
          'default-src': ["'self'"],
          'script-src': ["'self'"],
          'style-src': ["'self'", "'unsafe-inline'"],
          'font-src': ["'self'", 'data:'],
          'img-src': ["'self'", 'data:', 'blob:'],
          'connect-src': ["'self'"],
          'worker-src': ["'self'", 'blob:'],
          'object-src': ["'none'"],
          'frame-ancestors': ["'none'"],
          'base-uri': ["'self'"],
          'form-action': ["'self'"],
          // Served over plain HTTP on a LAN too; the browser must not force https.
          'upgrade-insecure-requests': null,
        },
      },
      strictTransportSecurity: false,
    }),
  );

  const publicOrigin = new URL(ctx.config.publicUrl).origin;
  app.use('/api', sameOrigin([publicOrigin]), jsonOrMultipart(), express.json({ limit: '1mb' }));

  const auth = authService(ctx);
  const passport = createPassport(auth);
  app.use(
    '/api',
    session({
      name: SESSION_COOKIE,
      secret: ctx.config.sessionSecret,
      store: createSessionStore(ctx.dataSource, logError),
      resave: false,
      saveUninitialized: false,
      rolling: true,
      cookie: { httpOnly: true, sameSite: 'lax', secure: 'auto', maxAge: SESSION_MAX_AGE_MS, path: '/' },
    }),
    passport.initialize(),
    passport.session(),
  );

  const health = express.Router();
  defineRoutes(health, registry, '/api').get('/health', { action: 'health.read' }, ({ res }) => {
    res.json({ status: 'ok' });
  });
  app.use('/api', health);
  app.use('/api/auth', authRouter(ctx, auth, passport, registry));
  app.use('/api/studios', studiosRouter(ctx, registry));
  app.use('/api', invitationsRouter(ctx, registry));
  app.use('/api/admin', adminRouter(ctx, registry));
  app.use('/api/materials', materialsRouter(ctx, registry));
  app.use('/api', briefsRouter(ctx, registry));
  app.use('/api', revisionsRouter(ctx, registry));
  app.use('/api', thumbnailsRouter(ctx, registry));
  app.use('/api', critiqueRouter(ctx, registry));
  app.use('/api/me', notificationsRouter(ctx, registry));
  app.use('/api', apiNotFound());

  app.use(clientRouter(ctx.clientDir));
  app.use(errorMiddleware(logError));
  return app;
}

/** Every API route the app declares (method, full path, policy action). */
export function listRoutes(app: Express): readonly RouteEntry[] {
  const registry = (app as unknown as Record<symbol, RouteRegistry | undefined>)[ROUTES];
  if (!registry) throw new Error('Not an app built by createApp');
  return registry.entries;
}
