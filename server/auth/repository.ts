import type { DataSource, EntityManager } from 'typeorm';
import { IsNull } from 'typeorm';
import { PasswordReset, Session, User } from '../db/entities/index.js';
import { loadSessionUser } from '../db/session-user.js';

export function authRepository(ds: DataSource) {
  const users = ds.getRepository(User);
  return {
    findByEmail: (email: string) => users.findOneBy({ email: email.toLowerCase() }),

    sessionUser: (id: number) => loadSessionUser(ds, id),

    touchLastLogin: (id: number, at: Date) => users.update({ id }, { lastLoginAt: at }),

    addReset: (reset: Pick<PasswordReset, 'userId' | 'tokenHash' | 'createdAt' | 'expiresAt'>) =>
      ds.getRepository(PasswordReset).insert({ ...reset, usedAt: null }),

    findReset: (tokenHash: string) => ds.getRepository(PasswordReset).findOneBy({ tokenHash }),

    /** Sets the password, spends every open reset of the user and ends their sessions, in one transaction. */
    async resetPassword(userId: number, passwordHash: string, at: Date): Promise<void> {
      await ds.transaction(async (m: EntityManager) => {
        await m.getRepository(User).update({ id: userId }, { passwordHash });
        await m.getRepository(PasswordReset).update({ userId, usedAt: IsNull() }, { usedAt: at });
        // Session rows hold `"passport":{"user":<id>}` (see passport.ts serializeUser).
        await m
          .getRepository(Session)
          .createQueryBuilder()
          .delete()
          .where('json LIKE :pattern', { pattern: `%"passport":{"user":${Number(userId)}}%` })
          .execute();
      });
    },
  };
}
export type AuthRepository = ReturnType<typeof authRepository>;
