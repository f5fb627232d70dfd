import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sessionUserSchema } from '../../shared/api/auth.js';
import { Session } from '../../server/db/entities/index.js';
import { DEMO_PASSWORD, sessionCookie, startTestApp, type TestApp } from './helpers.js';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(async () => {
  await t.close();
});

describe('GET /api/health', () => {
  it('answers ok', async () => {
    const res = await request(t.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok' });
  });
});

describe('POST /api/auth/login', () => {
  it('signs in with the right password and returns the user with memberships', async () => {
    const res = await request(t.app).post('/api/auth/login').send({ email: 'Instructor@Example.org ', password: DEMO_PASSWORD });
    expect(res.status).toBe(200);
    const user = sessionUserSchema.parse(res.body);
    expect(user.email).toBe('instructor@example.org');
    expect(user.memberships).toEqual([expect.objectContaining({ role: 'instructor', studioName: 'Quillmarsh Lamp Studio' })]);
    const cookie = (res.headers['set-cookie'] as unknown as string[]).find((c) => c.startsWith('planewright.sid='))!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/i);
  });

  it('sets a Secure cookie when the request came over HTTPS through a trusted proxy', async () => {
    const { createApp } = await import('../../server/app.js');
    const app = createApp({ ...t.ctx, config: { ...t.ctx.config, trustProxy: '1' } });
    const res = await request(app).post('/api/auth/login').set('X-Forwarded-Proto', 'https').send({ email: 'critic@example.org', password: DEMO_PASSWORD });
    expect(res.status).toBe(200);
    expect((res.headers['set-cookie'] as unknown as string[]).find((c) => c.startsWith('planewright.sid='))).toMatch(/Secure/);
  });

  it('refuses a wrong password with 401 and the common message', async () => {
    const res = await request(t.app).post('/api/auth/login').send({ email: 'instructor@example.org', password: 'not-the-password' });
    expect(res.status).toBe(401);
    expect(res.body.error).toEqual({ code: 'invalid_credentials', message: 'E-mail or password is not right.' });
    expect(res.headers['set-cookie']).toBeUndefined();
  });

  it('answers an unknown e-mail exactly like a wrong password', async () => {
    const res = await request(t.app).post('/api/auth/login').send({ email: 'nobody@example.org', password: 'whatever-it-is' });
    expect(res.status).toBe(401);
    expect(res.body.error).toEqual({ code: 'invalid_credentials', message: 'E-mail or password is not right.' });
  });

  it('names the bad fields of a malformed body', async () => {
    const res = await request(t.app).post('/api/auth/login').send({ email: 'not an address', password: '' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_request');
    expect(res.body.error.fields).toEqual({ 'body.email': 'Enter a valid e-mail address', 'body.password': 'Enter your password' });
  });

  it('answers broken JSON with 400 and no stack', async () => {
    const res = await request(t.app).post('/api/auth/login').set('Content-Type', 'application/json').send('{"email":');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_json');
    expect(JSON.stringify(res.body)).not.toMatch(/at .*\.(js|ts)/);
  });

  it('gives a new session id at sign-in (no fixation)', async () => {
    const agent = request.agent(t.app);
    // Any request that saves a session would do; a failed sign-in does not, so make one first by signing in.
    const first = await agent.post('/api/auth/login').send({ email: 'critic@example.org', password: DEMO_PASSWORD });
    const before = sessionCookie(first);
    const second = await agent.post('/api/auth/login').send({ email: 'participant@example.org', password: DEMO_PASSWORD });
    const after = sessionCookie(second);
    expect(after).not.toBe(before);
    // The old id no longer signs anyone in.
    const old = await request(t.app).get('/api/auth/me').set('Cookie', before);
    expect(old.status).toBe(401);
    const me = await request(t.app).get('/api/auth/me').set('Cookie', after);
    expect(me.body.email).toBe('participant@example.org');
  });
});

describe('GET /api/auth/me', () => {
  it('returns the signed-in user', async () => {
    const cookie = await t.signIn('admin@example.org');
    const res = await request(t.app).get('/api/auth/me').set('Cookie', cookie);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ email: 'admin@example.org', globalRole: 'admin', memberships: [] });
  });

  it('answers 401 JSON when signed out', async () => {
    const res = await request(t.app).get('/api/auth/me');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });
});

describe('POST /api/auth/logout', () => {
  it('destroys the session and clears the cookie', async () => {
    const cookie = await t.cookieFor('technician@example.org');
    const sid = decodeURIComponent(cookie.split('=')[1]).slice(2).split('.')[0];
    expect(await t.ds.getRepository(Session).findOneBy({ id: sid })).not.toBeNull();
    const res = await request(t.app).post('/api/auth/logout').set('Cookie', cookie);
    expect(res.status).toBe(204);
    expect(String(res.headers['set-cookie'])).toMatch(/planewright\.sid=;.*Expires=Thu, 01 Jan 1970/);
    expect(await t.ds.getRepository(Session).findOne({ where: { id: sid }, withDeleted: true })).toBeNull();
    const me = await request(t.app).get('/api/auth/me').set('Cookie', cookie);
    expect(me.status).toBe(401);
  });
});
