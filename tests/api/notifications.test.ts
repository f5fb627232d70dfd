/**
 * Notifications: per-person settings, the "revision received" e-mail with the audit summary
 * (once per revision, re-audits included), and the 48-hour deadline reminder sent once per
 * participant and brief, across a simulated restart.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { reminderJob } from '../../server/notifications/reminders.js';
import { DEMO_STUDIO_ID, startTestApp, type TestApp } from './helpers.js';
import { cubePlates, makeBrief } from './support-workflow.js';

const HOUR = 3_600_000;
let t: TestApp;
let instructor: string;
let participant: string;

beforeAll(async () => {
  t = await startTestApp();
  instructor = await t.cookieFor('instructor@example.org');
  participant = await t.cookieFor('participant@example.org');
});
afterAll(async () => {
  await t.close();
});

describe('settings', () => {
  it('has every kind on by default, and turns kinds off one by one', async () => {
    const cookie = await t.cookieFor('lars.brennholt@example.org');
    const res = await request(t.app).get('/api/me/notifications').set('Cookie', cookie);
    expect(res.body.settings.map((s: { kind: string; enabled: boolean }) => [s.kind, s.enabled])).toEqual([
      ['revision-received', true],
      ['brief-published', true],
      ['deadline-reminder', true],
      ['pin-created', true],
      ['pin-reply', true],
      ['feedback-released', true],
    ]);
    const off = await request(t.app).put('/api/me/notifications').set('Cookie', cookie).send({ 'brief-published': false });
    expect(off.body.settings.find((s: { kind: string }) => s.kind === 'brief-published').enabled).toBe(false);
    expect(off.body.settings.find((s: { kind: string }) => s.kind === 'deadline-reminder').enabled).toBe(true);
    const bad = await request(t.app).put('/api/me/notifications').set('Cookie', cookie).send({ 'brief-published': 'no' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields['body.brief-published']).toBeTypeOf('string');

    const before = (await t.outbox()).length;
    await makeBrief(t, instructor, { title: 'Quiet brief' });
    const to = (await t.outbox()).slice(before).map((m) => m.to);
    expect(to).toContain('participant@example.org');
    expect(to).not.toContain('lars.brennholt@example.org');
  });
});

describe('revision received', () => {
  it('is sent when the audit finishes, with its summary, and not again on a re-audit', async () => {
    const b = await makeBrief(t, instructor, { title: 'Mail lamp' });
    const before = (await t.outbox()).length;
    const res = await request(t.app).post(`/api/briefs/${b.id}/revisions`).set('Cookie', participant).send({ design: cubePlates() });
    await t.ctx.audits.idle();
    const mails = (await t.outbox()).slice(before);
    expect(mails).toHaveLength(1);
    expect(mails[0]).toMatchObject({ to: 'participant@example.org', subject: 'Revision 1 received: Mail lamp (passes)' });
    expect(mails[0].text).toContain('The audit found 0 errors and 0 warnings: 6 pieces, 12 joints, 1 connected group, 1 sheet.');
    expect(mails[0].text).toContain(`http://planewright.test/revisions/${res.body.id}`);
    expect(mails[0].text).toContain('To turn these e-mails off, open http://planewright.test/settings/notifications.');
    await request(t.app).post(`/api/briefs/${b.id}/reaudit`).set('Cookie', instructor).expect(200);
    await t.ctx.audits.idle();
    expect((await t.outbox()).length).toBe(before + 1);
  });

  it('is not sent to someone who turned it off', async () => {
    const cookie = await t.cookieFor('mei.tanaka-rowe@example.org');
    await request(t.app).put('/api/me/notifications').set('Cookie', cookie).send({ 'revision-received': false }).expect(200);
    const b = await makeBrief(t, instructor, { title: 'Silent lamp' });
    const before = (await t.outbox()).length;
    await request(t.app).post(`/api/briefs/${b.id}/revisions`).set('Cookie', cookie).send({ design: cubePlates() }).expect(201);
    await t.ctx.audits.idle();
    expect((await t.outbox()).slice(before)).toEqual([]);
  });
});

describe('deadline reminder', () => {
  it('goes to each participant once, 48 hours before, and never again after a restart', async () => {
    const deadline = new Date(t.clock.now().getTime() + 60 * HOUR).toISOString();
    const b = await makeBrief(t, instructor, { title: 'Reminder lamp', deadline });
    const job = reminderJob(t.ctx);
    const reminders = async () => (await t.outbox()).filter((m) => m.subject === 'Deadline in 48 hours: Reminder lamp');
    // The seeded briefs are due in 12 and 26 days; only this one can come due.
    expect(await job.tick()).toBe(0);
    t.clock.advance(11 * HOUR); // 49 hours left
    expect(await job.tick()).toBe(0);
    t.clock.advance(2 * HOUR); // 47 hours left
    expect(await job.tick()).toBe(4); // the demo studio's four participants
    expect((await reminders()).map((m) => m.to).sort()).toEqual(
      ['lars.brennholt@example.org', 'mei.tanaka-rowe@example.org', 'participant@example.org', 'priya.nandakumar@example.org'].sort(),
    );
    expect((await reminders())[0].text).toContain(`/briefs/${b.id}`);
    expect(await job.tick()).toBe(0);

    // A restart: a second app on the same database file, with a fresh job and the same clock.
    const again = await startTestApp({ databasePath: t.databasePath });
    again.clock.t = t.clock.t;
    try {
      expect(await reminderJob(again.ctx).tick()).toBe(0);
      // A newcomer who joins before the deadline gets theirs, once.
      await again.addUser('late.joiner@example.org', 'Late Joiner', { studioId: DEMO_STUDIO_ID, role: 'participant' });
      expect(await reminderJob(again.ctx).tick()).toBe(1);
      expect(await reminderJob(again.ctx).tick()).toBe(0);
    } finally {
      await again.close();
    }
    expect(await reminders()).toHaveLength(5);
    t.clock.advance(48 * HOUR); // past the deadline: nothing more
    expect(await job.tick()).toBe(0);
  });

  it('two ticks at the same moment send each reminder once', async () => {
    const deadline = new Date(t.clock.now().getTime() + 10 * HOUR).toISOString();
    await makeBrief(t, instructor, { title: 'Race lamp', deadline });
    const a = reminderJob(t.ctx);
    const b = reminderJob(t.ctx);
    const [x, y] = await Promise.all([a.tick(), b.tick()]);
    expect(x + y).toBe(5); // four demo participants and the late joiner
    expect((await t.outbox()).filter((m) => m.subject === 'Deadline in 48 hours: Race lamp')).toHaveLength(5);
  });
});
