import type { ResetConfirmBody, SessionUser } from '../../shared/api/auth.js';
import type { AppContext } from '../context.js';
import { GoneError } from '../http/errors.js';
import { burnTime, hashPassword, verifyPassword } from '../lib/password.js';
import { hashToken, newToken } from '../lib/tokens.js';
import { simpleHtml } from '../mail/mail-service.js';
import { authRepository } from './repository.js';

export const RESET_LIFETIME_MS = 60 * 60 * 1000;

export function authService(ctx: AppContext) {
  const repo = authRepository(ctx.dataSource);
  const log = ctx.logError ?? console.error;
  return {
    sessionUser: repo.sessionUser,

    /** The user when e-mail and password match; null otherwise, taking the same time either way. */
    async authenticate(email: string, password: string): Promise<SessionUser | null> {
      const user = await repo.findByEmail(email);
      if (!user) {
        await burnTime(password);
        return null;
      }
      if (!(await verifyPassword(password, user.passwordHash))) return null;
      await repo.touchLastLogin(user.id, ctx.clock.now());
      return repo.sessionUser(user.id);
    },

    /** Mails a one-hour, single-use link when the address has an account; silent otherwise. */
    async requestReset(email: string): Promise<void> {
      const user = await repo.findByEmail(email);
      if (!user) return;
      const token = newToken();
      const now = ctx.clock.now();
      await repo.addReset({ userId: user.id, tokenHash: hashToken(token), createdAt: now, expiresAt: new Date(now.getTime() + RESET_LIFETIME_MS) });
      const link = `${ctx.config.publicUrl}/reset-password?token=${encodeURIComponent(token)}`;
      const lines = [
        `Hello ${user.name},`,
        'Someone asked to reset the password of your Planewright account. If it was you, open the link below and choose a new password. The link works once and for one hour.',
        'If you did not ask for this, you can ignore this message; your password stays as it is.',
      ];
      try {
        await ctx.mail.send({
          to: user.email,
          subject: 'Reset your Planewright password',
          text: `${lines.join('\n\n')}\n\n${link}\n\n— Planewright\n`,
          html: simpleHtml(lines, { href: link, label: 'Choose a new password' }),
        });
      } catch (e) {
        // The answer is 202 either way so addresses cannot be probed; the failure is logged.
        log(e);
      }
    },

    async confirmReset(body: ResetConfirmBody): Promise<void> {
      const reset = await repo.findReset(hashToken(body.token));
      const now = ctx.clock.now();
      if (!reset) throw new GoneError('This reset link is not valid. Ask for a new one from the sign-in page.', 'reset_invalid');
      if (reset.usedAt) throw new GoneError('This reset link has already been used. Ask for a new one from the sign-in page.', 'reset_used');
      if (reset.expiresAt.getTime() <= now.getTime()) {
        throw new GoneError('This reset link has expired (links last one hour). Ask for a new one from the sign-in page.', 'reset_expired');
      }
      await repo.resetPassword(reset.userId, await hashPassword(body.password), now);
    },
  };
}
export type AuthService = ReturnType<typeof authService>;
