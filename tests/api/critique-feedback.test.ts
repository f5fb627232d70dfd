/**
 * Rubric feedback: scores checked against the brief's rubric (criterion ids and level scores),
 * the weighted figure, who sees which sheets, the final mark and its release (the participant
 * sees nothing before it; one e-mail, not repeated, not sent when turned off), the critique
 * state in the submissions table and the rubric columns of the CSV export.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { weightedScore } from '../../server/critique/feedback-service.js';
import { DEMO_STUDIO_ID, startTestApp, type TestApp } from './helpers.js';
import { critiqueFixture, pinBody } from './critique-support.js';

/** Weights 3 and 1; levels 1–3 and 0/5/10 (hand-worked figures below). */
const RUBRIC = [
  { id: 'joints', criterion: 'Joints', weight: 3, levels: [{ score: 1, label: 'Loose' }, { score: 2, label: 'Holds' }, { score: 3, label: 'Sound' }] },
  { id: 'light', criterion: 'Light', weight: 1, levels: [{ score: 0, label: 'None' }, { score: 5, label: 'Some' }, { score: 10, label: 'Striking' }] },
];

let t: TestApp;
let instructor: string;
let participant: string;
let critic: string;
let guest: string;
let otherParticipant: string;

beforeAll(async () => {
  t = await startTestApp();
  instructor = await t.cookieFor('instructor@example.org');
  participant = await t.cookieFor('participant@example.org');
  critic = await t.cookieFor('critic@example.org');
  await t.addUser('guest.scorer@example.org', 'Hollis Quarrie', { studioId: DEMO_STUDIO_ID, role: 'critic' });
  guest = await t.cookieFor('guest.scorer@example.org');
  otherParticipant = await t.cookieFor('priya.nandakumar@example.org');
});
afterAll(async () => {
  await t.close();
});

const put = (cookie: string, path: string, body: object) => request(t.app).put(path).set('Cookie', cookie).send(body);
const get = (cookie: string, path: string) => request(t.app).get(path).set('Cookie', cookie);

describe('weighted score', () => {
  it('weighs each criterion by its share of the top level, over the criteria scored', () => {
    const rubric = RUBRIC.map((c) => ({ ...c, levels: c.levels.map((l) => ({ ...l, descriptor: '' })) }));
    // (3·2/3 + 1·10/10) / (3 + 1) × 100 = 75
    expect(weightedScore(rubric, [{ criterion: 'joints', score: 2 }, { criterion: 'light', score: 10 }])).toBe(75);
    // Only joints scored: 3·1/3 / 3 × 100 = 33.33
    expect(weightedScore(rubric, [{ criterion: 'joints', score: 1 }])).toBe(33.33);
    expect(weightedScore(rubric, [])).toBeNull();
    // A criterion whose levels all score 0 cannot be weighed and is left out; so is one not in the rubric.
    const flat = [...rubric, { id: 'notes', criterion: 'Notes', weight: 5, levels: [{ score: 0, label: 'Seen', descriptor: '' }] }];
    expect(weightedScore(flat, [{ criterion: 'joints', score: 3 }, { criterion: 'notes', score: 0 }, { criterion: 'gone', score: 2 }])).toBe(100);
  });
});

