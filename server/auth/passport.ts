/**
 * passport-local on a private Passport instance (one per app, so test apps do not share state).
 * The session stores only the user id; every request reloads the user and memberships, so a
 * role change or removal takes effect at once.
 */
import passportModule from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { AuthService } from './service.js';

export function createPassport(service: AuthService) {
  const passport = new passportModule.Passport();
  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password', session: true }, (email, password, done) => {
      service.authenticate(email, password).then(
        (user) => done(null, user ?? false),
        (e: unknown) => done(e),
      );
    }),
  );
  passport.serializeUser((user: { id: number }, done) => done(null, user.id));
  passport.deserializeUser((id: unknown, done) => {
    if (typeof id !== 'number') return done(null, false);
    service.sessionUser(id).then(
      (u) => done(null, u ?? false),
      (e: unknown) => done(e),
    );
  });
  return passport;
}
