import type { CreateStudioBody, Member, Studio as StudioDto } from '../../shared/api/studios.js';
import type { StudioRole } from '../../shared/api/roles.js';
import type { AppContext } from '../context.js';
import type { Membership, Studio } from '../db/entities/index.js';
import { ConflictError, NotFoundError } from '../http/errors.js';
import { isAdmin, studioRole, type Actor } from '../policy/policy.js';
import { studiosRepository } from './repository.js';

const memberDto = (m: Membership): Member => ({
  userId: m.userId,
  name: m.user.name,
  email: m.user.email,
  role: m.role,
  joinedAt: m.createdAt.toISOString(),
});

export function studiosService(ctx: AppContext) {
  const repo = studiosRepository(ctx.dataSource);

  async function dtos(actor: Actor, list: Studio[]): Promise<StudioDto[]> {
    const counts = await repo.memberCounts(list.map((s) => s.id));
    return list.map((s) => ({
      id: s.id,
      name: s.name,
      description: s.description,
      createdAt: s.createdAt.toISOString(),
      myRole: studioRole(actor, s.id),
      memberCount: counts.get(s.id) ?? 0,
    }));
  }

  async function mustFind(studioId: number): Promise<Studio> {
    const s = await repo.find(studioId);
    if (!s) throw new NotFoundError('There is no studio with this id.');
    return s;
  }

  return {
    /** The caller's studios; an admin sees every studio. */
    async list(actor: Actor): Promise<StudioDto[]> {
      const list = isAdmin(actor) ? await repo.all() : await repo.byIds(actor.memberships.map((m) => m.studioId));
      return dtos(actor, list);
    },

    async get(actor: Actor, studioId: number): Promise<StudioDto> {
      return (await dtos(actor, [await mustFind(studioId)]))[0];
    },

    async create(actor: Actor, body: CreateStudioBody): Promise<StudioDto> {
      const name = body.name.trim();
      if (await repo.findByName(name)) throw new ConflictError(`A studio called "${name}" already exists.`, 'studio_name_taken');
      const s = await repo.create({ name, description: body.description ?? '', createdAt: ctx.clock.now() });
      return (await dtos(actor, [s]))[0];
    },

    async members(studioId: number): Promise<Member[]> {
      await mustFind(studioId);
      return (await repo.members(studioId)).map(memberDto);
    },

    async setRole(studioId: number, userId: number, role: StudioRole): Promise<Member> {
      await mustFind(studioId);
      const outcome = await repo.changeMembership(studioId, userId, { role });
      if (outcome === 'missing') throw new NotFoundError('This person is not a member of the studio.');
      if (outcome === 'last-instructor') {
        throw new ConflictError('A studio needs at least one instructor. Make someone else an instructor first.', 'last_instructor');
      }
      return memberDto((await repo.membership(studioId, userId))!);
    },

    async remove(studioId: number, userId: number): Promise<void> {
      await mustFind(studioId);
      const outcome = await repo.changeMembership(studioId, userId, { remove: true });
      if (outcome === 'missing') throw new NotFoundError('This person is not a member of the studio.');
      if (outcome === 'last-instructor') {
        throw new ConflictError('A studio needs at least one instructor. Make someone else an instructor before removing this one.', 'last_instructor');
      }
    },
  };
}