describe('scores', () => {
  it('checks criteria and levels against the rubric, naming the field, and replaces the caller\u2019s own sheet', async () => {
    const f = await critiqueFixture(t, { instructor, participant }, { title: 'Scored plates', rubric: RUBRIC });
    const path = `/api/submissions/${f.submissionId}/scores`;
    const unknown = await put(critic, path, { scores: [{ criterion: 'colour', score: 1 }] });
    expect(unknown.status).toBe(422);
    expect(unknown.body.error.fields['body.scores.0.criterion']).toBe('the rubric has no criterion colour (it has joints, light)');
    const level = await put(critic, path, { scores: [{ criterion: 'joints', score: 2 }, { criterion: 'light', score: 7 }] });
    expect(level.status).toBe(422);
    expect(level.body.error.fields['body.scores.1.score']).toBe('must be one of the levels of Light: 0, 5, 10');
    const twice = await put(critic, path, { scores: [{ criterion: 'joints', score: 2 }, { criterion: 'joints', score: 3 }] });
    expect(twice.status).toBe(422);
    expect(twice.body.error.fields['body.scores.1.criterion']).toBe('joints is scored twice');
    expect((await put(critic, path, { scores: [{ criterion: 'joints', score: 'two' }] })).status).toBe(400);

    const ok = await put(critic, path, { scores: [{ criterion: 'joints', score: 2, comment: 'Short tenons on the lower ring.' }, { criterion: 'light', score: 10 }] });
    expect(ok.status, ok.text).toBe(200);
    expect(ok.body.sheets).toHaveLength(1);
    expect(ok.body.sheets[0]).toMatchObject({ scorer: { name: 'Ren\u00e9e Ashcombe', role: 'critic' }, weighted: 75 });
    expect(ok.body.sheets[0].scores[0]).toEqual({ criterion: 'joints', score: 2, comment: 'Short tenons on the lower ring.' });
    expect(ok.body).toMatchObject({ canScore: true, canMark: false, finalMark: null, released: false });
    const replaced = await put(critic, path, { scores: [{ criterion: 'joints', score: 3 }] });
    expect(replaced.body.sheets[0].scores).toEqual([{ criterion: 'joints', score: 3, comment: '' }]);
    expect(replaced.body.sheets[0].weighted).toBe(100);

    for (const who of [guest, participant, otherParticipant]) expect((await put(who, path, { scores: [{ criterion: 'joints', score: 1 }] })).status).toBe(403);
  });
});

