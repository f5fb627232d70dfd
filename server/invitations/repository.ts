import type { DataSource, EntityManager } from 'typeorm';
import { IsNull } from 'typeorm';
import type { StudioRole } from '../../shared/api/roles.js';
import { Invitation, Membership, User } from '../db/entities/index.js';

export function invitationsRepository(ds: DataSource) {
  const invitations = ds.getRepository(Invitation);
  return {
    list: (studioId: number) => invitations.find({ where: { studioId }, relations: { invitedBy: true }, order: { createdAt: 'DESC', id: 'DESC' } }),

    findByHash: (tokenHash: string) => invitations.findOne({ where: { tokenHash }, relations: { studio: true, invitedBy: true } }),

    findInStudio: (studioId: number, id: number) => invitations.findOneBy({ studioId, id }),

    userByEmail: (email: string) => ds.getRepository(User).findOneBy({ email }),

    isMember: async (studioId: number, email: string) =>
      (await ds
        .getRepository(Membership)
        .createQueryBuilder('m')
        .innerJoin('m.user', 'u')
        .where('m.studio_id = :studioId AND u.email = :email', { studioId, email })
        .getCount()) > 0,

    /** Replaces any pending invitation of the address into the studio with a new one. */
    async replacePending(inv: Pick<Invitation, 'studioId' | 'email' | 'role' | 'tokenHash' | 'invitedById' | 'createdAt' | 'expiresAt'>): Promise<Invitation> {
      return ds.transaction(async (m: EntityManager) => {
        const repo = m.getRepository(Invitation);
        await repo.delete({ studioId: inv.studioId, email: inv.email, acceptedAt: IsNull(), revokedAt: IsNull() });
        return repo.save(repo.create({ ...inv, acceptedAt: null, acceptedById: null, revokedAt: null }));
      });
    },

    remove: (id: number) => invitations.delete({ id }),

    revoke: (id: number, at: Date) => invitations.update({ id, acceptedAt: IsNull(), revokedAt: IsNull() }, { revokedAt: at }),

    /**
     * Spends the invitation and adds the membership (creating the account first when `newUser`
     * is given), all in one transaction. Returns the user id, or 'spent' when someone else used
     * the invitation first, or 'member' when the person is already in the studio.
     */
    async accept(
      inv: Invitation,
      who: { userId: number } | { newUser: Pick<User, 'email' | 'name' | 'passwordHash'> },
      at: Date,
      role: StudioRole,
    ): Promise<number | 'spent' | 'member'> {
      return ds.transaction(async (m: EntityManager) => {
        let userId: number;
        if ('newUser' in who) {
          const users = m.getRepository(User);
          const u = await users.save(users.create({ ...who.newUser, globalRole: null, createdAt: at, lastLoginAt: at }));
          userId = u.id;
        } else {
          userId = who.userId;
          if (await m.getRepository(Membership).existsBy({ userId, studioId: inv.studioId })) return 'member';
        }
        const spent = await m
          .getRepository(Invitation)
          .update({ id: inv.id, acceptedAt: IsNull(), revokedAt: IsNull() }, { acceptedAt: at, acceptedById: userId });
        if (spent.affected !== 1) return 'spent';
        await m.getRepository(Membership).insert({ userId, studioId: inv.studioId, role, createdAt: at });
        return userId;
      });
    },
  };
}
