/**
 * The demo: an invented maker space (Quillmarsh Fabrication Hall in the town of Tarrow Bridge)
 * with one studio running two flat-pack lamp briefs (demo-work.ts). People and places are made up; addresses use
 * example.org. Seeded only into an empty database and never when NODE_ENV=production.
 */
import type { DataSource, EntityManager } from 'typeorm';
import type { GlobalRole, StudioRole } from '../../shared/api/roles.js';
import { Membership, Studio, User } from '../db/entities/index.js';
import type { Clock } from '../lib/clock.js';
import { systemClock } from '../lib/clock.js';
import { hashPassword } from '../lib/password.js';
import { seedStudioWork } from './demo-work.js';

export const DEMO_PASSWORD = 'planewright-demo';
export const DEMO_STUDIO = {
  name: 'Quillmarsh Lamp Studio',
  description:
    'Spring cohort at Quillmarsh Fabrication Hall, Tarrow Bridge: symmetric lamps and hanging pieces from 3 mm birch plywood, cut on the hall\u2019s two lasers.',
};

export interface DemoAccount {
  email: string;
  name: string;
  globalRole: GlobalRole | null;
  studioRole: StudioRole | null;
}

export const DEMO_ACCOUNTS: readonly DemoAccount[] = [
  { email: 'admin@example.org', name: 'Odile Varga', globalRole: 'admin', studioRole: null },
  { email: 'instructor@example.org', name: 'Tomasz Elberg', globalRole: null, studioRole: 'instructor' },
  { email: 'critic@example.org', name: 'Ren\u00e9e Ashcombe', globalRole: null, studioRole: 'critic' },
  { email: 'participant@example.org', name: 'Kofi Mensah-Lowe', globalRole: null, studioRole: 'participant' },
  { email: 'technician@example.org', name: 'In\u00eas Carvalho', globalRole: 'technician', studioRole: null },
  { email: 'priya.nandakumar@example.org', name: 'Priya Nandakumar', globalRole: null, studioRole: 'participant' },
  { email: 'lars.brennholt@example.org', name: 'Lars Brennholt', globalRole: null, studioRole: 'participant' },
  { email: 'mei.tanaka-rowe@example.org', name: 'Mei Tanaka-Rowe', globalRole: null, studioRole: 'participant' },
];

export interface SeedOptions {
  clock?: Clock;
  /** A bcrypt hash of DEMO_PASSWORD to reuse (tests hash once per file). */
  passwordHash?: string;
  env?: string;
}

/** Seeds the demo when the database has no users; returns whether it did. */
export async function seedDemoIfEmpty(ds: DataSource, options: SeedOptions = {}): Promise<boolean> {
  if ((options.env ?? process.env.NODE_ENV) === 'production') return false;
  if ((await ds.getRepository(User).count()) > 0) return false;
  await seedDemo(ds, options);
  return true;
}

export async function seedDemo(ds: DataSource, options: SeedOptions = {}): Promise<void> {
  const now = (options.clock ?? systemClock).now();
  // One hash for every demo account keeps start-up to a single cost-12 hash.
  const passwordHash = options.passwordHash ?? (await hashPassword(DEMO_PASSWORD));
  await ds.transaction(async (m: EntityManager) => {
    const studio = await m.getRepository(Studio).save(m.getRepository(Studio).create({ ...DEMO_STUDIO, createdAt: now }));
    const userIds = new Map<string, number>();
    for (const a of DEMO_ACCOUNTS) {
      const users = m.getRepository(User);
      const u = await users.save(users.create({ email: a.email, name: a.name, passwordHash, globalRole: a.globalRole, createdAt: now, lastLoginAt: null }));
      userIds.set(a.email, u.id);
      if (a.studioRole) await m.getRepository(Membership).insert({ userId: u.id, studioId: studio.id, role: a.studioRole, createdAt: now });
    }
    // The material catalogue, two published briefs and audited revisions (demo-work.ts).
    await seedStudioWork(m, { studioId: studio.id, userIds, now });
  });
}
