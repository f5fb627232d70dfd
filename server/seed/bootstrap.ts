/**
 * A fresh install without the demo (NODE_ENV=production): the first admin comes from the
 * environment (ADMIN_EMAIL, ADMIN_PASSWORD, ADMIN_NAME) and the starting material catalogue —
 * with its prohibited materials — is added once, so the maker space starts with the cautions in
 * place. Nothing happens once any account exists.
 */
import type { DataSource, EntityManager } from 'typeorm';
import { createMaterialBodySchema } from '../../shared/api/materials.js';
import { Material, User } from '../db/entities/index.js';
import { hashPassword } from '../lib/password.js';
import { STARTING_CATALOGUE } from '../materials/catalogue.js';

export type BootstrapResult = 'created' | 'not-empty' | 'no-admin-configured';

/** Adds the starting catalogue; returns the saved materials by name. */
export async function seedCatalogue(m: EntityManager, now: Date): Promise<Map<string, Material>> {
  const materials = m.getRepository(Material);
  const saved = new Map<string, Material>();
  for (const raw of STARTING_CATALOGUE) {
    const b = createMaterialBodySchema.parse(raw);
    saved.set(b.name, await materials.save(materials.create({ ...b, sheetSizes: JSON.stringify(b.sheetSizes), createdAt: now, updatedAt: now })));
  }
  return saved;
}

export async function bootstrapInstall(
  ds: DataSource,
  admin: { email: string; password: string; name: string } | undefined,
  now: Date,
): Promise<BootstrapResult> {
  if ((await ds.getRepository(User).count()) > 0) return 'not-empty';
  if (!admin) return 'no-admin-configured';
  const passwordHash = await hashPassword(admin.password);
  await ds.transaction(async (m) => {
    await m.getRepository(User).save(
      m.getRepository(User).create({ email: admin.email, name: admin.name, passwordHash, globalRole: 'admin', createdAt: now }),
    );
    if ((await m.getRepository(Material).count()) === 0) await seedCatalogue(m, now);
  });
  return 'created';
}