describe('final mark and release', () => {
  it('shows each role its part, releases once with one e-mail, and then shows the participant everything', async () => {
    const f = await critiqueFixture(t, { instructor, participant }, { title: 'Released plates', rubric: RUBRIC });
    const critics = (await t.ds.query(`SELECT id FROM users WHERE email IN ('critic@example.org', 'guest.scorer@example.org') ORDER BY id`)) as { id: number }[];
    await put(instructor, `/api/submissions/${f.submissionId}/critics`, { userIds: critics.map((c) => c.id) }).expect(200);
    await put(critic, `/api/submissions/${f.submissionId}/scores`, { scores: [{ criterion: 'joints', score: 2 }, { criterion: 'light', score: 5 }] }).expect(200);
    await put(guest, `/api/submissions/${f.submissionId}/scores`, { scores: [{ criterion: 'light', score: 10 }] }).expect(200);
    await put(instructor, `/api/submissions/${f.submissionId}/scores`, { scores: [{ criterion: 'joints', score: 3 }] }).expect(200);
    const path = `/api/submissions/${f.submissionId}/feedback`;

    const early = await request(t.app).post(`${path}/release`).set('Cookie', instructor);
    expect(early.status).toBe(409);
    expect(early.body.error.message).toBe('Set a final mark before releasing the feedback.');
    const marked = await put(instructor, path, { finalMark: 81.5, summary: 'A sound lantern; the light could go further.' });
    expect(marked.status, marked.text).toBe(200);
    expect(marked.body).toMatchObject({ finalMark: 81.5, summary: 'A sound lantern; the light could go further.', released: false, canMark: true, canScore: true });
    expect(marked.body.sheets.map((s: { scorer: { name: string } }) => s.scorer.name)).toEqual(['Hollis Quarrie', 'Ren\u00e9e Ashcombe', 'Tomasz Elberg']);
    expect((await put(critic, path, { finalMark: 90 })).status).toBe(403);
    expect((await put(instructor, path, { finalMark: 101 })).body.error.fields['body.finalMark']).toBe('must be 100 or less');

    const byCritic = (await get(critic, path)).body;
    expect(byCritic.sheets.map((s: { scorer: { name: string } }) => s.scorer.name)).toEqual(['Ren\u00e9e Ashcombe']);
    expect(byCritic).toMatchObject({ finalMark: null, summary: '', canScore: true, canMark: false });
    const before = (await get(participant, path)).body;
    expect(before).toMatchObject({ submissionId: f.submissionId, sheets: [], finalMark: null, summary: '', released: false, releasedAt: null, canScore: false, canMark: false });
    expect((await get(otherParticipant, path)).status).toBe(403);

    const sent = (await t.outbox()).length;
    const released = await request(t.app).post(`${path}/release`).set('Cookie', instructor);
    expect(released.status, released.text).toBe(200);
    expect(released.body.released).toBe(true);
    expect(released.body.releasedAt).toBe(t.clock.now().toISOString());
    const mails = (await t.outbox()).slice(sent);
    expect(mails).toHaveLength(1);
    expect(mails[0]).toMatchObject({ to: 'participant@example.org', subject: 'Feedback released: Released plates' });
    expect(mails[0].text).toContain('Your final mark is 81.5 out of 100.');
    expect(mails[0].text).toContain(`http://planewright.test/revisions/${f.revisionId}`);
    expect(mails[0].text).toContain('To turn these e-mails off, open http://planewright.test/settings/notifications.');

    const after = (await get(participant, path)).body;
    expect(after).toMatchObject({ finalMark: 81.5, summary: 'A sound lantern; the light could go further.', released: true, canScore: false, canMark: false });
    expect(after.sheets.map((s: { scorer: { name: string; role: string } }) => [s.scorer.name, s.scorer.role])).toEqual([
      ['Hollis Quarrie', 'critic'],
      ['Ren\u00e9e Ashcombe', 'critic'],
      ['Tomasz Elberg', 'instructor'],
    ]);
    // Once released the critic sees the mark too, still only their own sheet.
    expect((await get(critic, path)).body).toMatchObject({ finalMark: 81.5, sheets: [{ scorer: { name: 'Ren\u00e9e Ashcombe' } }] });

    t.clock.advance(60_000);
    const again = await request(t.app).post(`${path}/release`).set('Cookie', instructor);
    expect(again.status).toBe(200);
    expect(again.body.releasedAt).toBe(released.body.releasedAt);
    expect((await t.outbox()).length).toBe(sent + 1);
    const cleared = await put(instructor, path, { finalMark: null });
    expect(cleared.status).toBe(409);

    // The submissions table and the CSV export.
    const rows = (await get(instructor, `/api/briefs/${f.briefId}/submissions`)).body;
    expect(rows[0].critiqueState).toBe('released');
    const csv = (await request(t.app).get(`/api/briefs/${f.briefId}/export`).set('Cookie', instructor).buffer(true)).text.slice(1).split('\r\n');
    expect(csv[0]).toBe(
      'Participant,E-mail,Revisions,Latest revision,Submitted at,Late,Audit state,Errors,Warnings,Pieces,Connected groups,Sheets,Critique state,Joints (weight 3),Light (weight 1),Final mark,Feedback released',
    );
    // Joints: the instructor's own 3 (not the critic's 2); light: the critics' mean (5 + 10) / 2.
    expect(csv[1].split(',').slice(-5)).toEqual(['released', '3', '7.5', '81.5', 'yes']);
  });

  it('moves the critique state from not started to in progress with a pin or a score sheet', async () => {
    const f = await critiqueFixture(t, { instructor, participant }, { title: 'State plates', rubric: RUBRIC });
    const state = async () => (await get(instructor, `/api/briefs/${f.briefId}/submissions`)).body[0].critiqueState;
    expect(await state()).toBe('not-started');
    const csv = (await request(t.app).get(`/api/briefs/${f.briefId}/export`).set('Cookie', instructor).buffer(true)).text.slice(1).split('\r\n');
    expect(csv[1].split(',').slice(-5)).toEqual(['not-started', '', '', '', 'no']);
    await put(critic, `/api/submissions/${f.submissionId}/scores`, { scores: [{ criterion: 'light', score: 5 }] }).expect(200);
    expect(await state()).toBe('in-progress');
    await put(critic, `/api/submissions/${f.submissionId}/scores`, { scores: [] }).expect(200);
    expect(await state()).toBe('not-started');
    await request(t.app).post(`/api/revisions/${f.revisionId}/pins`).set('Cookie', critic).send(pinBody()).expect(201);
    expect(await state()).toBe('in-progress');
  });

  it('sends no release e-mail to a participant who turned it off', async () => {
    const f = await critiqueFixture(t, { instructor, participant }, { title: 'Quiet release', rubric: RUBRIC });
    await put(participant, '/api/me/notifications', { 'feedback-released': false }).expect(200);
    try {
      await put(instructor, `/api/submissions/${f.submissionId}/feedback`, { finalMark: 60 }).expect(200);
      const sent = (await t.outbox()).length;
      await request(t.app).post(`/api/submissions/${f.submissionId}/feedback/release`).set('Cookie', instructor).expect(200);
      expect((await t.outbox()).length).toBe(sent);
      expect((await get(participant, `/api/submissions/${f.submissionId}/feedback`)).body).toMatchObject({ released: true, finalMark: 60 });
    } finally {
      await put(participant, '/api/me/notifications', { 'feedback-released': true }).expect(200);
    }
  });
});
