/**
 * A fresh production install: the first admin comes from the environment and the starting
 * material catalogue (with its prohibited materials) is added once; a second start changes nothing.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Material, User } from '../../server/db/entities/index.js';
import { bootstrapInstall } from '../../server/seed/bootstrap.js';
import { startTestApp, type TestApp } from './helpers.js';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({ seed: false });
});
afterAll(async () => {
  await t?.close();
});

describe('bootstrapInstall', () => {
  it('when no admin is configured it creates nothing and says so', async () => {
    await expect(bootstrapInstall(t.ds, undefined, t.clock.now())).resolves.toBe('no-admin-configured');
    await expect(t.ds.getRepository(User).count()).resolves.toBe(0);
    await expect(t.ds.getRepository(Material).count()).resolves.toBe(0);
  });

  it('creates the first admin, who can sign in, and the starting catalogue with prohibited materials', async () => {
    const admin = { email: 'hall.admin@example.org', password: 'first-admin-pass', name: 'Hall admin' };
    await expect(bootstrapInstall(t.ds, admin, t.clock.now())).resolves.toBe('created');
    const user = await t.ds.getRepository(User).findOneByOrFail({ email: admin.email });
    expect(user.globalRole).toBe('admin');
    const materials = await t.ds.getRepository(Material).find();
    expect(materials.length).toBeGreaterThan(3);
    expect(materials.some((m) => m.prohibited && /PVC|vinyl/i.test(m.name))).toBe(true);

    const res = await request(t.app).post('/api/auth/login').set('Origin', 'http://planewright.test').send({ email: admin.email, password: admin.password });
    expect(res.status).toBe(200);
    expect(res.body.globalRole).toBe('admin');
  });

  it('does nothing once an account exists', async () => {
    const before = await t.ds.getRepository(Material).count();
    await expect(bootstrapInstall(t.ds, { email: 'second@example.org', password: 'another-pass-1', name: 'X' }, t.clock.now())).resolves.toBe('not-empty');
    await expect(t.ds.getRepository(User).count()).resolves.toBe(1);
    await expect(t.ds.getRepository(Material).count()).resolves.toBe(before);
  });
});
