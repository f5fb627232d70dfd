import type { DataSource } from 'typeorm';
import type { SessionUser } from '../../shared/api/auth.js';
import { Membership, User } from './entities/index.js';

/** The signed-in user as the API returns it: global role and studio memberships. */
export async function loadSessionUser(ds: DataSource, id: number): Promise<SessionUser | null> {
  const user = await ds.getRepository(User).findOneBy({ id });
  if (!user) return null;
  const memberships = await ds.getRepository(Membership).find({
    where: { userId: id },
    relations: { studio: true },
    order: { studio: { name: 'ASC' } },
  });
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    globalRole: user.globalRole,
    memberships: memberships.map((m) => ({ studioId: m.studioId, studioName: m.studio.name, role: m.role })),
  };
}
