import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { Router, type Request, type RequestHandler } from 'express';
import type { createPassport } from './passport.js';
import { loginBodySchema, resetConfirmBodySchema, resetRequestBodySchema } from '../../shared/api/auth.js';
import type { AppContext } from '../context.js';
import { HttpError, UnauthenticatedError } from '../http/errors.js';
import { defineRoutes, type RouteRegistry } from '../http/routes.js';
import type { AuthService } from './service.js';

export const SESSION_COOKIE = 'planewright.sid';
const WINDOW_MS = 15 * 60 * 1000;

function limiter(limit: number, key: (req: Request) => string, message: string, skipSuccessfulRequests: boolean): RequestHandler {
  return rateLimit({
    windowMs: WINDOW_MS,
    limit,
    keyGenerator: key,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    skipSuccessfulRequests,
    handler: (_req, _res, next) => next(new HttpError(429, 'too_many_attempts', message)),
  });
}

const ip = (req: Request) => ipKeyGenerator(req.ip ?? 'unknown');
const emailOf = (req: Request) => String((req.body as { email?: unknown } | undefined)?.email ?? '').trim().toLowerCase();

export function authRouter(ctx: AppContext, service: AuthService, passport: ReturnType<typeof createPassport>, registry: RouteRegistry): Router {
  const router = Router();
  const r = defineRoutes(router, registry, '/api/auth');
  const perAccount = ctx.config.loginRateLimit;
  const accountLimit = limiter(perAccount, (req) => `${ip(req)}|${emailOf(req)}`, 'Too many sign-in attempts for this account. Wait 15 minutes and try again.', true);
  const addressLimit = limiter(perAccount * 5, ip, 'Too many sign-in attempts from this address. Wait 15 minutes and try again.', false);
  const resetLimit = limiter(perAccount, ip, 'Too many password-reset requests from this address. Wait 15 minutes and try again.', false);

  r.post('/login', { action: 'auth.login', schemas: { body: loginBodySchema }, before: [addressLimit, accountLimit] }, async ({ req, res, input }) => {
    req.body = input.body;
    const user = await new Promise<Express.User | false>((resolve, reject) => {
      passport.authenticate('local', { session: false }, (err: unknown, u: Express.User | false) => (err ? reject(err) : resolve(u)))(req, res, reject);
    });
    if (!user) throw new HttpError(401, 'invalid_credentials', 'E-mail or password is not right.');
    // passport 0.7 regenerates the session id inside logIn (session fixation guard).
    await new Promise<void>((resolve, reject) => req.logIn(user, (err) => (err ? reject(err) : resolve())));
    res.status(200).json(user);
  });

  r.post('/logout', { action: 'auth.logout' }, async ({ req, res }) => {
    if (req.session) {
      await new Promise<void>((resolve, reject) => req.session.destroy((err) => (err ? reject(err) : resolve())));
    }
    res.clearCookie(SESSION_COOKIE, { path: '/', httpOnly: true, sameSite: 'lax' });
    res.status(204).end();
  });

  r.get('/me', { action: 'auth.me' }, ({ req, res }) => {
    if (!req.user) throw new UnauthenticatedError();
    res.json(req.user);
  });

  r.post('/password-reset', { action: 'auth.password-reset', schemas: { body: resetRequestBodySchema }, before: [resetLimit] }, async ({ res, input }) => {
    await service.requestReset(input.body.email);
    res.status(202).json({ message: 'If an account has that address, a reset link is on its way. It works once and for one hour.' });
  });

  r.post('/password-reset/confirm', { action: 'auth.password-reset', schemas: { body: resetConfirmBodySchema } }, async ({ res, input }) => {
    await service.confirmReset(input.body);
    res.status(204).end();
  });

  return router;
}
