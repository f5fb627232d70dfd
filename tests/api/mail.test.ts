import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MailMessage } from '../../server/db/entities/index.js';
import { createMailService, simpleHtml } from '../../server/mail/mail-service.js';
import { SINK_SIZE_LIMIT } from '../../server/mail/sink.js';
import { startTestApp, type TestApp } from './helpers.js';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp({ seed: false });
});
afterAll(async () => {
  await t.close();
});

describe('mail sink', () => {
  it('stores what nodemailer sends over SMTP: addresses, subject, text, html and raw size', async () => {
    await t.ctx.mail.send({ to: 'Rosa Quint <rosa@example.org>', subject: 'Cut pack ready — Ünïcode ok', text: 'Plain words.', html: simpleHtml(['<b>escaped</b> & safe']) });
    const [m] = await t.ds.getRepository(MailMessage).find({ order: { id: 'DESC' }, take: 1 });
    expect(m).toMatchObject({ to: '"Rosa Quint" <rosa@example.org>', subject: 'Cut pack ready — Ünïcode ok' });
    expect(m.text.trim()).toBe('Plain words.');
    expect(m.from).toBe('"Planewright" <planewright@example.org>');
    expect(m.html).toContain('&lt;b&gt;escaped&lt;/b&gt; &amp; safe');
    expect(m.html).not.toMatch(/<img|https?:\/\/(?!planewright)/);
    expect(m.rawSize).toBeGreaterThan(100);
    expect(m.receivedAt.toISOString()).toBe(t.clock.now().toISOString());
  });

  it('refuses a message over the size limit and stores nothing', async () => {
    const before = await t.ds.getRepository(MailMessage).count();
    const big = 'x'.repeat(SINK_SIZE_LIMIT + 1024);
    await expect(t.ctx.mail.send({ to: 'big@example.org', subject: 'too big', text: big })).rejects.toThrow();
    expect(await t.ds.getRepository(MailMessage).count()).toBe(before);
  });

  it('fails a send to a server that is not there (the caller decides what to tell the user)', async () => {
    const nowhere = createMailService('smtp://127.0.0.1:9', 'p@example.org', { local: true });
    await expect(nowhere.send({ to: 'a@example.org', subject: 's', text: 't' })).rejects.toThrow();
    nowhere.close();
  });
});
