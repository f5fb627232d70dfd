import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from './helpers.js';

let t: TestApp;
beforeAll(async () => {
  // A stand-in for `dist/client` with the shape Vite writes.
  const probe = await startTestApp({ seed: false });
  // Under a dot-directory on purpose: an install in e.g. ~/.local must still serve index.html.
  const clientDir = join(probe.dir, '.build', 'client');
  await probe.close();
  mkdirSync(join(clientDir, 'assets'), { recursive: true });
  writeFileSync(join(clientDir, 'index.html'), '<!doctype html><title>Planewright</title><div id="root"></div>');
  writeFileSync(join(clientDir, 'assets', 'index-3f9a1c.js'), 'console.log(1)');
  writeFileSync(join(clientDir, 'favicon.svg'), '<svg xmlns="http://www.w3.org/2000/svg"/>');
  t = await startTestApp({ seed: false, clientDir });
});
afterAll(async () => {
  await t.close();
});

describe('serving the built client', () => {
  it('serves hashed assets with a long, immutable cache', async () => {
    const res = await request(t.app).get('/assets/index-3f9a1c.js');
    expect(res.status).toBe(200);
    expect(res.headers['cache-control']).toMatch(/max-age=31536000.*immutable/);
  });

  it('answers client routes with index.html, revalidated each time', async () => {
    for (const path of ['/', '/studios/1', '/invitations/abc', '/reset-password?token=x']) {
      const res = await request(t.app).get(path);
      expect(res.status, path).toBe(200);
      expect(res.text).toContain('<div id="root">');
      expect(res.headers['cache-control']).toBe('no-cache');
    }
  });

  it('serves other files from the build folder', async () => {
    const res = await request(t.app).get('/favicon.svg');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/svg/);
  });

  it('keeps JSON 404 for unknown API routes and 404 for a missing asset', async () => {
    const api = await request(t.app).get('/api/not-a-route');
    expect(api.status).toBe(404);
    expect(api.body.error.code).toBe('not_found');
    // A missing hashed asset must not turn into index.html (the browser would parse HTML as JS).
    expect((await request(t.app).get('/assets/gone-123.js')).status).toBe(404);
  });
});
