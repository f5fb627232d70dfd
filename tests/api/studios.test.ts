import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { memberSchema, studioSchema } from '../../shared/api/studios.js';
import { DEMO_STUDIO_ID, startTestApp, type TestApp } from './helpers.js';

let t: TestApp;
let admin: string;
let instructor: string;
beforeAll(async () => {
  t = await startTestApp();
  [admin, instructor] = await Promise.all([t.cookieFor('admin@example.org'), t.cookieFor('instructor@example.org')]);
});
afterAll(async () => {
  await t.close();
});

const userId = async (email: string) => (await t.ds.query('SELECT id FROM users WHERE email = ?', [email]))[0].id as number;

describe('studios', () => {
  it('lists my studios with my role; an admin sees every studio with myRole null', async () => {
    const mine = await request(t.app).get('/api/studios').set('Cookie', instructor);
    expect(mine.status).toBe(200);
    expect(mine.body.map((s: unknown) => studioSchema.parse(s))).toEqual([expect.objectContaining({ name: 'Quillmarsh Lamp Studio', myRole: 'instructor', memberCount: 6 })]);
    const all = await request(t.app).get('/api/studios').set('Cookie', admin);
    expect(all.body).toEqual([expect.objectContaining({ id: DEMO_STUDIO_ID, myRole: null })]);
  });

  it('answers an empty list with 200 []', async () => {
    await t.addUser('nobody.member@example.org', 'Nobody Member');
    const cookie = await t.cookieFor('nobody.member@example.org');
    const res = await request(t.app).get('/api/studios').set('Cookie', cookie);
    expect(res.status).toBe(200);
    expect(res.body).toEqual([]);
  });

  it('lets an admin create a studio and refuses a duplicate name with 409', async () => {
    const res = await request(t.app).post('/api/studios').set('Cookie', admin).send({ name: '  Autumn Shelf Studio ' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ name: 'Autumn Shelf Studio', description: '', memberCount: 0, myRole: null });
    const dup = await request(t.app).post('/api/studios').set('Cookie', admin).send({ name: 'autumn shelf studio' });
    expect(dup.status).toBe(409);
    const bad = await request(t.app).post('/api/studios').set('Cookie', admin).send({ name: 'x', description: 5 });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['body.description', 'body.name']);
  });

  it('answers 404 for a studio that does not exist (admin) and 400 for a malformed id', async () => {
    expect((await request(t.app).get('/api/studios/9999').set('Cookie', admin)).status).toBe(404);
    const bad = await request(t.app).get('/api/studios/abc').set('Cookie', admin);
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('params.studioId');
  });

  it('shows members to a participant', async () => {
    const cookie = await t.cookieFor('participant@example.org');
    const res = await request(t.app).get(`/api/studios/${DEMO_STUDIO_ID}/members`).set('Cookie', cookie);
    expect(res.status).toBe(200);
    const members = res.body.map((m: unknown) => memberSchema.parse(m));
    expect(members.map((m: { role: string }) => m.role).sort()).toEqual(['critic', 'instructor', 'participant', 'participant', 'participant', 'participant']);
  });
});

describe('members', () => {
  it('lets an instructor change a role and remove a member', async () => {
    const lars = await userId('lars.brennholt@example.org');
    const patch = await request(t.app).patch(`/api/studios/${DEMO_STUDIO_ID}/members/${lars}`).set('Cookie', instructor).send({ role: 'critic' });
    expect(patch.status).toBe(200);
    expect(patch.body).toMatchObject({ userId: lars, role: 'critic' });
    const del = await request(t.app).delete(`/api/studios/${DEMO_STUDIO_ID}/members/${lars}`).set('Cookie', instructor);
    expect(del.status).toBe(204);
    expect((await request(t.app).delete(`/api/studios/${DEMO_STUDIO_ID}/members/${lars}`).set('Cookie', instructor)).status).toBe(404);
  });

  it('protects the last instructor from demotion and removal (409), but not once there is another', async () => {
    const me = await userId('instructor@example.org');
    const demote = await request(t.app).patch(`/api/studios/${DEMO_STUDIO_ID}/members/${me}`).set('Cookie', instructor).send({ role: 'participant' });
    expect(demote.status).toBe(409);
    expect(demote.body.error.code).toBe('last_instructor');
    const remove = await request(t.app).delete(`/api/studios/${DEMO_STUDIO_ID}/members/${me}`).set('Cookie', admin);
    expect(remove.status).toBe(409);

    const mei = await userId('mei.tanaka-rowe@example.org');
    expect((await request(t.app).patch(`/api/studios/${DEMO_STUDIO_ID}/members/${mei}`).set('Cookie', instructor).send({ role: 'instructor' })).status).toBe(200);
    const nowOk = await request(t.app).patch(`/api/studios/${DEMO_STUDIO_ID}/members/${me}`).set('Cookie', instructor).send({ role: 'critic' });
    expect(nowOk.status).toBe(200);
    // The change shows at once: the former instructor can no longer manage members.
    const denied = await request(t.app).patch(`/api/studios/${DEMO_STUDIO_ID}/members/${mei}`).set('Cookie', instructor).send({ role: 'participant' });
    expect(denied.status).toBe(403);
  });

  it('names a bad role', async () => {
    const res = await request(t.app).patch(`/api/studios/${DEMO_STUDIO_ID}/members/1`).set('Cookie', admin).send({ role: 'owner' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('body.role');
  });
});

describe('admin', () => {
  it('lists users with memberships and changes a global role', async () => {
    const users = await request(t.app).get('/api/admin/users').set('Cookie', admin);
    expect(users.status).toBe(200);
    const kofi = users.body.find((u: { email: string }) => u.email === 'participant@example.org');
    expect(kofi).toMatchObject({ name: 'Kofi Mensah-Lowe', globalRole: null, memberships: [{ studioName: 'Quillmarsh Lamp Studio', role: 'participant' }] });
    const res = await request(t.app).patch(`/api/admin/users/${kofi.id}`).set('Cookie', admin).send({ globalRole: 'technician' });
    expect(res.status).toBe(200);
    expect(res.body.globalRole).toBe('technician');
    expect((await request(t.app).patch('/api/admin/users/99999').set('Cookie', admin).send({ globalRole: null })).status).toBe(404);
  });

  it('does not let an admin remove their own admin role', async () => {
    const me = await userId('admin@example.org');
    const res = await request(t.app).patch(`/api/admin/users/${me}`).set('Cookie', admin).send({ globalRole: null });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('own_admin_role');
  });

  it('shows the outbox newest first and one message in full', async () => {
    await request(t.app).post('/api/auth/password-reset').send({ email: 'critic@example.org' });
    const list = await request(t.app).get('/api/admin/outbox').set('Cookie', admin);
    expect(list.status).toBe(200);
    expect(list.body[0]).toMatchObject({ subject: 'Reset your Planewright password', to: expect.stringContaining('critic@example.org') });
    expect(list.body[0]).not.toHaveProperty('text');
    const one = await request(t.app).get(`/api/admin/outbox/${list.body[0].id}`).set('Cookie', admin);
    expect(one.body.text).toContain('reset-password?token=');
    expect((await request(t.app).get('/api/admin/outbox/99999').set('Cookie', admin)).status).toBe(404);
  });
});
