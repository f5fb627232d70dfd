import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, PUBLIC_URL, linkIn, startTestApp, type TestApp } from './helpers.js';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(async () => {
  await t.close();
});

async function requestLink(email: string): Promise<string> {
  const before = (await t.outbox()).length;
  const res = await request(t.app).post('/api/auth/password-reset').send({ email });
  expect(res.status).toBe(202);
  const mail = (await t.outbox()).slice(before);
  expect(mail).toHaveLength(1);
  expect(mail[0].to).toContain(email);
  return new URL(linkIn(mail[0].text, `${PUBLIC_URL}/reset-password?token=`)).searchParams.get('token')!;
}

describe('password reset', () => {
  it('mails a link through SMTP, sets the new password once, and ends the old sessions', async () => {
    const oldSession = await t.signIn('critic@example.org');
    const token = await requestLink('critic@example.org');
    const [message] = (await t.outbox()).slice(-1);
    expect(message.subject).toBe('Reset your Planewright password');
    expect(message.from).toContain('planewright@example.org');
    expect(message.text).toContain('Renée Ashcombe');
    expect(message.html).toContain('<a href="http://planewright.test/reset-password?token=');
    expect(message.rawSize).toBeGreaterThan(200);

    const confirm = await request(t.app).post('/api/auth/password-reset/confirm').send({ token, password: 'a-new-long-password' });
    expect(confirm.status).toBe(204);

    expect((await request(t.app).get('/api/auth/me').set('Cookie', oldSession)).status).toBe(401);
    expect((await request(t.app).post('/api/auth/login').send({ email: 'critic@example.org', password: DEMO_PASSWORD })).status).toBe(401);
    expect((await request(t.app).post('/api/auth/login').send({ email: 'critic@example.org', password: 'a-new-long-password' })).status).toBe(200);

    const again = await request(t.app).post('/api/auth/password-reset/confirm').send({ token, password: 'yet-another-password' });
    expect(again.status).toBe(410);
    expect(again.body.error.code).toBe('reset_used');
  });

  it('answers 202 for an unknown address and sends nothing', async () => {
    const before = (await t.outbox()).length;
    const res = await request(t.app).post('/api/auth/password-reset').send({ email: 'nobody-here@example.org' });
    expect(res.status).toBe(202);
    expect((await t.outbox()).length).toBe(before);
  });

  it('refuses a link older than an hour', async () => {
    const token = await requestLink('participant@example.org');
    t.clock.advance(60 * 60 * 1000 + 1000);
    const res = await request(t.app).post('/api/auth/password-reset/confirm').send({ token, password: 'a-new-long-password' });
    expect(res.status).toBe(410);
    expect(res.body.error.code).toBe('reset_expired');
    expect(res.body.error.message).toMatch(/expired/);
  });

  it('still accepts a link just inside the hour', async () => {
    const token = await requestLink('technician@example.org');
    t.clock.advance(59 * 60 * 1000);
    const res = await request(t.app).post('/api/auth/password-reset/confirm').send({ token, password: 'technician-new-pass' });
    expect(res.status).toBe(204);
  });

  it('refuses an unknown token and names a too-short password', async () => {
    const unknown = await request(t.app).post('/api/auth/password-reset/confirm').send({ token: 'x'.repeat(43), password: 'a-new-long-password' });
    expect(unknown.status).toBe(410);
    expect(unknown.body.error.code).toBe('reset_invalid');
    const short = await request(t.app).post('/api/auth/password-reset/confirm').send({ token: 'x'.repeat(43), password: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.error.fields).toEqual({ 'body.password': 'Use at least 10 characters' });
  });
});
