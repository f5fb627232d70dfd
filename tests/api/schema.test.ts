import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { openDatabase } from '../../server/db/data-source.js';
import { User } from '../../server/db/entities/index.js';
import { DEMO_ACCOUNTS, seedDemoIfEmpty } from '../../server/seed/demo.js';
import { demoPasswordHash } from './helpers.js';

describe('database', () => {
  it('migrates a fresh file to exactly the schema the entities describe, in WAL mode with foreign keys on', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'planewright-schema-'));
    const ds = await openDatabase(join(dir, 'db.sqlite'));
    try {
      const pending = await ds.driver.createSchemaBuilder().log();
      expect(pending.upQueries.map((q) => q.query)).toEqual([]);
      expect(await ds.query('PRAGMA journal_mode')).toEqual([{ journal_mode: 'wal' }]);
      expect(await ds.query('PRAGMA foreign_keys')).toEqual([{ foreign_keys: 1 }]);
      await expect(ds.query(`INSERT INTO memberships (user_id, studio_id, role, created_at) VALUES (999, 999, 'critic', '2026-01-01')`)).rejects.toThrow(/FOREIGN KEY/);
      expect(await ds.showMigrations()).toBe(false);
    } finally {
      await ds.destroy();
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('seeds the demo once into an empty database and never in production', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'planewright-seed-'));
    const ds = await openDatabase(join(dir, 'db.sqlite'));
    try {
      const passwordHash = await demoPasswordHash();
      expect(await seedDemoIfEmpty(ds, { env: 'production', passwordHash })).toBe(false);
      expect(await ds.getRepository(User).count()).toBe(0);
      expect(await seedDemoIfEmpty(ds, { env: 'development', passwordHash })).toBe(true);
      expect(await seedDemoIfEmpty(ds, { env: 'development', passwordHash })).toBe(false);
      expect(await ds.getRepository(User).count()).toBe(DEMO_ACCOUNTS.length);
      const emails = (await ds.getRepository(User).find()).map((u) => u.email);
      expect(emails.every((e) => e.endsWith('@example.org'))).toBe(true);
    } finally {
      await ds.destroy();
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('rolls back a half-done multi-step write', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'planewright-tx-'));
    const ds = await openDatabase(join(dir, 'db.sqlite'));
    try {
      // The seed runs in one transaction; a duplicate e-mail half-way makes it fail as a whole.
      await ds.query(`INSERT INTO users (email, name, password_hash, created_at) VALUES ('technician@example.org', 'Taken', 'x', '2026-01-01')`);
      const { seedDemo } = await import('../../server/seed/demo.js');
      await expect(seedDemo(ds, { passwordHash: await demoPasswordHash() })).rejects.toThrow();
      expect(await ds.query('SELECT COUNT(*) AS n FROM studios')).toEqual([{ n: 0 }]);
      expect(await ds.query('SELECT COUNT(*) AS n FROM users')).toEqual([{ n: 1 }]);
    } finally {
      await ds.destroy();
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
