/**
 * Pin-ups (critique sessions): instructors create, edit, move through their states and delete
 * them; members who may see the brief list them, each entry filtered by who may see that
 * submission (a critic the assigned ones, a participant their own, or all once the gallery is
 * open). Seeded brief 1 has submissions by Kofi Mensah-Lowe (critic@ assigned) and Priya Nandakumar.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from './helpers.js';
import { pointOn } from './critique-support.js';
import { makeBrief } from './support-workflow.js';

const BRIEF = 1;
let t: TestApp;
let instructor: string;
let participant: string;
let priya: string;
let critic: string;
let technician: string;
let kofiSub: number;
let priyaSub: number;

beforeAll(async () => {
  t = await startTestApp();
  instructor = await t.cookieFor('instructor@example.org');
  participant = await t.cookieFor('participant@example.org');
  priya = await t.cookieFor('priya.nandakumar@example.org');
  critic = await t.cookieFor('critic@example.org');
  technician = await t.cookieFor('technician@example.org');
  const rows = (await t.ds.query(
    `SELECT s.id, u.email FROM submissions s JOIN users u ON u.id = s.participant_id WHERE s.brief_id = ${BRIEF}`,
  )) as { id: number; email: string }[];
  kofiSub = rows.find((r) => r.email === 'participant@example.org')!.id;
  priyaSub = rows.find((r) => r.email === 'priya.nandakumar@example.org')!.id;
});
afterAll(async () => {
  await t.close();
});

const names = (p: { entries: { participant: { name: string } }[] }) => p.entries.map((e) => e.participant.name);

describe('pin-ups', () => {
  it('are created by the instructor, every submission with a revision in name order by default', async () => {
    const res = await request(t.app)
      .post(`/api/briefs/${BRIEF}/pinups`)
      .set('Cookie', instructor)
      .send({ title: 'Midterm crit', startsAt: '2026-03-20T14:00:00Z', room: 'Long bench' });
    expect(res.status, res.text).toBe(201);
    expect(res.body).toMatchObject({
      briefId: BRIEF,
      briefTitle: 'Icosahedral lantern',
      studioId: 1,
      title: 'Midterm crit',
      startsAt: '2026-03-20T14:00:00.000Z',
      durationMinutes: 90,
      room: 'Long bench',
      state: 'scheduled',
      createdBy: { name: 'Tomasz Elberg' },
    });
    expect(res.body.entries.map((e: { position: number; submissionId: number }) => [e.position, e.submissionId])).toEqual([
      [1, kofiSub],
      [2, priyaSub],
    ]);
    expect(res.body.entries[0]).toMatchObject({ participant: { name: 'Kofi Mensah-Lowe' }, latestRevision: { number: 2 }, critics: [{ name: 'Ren\u00e9e Ashcombe' }] });
    expect(res.body.entries[1].critics).toEqual([]);
    for (const who of [participant, critic, technician]) {
      expect((await request(t.app).post(`/api/briefs/${BRIEF}/pinups`).set('Cookie', who).send({ title: 'x', startsAt: '2026-03-20T14:00:00Z' })).status).toBe(403);
    }
  });

  it('refuses drafts, submissions of another brief and bad fields, naming them', async () => {
    const draft = await makeBrief(t, instructor, { title: 'Draft crit', publish: false });
    const d = await request(t.app).post(`/api/briefs/${draft.id}/pinups`).set('Cookie', instructor).send({ title: 'Too early', startsAt: '2026-03-20T14:00:00Z' });
    expect(d.status).toBe(409);
    expect(d.body.error.message).toMatch(/draft/);
    const other = (await t.ds.query(`SELECT id FROM submissions WHERE brief_id = 2 LIMIT 1`)) as { id: number }[];
    const wrong = await request(t.app)
      .post(`/api/briefs/${BRIEF}/pinups`)
      .set('Cookie', instructor)
      .send({ title: 'Mixed', startsAt: '2026-03-20T14:00:00Z', submissionIds: [kofiSub, other[0].id] });
    expect(wrong.status).toBe(422);
    expect(wrong.body.error.fields).toEqual({ 'body.submissionIds.1': `submission ${other[0].id} is not a submission of this brief` });
    const bad = await request(t.app).post(`/api/briefs/${BRIEF}/pinups`).set('Cookie', instructor).send({ title: '', startsAt: 'tomorrow', submissionIds: [kofiSub, kofiSub] });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['body.startsAt', 'body.submissionIds', 'body.title']);
  });

  it('shows each caller only the entries they may see, and every entry once the gallery opens', async () => {
    const made = await request(t.app)
      .post(`/api/briefs/${BRIEF}/pinups`)
      .set('Cookie', instructor)
      .send({ title: 'Filtered crit', startsAt: '2026-03-21T14:00:00Z', submissionIds: [priyaSub, kofiSub] });
    expect(made.status).toBe(201);
    const id = made.body.id;
    const view = async (cookie: string) => {
      const res = await request(t.app).get(`/api/pinups/${id}`).set('Cookie', cookie);
      expect(res.status, res.text).toBe(200);
      return res.body;
    };
    expect(names(await view(instructor))).toEqual(['Priya Nandakumar', 'Kofi Mensah-Lowe']);
    expect(names(await view(critic))).toEqual(['Kofi Mensah-Lowe']);
    expect(names(await view(participant))).toEqual(['Kofi Mensah-Lowe']);
    expect(names(await view(priya))).toEqual(['Priya Nandakumar']);
    expect((await request(t.app).get(`/api/pinups/${id}`).set('Cookie', technician)).status).toBe(403);
    const listed = await request(t.app).get(`/api/briefs/${BRIEF}/pinups`).set('Cookie', critic);
    expect(listed.status).toBe(200);
    expect(listed.body.find((p: { id: number }) => p.id === id).entries).toHaveLength(1);

    await request(t.app).patch(`/api/briefs/${BRIEF}`).set('Cookie', instructor).send({ galleryOpen: true }).expect(200);
    try {
      expect(names(await view(participant))).toEqual(['Priya Nandakumar', 'Kofi Mensah-Lowe']);
      // A critic still sees only the assigned submissions.
      expect(names(await view(critic))).toEqual(['Kofi Mensah-Lowe']);
    } finally {
      await request(t.app).patch(`/api/briefs/${BRIEF}`).set('Cookie', instructor).send({ galleryOpen: false }).expect(200);
    }
  });

  it('counts the open and resolved pins on each entry\u2019s latest revision', async () => {
    const latest = (await t.ds.query(`SELECT id FROM revisions WHERE submission_id = ${kofiSub} ORDER BY number DESC LIMIT 1`)) as { id: number }[];
    const before = await request(t.app).get(`/api/revisions/${latest[0].id}/pins`).set('Cookie', instructor);
    const open = before.body.pins.filter((p: { state: string }) => p.state === 'open').length;
    const resolved = before.body.pins.filter((p: { state: string }) => p.state === 'resolved').length;
    const made = await request(t.app).post(`/api/briefs/${BRIEF}/pinups`).set('Cookie', instructor).send({ title: 'Counted crit', startsAt: '2026-03-22T14:00:00Z', submissionIds: [kofiSub] });
    expect(made.body.entries[0]).toMatchObject({ openPins: open, resolvedPins: resolved });
    const pin = await request(t.app)
      .post(`/api/revisions/${latest[0].id}/pins`)
      .set('Cookie', critic)
      .send({ anchor: pointOn(t, latest[0].id), category: 'form', camera: { position: [1, 2, 3], target: [0, 0, 0] }, body: 'Counted.' });
    expect(pin.status, pin.text).toBe(201);
    await request(t.app).patch(`/api/pins/${pin.body.id}`).set('Cookie', participant).send({ state: 'resolved' }).expect(200);
    const after = await request(t.app).get(`/api/pinups/${made.body.id}`).set('Cookie', instructor);
    expect(after.body.entries[0]).toMatchObject({ openPins: open, resolvedPins: resolved + 1 });
  });

  it('moves scheduled → running → finished and back to scheduled; other moves are 409', async () => {
    const made = await request(t.app).post(`/api/briefs/${BRIEF}/pinups`).set('Cookie', instructor).send({ title: 'Moving crit', startsAt: '2026-03-23T14:00:00Z' });
    const path = `/api/pinups/${made.body.id}`;
    const to = (state: string) => request(t.app).patch(path).set('Cookie', instructor).send({ state });
    const skip = await to('finished');
    expect(skip.status).toBe(409);
    expect(skip.body.error.message).toBe('A scheduled pin-up cannot become finished; it can become running.');
    expect((await to('running')).body.state).toBe('running');
    expect((await to('finished')).body.state).toBe('finished');
    expect((await to('running')).status).toBe(409);
    expect((await to('scheduled')).body.state).toBe('scheduled');
    expect((await request(t.app).patch(path).set('Cookie', critic).send({ state: 'running' })).status).toBe(403);
  });

  it('edits fields and the running order, lists by start time, and deletes', async () => {
    const a = await request(t.app).post(`/api/briefs/${BRIEF}/pinups`).set('Cookie', instructor).send({ title: 'Late crit', startsAt: '2026-04-30T14:00:00Z' });
    const b = await request(t.app).post(`/api/briefs/${BRIEF}/pinups`).set('Cookie', instructor).send({ title: 'Early crit', startsAt: '2026-03-01T09:00:00Z' });
    const edited = await request(t.app)
      .patch(`/api/pinups/${a.body.id}`)
      .set('Cookie', instructor)
      .send({ title: 'Final crit', room: 'Hall B', durationMinutes: 120, startsAt: '2026-05-01T10:00:00+02:00', submissionIds: [priyaSub] });
    expect(edited.status, edited.text).toBe(200);
    expect(edited.body).toMatchObject({ title: 'Final crit', room: 'Hall B', durationMinutes: 120, startsAt: '2026-05-01T08:00:00.000Z' });
    expect(edited.body.entries.map((e: { submissionId: number }) => e.submissionId)).toEqual([priyaSub]);
    const wrong = await request(t.app).patch(`/api/pinups/${a.body.id}`).set('Cookie', instructor).send({ submissionIds: [999999] });
    expect(wrong.status).toBe(422);
    expect(wrong.body.error.fields['body.submissionIds.0']).toMatch(/not a submission of this brief/);

    const list = await request(t.app).get(`/api/briefs/${BRIEF}/pinups`).set('Cookie', participant);
    const titles = list.body.map((p: { title: string }) => p.title);
    expect(titles[0]).toBe('Early crit');
    expect(titles[titles.length - 1]).toBe('Final crit');

    expect((await request(t.app).delete(`/api/pinups/${b.body.id}`).set('Cookie', participant)).status).toBe(403);
    expect((await request(t.app).delete(`/api/pinups/${b.body.id}`).set('Cookie', instructor)).status).toBe(204);
    expect((await request(t.app).get(`/api/pinups/${b.body.id}`).set('Cookie', instructor)).status).toBe(404);
    expect((await request(t.app).delete(`/api/pinups/${b.body.id}`).set('Cookie', instructor)).status).toBe(404);
  });
});
