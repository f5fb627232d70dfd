import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.js';
import { DEMO_PASSWORD, startTestApp, type TestApp } from './helpers.js';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({ loginRateLimit: 3 });
});
afterAll(async () => {
  await t.close();
});

describe('session persistence', () => {
  it('keeps a session across an app restart on the same database file', async () => {
    const cookie = await t.signIn('critic@example.org');
    const restarted = await startTestApp({ databasePath: t.databasePath });
    try {
      const res = await request(restarted.app).get('/api/auth/me').set('Cookie', cookie);
      expect(res.status).toBe(200);
      expect(res.body.email).toBe('critic@example.org');
    } finally {
      await restarted.close();
    }
  });

  it('does not accept the cookie when the secret changed', async () => {
    const cookie = await t.cookieFor('critic@example.org');
    const other = await startTestApp({ databasePath: t.databasePath, sessionSecret: 'a-completely-different-secret-of-enough-length' });
    try {
      expect((await request(other.app).get('/api/auth/me').set('Cookie', cookie)).status).toBe(401);
    } finally {
      await other.close();
    }
  });
});

describe('request guards', () => {
  it('refuses a state-changing request from a foreign Origin with 403', async () => {
    const res = await request(t.app).post('/api/auth/login').set('Origin', 'https://elsewhere.example.net').send({ email: 'admin@example.org', password: DEMO_PASSWORD });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('foreign_origin');
  });

  it('lets the same origin and PUBLIC_URL through', async () => {
    const same = await request(t.app).post('/api/auth/password-reset').set('Host', 'localhost:3000').set('Origin', 'http://localhost:3000').send({ email: 'x@example.org' });
    expect(same.status).toBe(202);
    const pub = await request(t.app).post('/api/auth/password-reset').set('Origin', 'http://planewright.test').send({ email: 'x@example.org' });
    expect(pub.status).toBe(202);
  });

  it('refuses Origin: null on a POST', async () => {
    const res = await request(t.app).post('/api/auth/logout').set('Origin', 'null');
    expect(res.status).toBe(403);
  });

  it('lets a GET from anywhere read public data', async () => {
    expect((await request(t.app).get('/api/health').set('Origin', 'https://elsewhere.example.net')).status).toBe(200);
  });

  it('answers a form-encoded body with 415', async () => {
    const res = await request(t.app).post('/api/auth/login').type('form').send('email=admin%40example.org&password=x');
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe('unsupported_media_type');
  });

  it('answers a text/plain body with 415', async () => {
    const res = await request(t.app).post('/api/auth/login').set('Content-Type', 'text/plain').send('hello');
    expect(res.status).toBe(415);
  });

  it('answers unknown API routes with JSON 404', async () => {
    for (const [method, path] of [['get', '/api/nothing-here'], ['post', '/api/studios/1/unknown'], ['delete', '/api']] as const) {
      const res = await request(t.app)[method](path);
      expect(res.status, `${method} ${path}`).toBe(404);
      expect(res.headers['content-type']).toMatch(/application\/json/);
      expect(res.body.error.code).toBe('not_found');
    }
  });

  it('sends helmet headers with a content-security policy', async () => {
    const res = await request(t.app).get('/api/health');
    const csp = res.headers['content-security-policy'];
    expect(csp).toContain("default-src 'self'");
    expect(csp).toContain("script-src 'self'");
    expect(csp).toContain("worker-src 'self' blob:");
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('without a built client, answers page routes with a page saying how to build it', async () => {
    const res = await request(t.app).get('/studios/1');
    expect(res.status).toBe(503);
    expect(res.text).toContain('npm run build');
  });
});

describe('sign-in rate limit', () => {
  it('answers 429 after too many failed attempts for one account, while other accounts still sign in', async () => {
    const email = 'participant@example.org';
    for (let i = 0; i < 3; i++) {
      expect((await request(t.app).post('/api/auth/login').send({ email, password: `wrong-${i}` })).status).toBe(401);
    }
    const blocked = await request(t.app).post('/api/auth/login').send({ email, password: DEMO_PASSWORD });
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe('too_many_attempts');
    expect(blocked.body.error.message).toMatch(/Wait 15 minutes/);
    expect((await request(t.app).post('/api/auth/login').send({ email: 'instructor@example.org', password: DEMO_PASSWORD })).status).toBe(200);
  });
});

describe('internal errors', () => {
  it('answer 500 with a plain message and no stack trace, and are logged on the server', async () => {
    const logged: unknown[] = [];
    const broken = await startTestApp({ logError: (e) => logged.push(e) });
    const cookie = await broken.cookieFor('admin@example.org');
    await broken.ds.query('DROP TABLE "memberships"');
    const res = await request(broken.app).get('/api/studios').set('Cookie', cookie);
    await broken.close();
    expect(res.status).toBe(500);
    expect(res.body).toEqual({ error: { code: 'internal', message: expect.stringMatching(/went wrong/) } });
    expect(res.text).not.toMatch(/SQLITE|memberships|\bat\b.*:\d+/);
    expect(logged.length).toBeGreaterThan(0);
  });

  it('answer a failing mail server with 503 and make no invitation', async () => {
    const logged: unknown[] = [];
    const failing = await startTestApp({
      logError: (e) => logged.push(e),
      mail: { send: () => Promise.reject(new Error('connection refused')), close: () => undefined },
    });
    try {
      const cookie = await failing.cookieFor('instructor@example.org');
      const res = await request(failing.app).post('/api/studios/1/invitations').set('Cookie', cookie).send({ email: 'new@example.org', role: 'participant' });
      expect(res.status).toBe(503);
      expect(res.body.error.code).toBe('mail_failed');
      const list = await request(failing.app).get('/api/studios/1/invitations').set('Cookie', cookie);
      expect(list.body).toEqual([]);
    } finally {
      await failing.close();
    }
  });
});

describe('createApp', () => {
  it('builds independent apps from one context', () => {
    expect(() => createApp(t.ctx)).not.toThrow();
  });
});
