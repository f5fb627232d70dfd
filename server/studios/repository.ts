import type { DataSource, EntityManager } from 'typeorm';
import { In } from 'typeorm';
import type { StudioRole } from '../../shared/api/roles.js';
import { Membership, Studio } from '../db/entities/index.js';

export function studiosRepository(ds: DataSource) {
  const studios = ds.getRepository(Studio);
  const memberships = ds.getRepository(Membership);
  return {
    find: (id: number) => studios.findOneBy({ id }),
    findByName: (name: string) => studios.createQueryBuilder('s').where('lower(s.name) = lower(:name)', { name }).getOne(),
    all: () => studios.find({ order: { name: 'ASC' } }),
    byIds: (ids: number[]) => studios.find({ where: { id: In(ids) }, order: { name: 'ASC' } }),
    create: (s: Pick<Studio, 'name' | 'description' | 'createdAt'>) => studios.save(studios.create(s)),

    async memberCounts(ids: number[]): Promise<Map<number, number>> {
      if (ids.length === 0) return new Map();
      const rows: { studioId: number; n: number }[] = await memberships
        .createQueryBuilder('m')
        .select('m.studio_id', 'studioId')
        .addSelect('COUNT(*)', 'n')
        .where('m.studio_id IN (:...ids)', { ids })
        .groupBy('m.studio_id')
        .getRawMany();
      return new Map(rows.map((r) => [Number(r.studioId), Number(r.n)]));
    },

    members: (studioId: number) =>
      memberships.find({ where: { studioId }, relations: { user: true }, order: { user: { name: 'ASC' } } }),

    membership: (studioId: number, userId: number) => memberships.findOne({ where: { studioId, userId }, relations: { user: true } }),

    /**
     * Runs `change` on the membership inside a transaction that first checks the studio keeps at
     * least one instructor afterwards; `keepsInstructor` false means the change is refused.
     */
    async changeMembership(
      studioId: number,
      userId: number,
      change: { role: StudioRole } | { remove: true },
    ): Promise<'ok' | 'missing' | 'last-instructor'> {
      return ds.transaction(async (m: EntityManager) => {
        const repo = m.getRepository(Membership);
        const current = await repo.findOneBy({ studioId, userId });
        if (!current) return 'missing';
        const losesInstructor = current.role === 'instructor' && ('remove' in change || change.role !== 'instructor');
        if (losesInstructor) {
          const instructors = await repo.countBy({ studioId, role: 'instructor' });
          if (instructors <= 1) return 'last-instructor';
        }
        if ('remove' in change) await repo.delete({ id: current.id });
        else await repo.update({ id: current.id }, { role: change.role });
        return 'ok';
      });
    },
  };
}
