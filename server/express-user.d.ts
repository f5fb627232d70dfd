import type { SessionUser } from '../shared/api/auth.js';

declare global {
  namespace Express {
    // passport puts the signed-in user here (see auth/passport.ts: deserializeUser).
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends SessionUser {}
  }
}
export {};
