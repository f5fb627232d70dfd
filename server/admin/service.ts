import type { AdminUser, MailMessage as MailDto, MailSummary } from '../../shared/api/admin.js';
import type { GlobalRole } from '../../shared/api/roles.js';
import type { AppContext } from '../context.js';
import type { MailMessage, User } from '../db/entities/index.js';
import { ConflictError, NotFoundError } from '../http/errors.js';
import type { Actor } from '../policy/policy.js';
import { adminRepository } from './repository.js';

const userDto = (u: User): AdminUser => ({
  id: u.id,
  email: u.email,
  name: u.name,
  globalRole: u.globalRole,
  createdAt: u.createdAt.toISOString(),
  lastLoginAt: u.lastLoginAt ? u.lastLoginAt.toISOString() : null,
  memberships: [...u.memberships]
    .sort((a, b) => a.studio.name.localeCompare(b.studio.name))
    .map((m) => ({ studioId: m.studioId, studioName: m.studio.name, role: m.role })),
});

const summary = (m: Pick<MailMessage, 'id' | 'from' | 'to' | 'subject' | 'receivedAt'>): MailSummary => ({
  id: m.id,
  from: m.from,
  to: m.to,
  subject: m.subject,
  receivedAt: m.receivedAt.toISOString(),
});

export function adminService(ctx: AppContext) {
  const repo = adminRepository(ctx.dataSource);
  return {
    users: async (): Promise<AdminUser[]> => (await repo.users()).map(userDto),

    async setGlobalRole(actor: Actor, userId: number, globalRole: GlobalRole | null): Promise<AdminUser> {
      const user = await repo.user(userId);
      if (!user) throw new NotFoundError('There is no user with this id.');
      if (user.id === actor.id && user.globalRole === 'admin' && globalRole !== 'admin') {
        throw new ConflictError('You cannot remove your own admin role. Ask another admin to do it.', 'own_admin_role');
      }
      await repo.setGlobalRole(userId, globalRole);
      return userDto((await repo.user(userId))!);
    },

    outbox: async (): Promise<MailSummary[]> => (await repo.outbox()).map(summary),

    async message(id: number): Promise<MailDto> {
      const m = await repo.message(id);
      if (!m) throw new NotFoundError('There is no message with this id in the outbox.');
      return { ...summary(m), text: m.text, html: m.html };
    },
  };
}
