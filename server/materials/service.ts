import type { CreateMaterialBody, Material as MaterialDto, UpdateMaterialBody } from '../../shared/api/materials.js';
import { createMaterialBodySchema } from '../../shared/api/materials.js';
import type { AppContext } from '../context.js';
import { Brief, Material } from '../db/entities/index.js';
import { ConflictError, NotFoundError, UnprocessableError } from '../http/errors.js';

export const materialDto = (m: Material): MaterialDto => ({
  id: m.id,
  name: m.name,
  thickness: m.thickness,
  kerf: m.kerf,
  cuttingSpeed: m.cuttingSpeed,
  density: m.density,
  sheetSizes: JSON.parse(m.sheetSizes) as [number, number][],
  prohibited: m.prohibited,
  prohibitedReason: m.prohibitedReason,
  notes: m.notes,
  createdAt: m.createdAt.toISOString(),
  updatedAt: m.updatedAt.toISOString(),
});

export function materialsService(ctx: AppContext) {
  const repo = ctx.dataSource.getRepository(Material);

  async function mustFind(id: number): Promise<Material> {
    const m = await repo.findOneBy({ id });
    if (!m) throw new NotFoundError('There is no material with this id.');
    return m;
  }

  async function nameFree(name: string, exceptId?: number): Promise<void> {
    const other = await repo.createQueryBuilder('m').where('lower(m.name) = lower(:name)', { name }).getOne();
    if (other && other.id !== exceptId) throw new ConflictError(`The catalogue already has a material called "${name}".`, 'material_name_taken');
  }

  return {
    /** Allowed materials first, then prohibited ones; by name. */
    async list(): Promise<MaterialDto[]> {
      const all = await repo.find({ order: { prohibited: 'ASC', name: 'ASC' } });
      return all.map(materialDto);
    },

    async create(body: CreateMaterialBody): Promise<MaterialDto> {
      const b = createMaterialBodySchema.parse(body);
      await nameFree(b.name);
      const now = ctx.clock.now();
      const m = await repo.save(
        repo.create({ ...b, sheetSizes: JSON.stringify(b.sheetSizes), prohibitedReason: b.prohibited ? b.prohibitedReason : null, createdAt: now, updatedAt: now }),
      );
      return materialDto(m);
    },

    async update(id: number, body: UpdateMaterialBody): Promise<MaterialDto> {
      const m = await mustFind(id);
      if (body.name !== undefined) await nameFree(body.name, id);
      const next = { ...materialDto(m), ...body };
      if (next.prohibited && !(next.prohibitedReason ?? '').trim()) {
        throw new UnprocessableError('Say why the material is prohibited.', { 'body.prohibitedReason': 'Say why the material is prohibited' });
      }
      await repo.update(
        { id },
        {
          name: next.name,
          thickness: next.thickness,
          kerf: next.kerf,
          cuttingSpeed: next.cuttingSpeed,
          density: next.density,
          sheetSizes: JSON.stringify(next.sheetSizes),
          prohibited: next.prohibited,
          prohibitedReason: next.prohibited ? next.prohibitedReason : null,
          notes: next.notes,
          updatedAt: ctx.clock.now(),
        },
      );
      return materialDto(await mustFind(id));
    },

    async remove(id: number): Promise<void> {
      await mustFind(id);
      const used = await ctx.dataSource.getRepository(Brief).countBy({ materialId: id });
      if (used > 0) {
        throw new ConflictError(`${used} brief${used === 1 ? ' uses' : 's use'} this material; mark it prohibited instead of deleting it.`, 'material_in_use');
      }
      await repo.delete({ id });
    },
  };
}
