/**
 * Pins on a revision's model: who may place, list, reply and resolve; anchors checked against
 * the revision's pieces; only the latest revision takes pins; markdown stored verbatim; pins
 * carried to the next revision or left behind as outdated; the e-mails each sent once to the
 * right people and not to someone who turned the kind off.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_STUDIO_ID, startTestApp, type TestApp } from './helpers.js';
import { CAMERA, critiqueFixture, pinBody, upload } from './critique-support.js';
import { cubePlates } from './support-workflow.js';

let t: TestApp;
let instructor: string;
let participant: string;
let critic: string;
let otherCritic: string;
let otherParticipant: string;
let admin: string;

beforeAll(async () => {
  t = await startTestApp();
  instructor = await t.cookieFor('instructor@example.org');
  participant = await t.cookieFor('participant@example.org');
  critic = await t.cookieFor('critic@example.org');
  admin = await t.cookieFor('admin@example.org');
  await t.addUser('guest.critic@example.org', 'Ottilie Farrow', { studioId: DEMO_STUDIO_ID, role: 'critic' });
  otherCritic = await t.cookieFor('guest.critic@example.org');
  otherParticipant = await t.cookieFor('priya.nandakumar@example.org');
});
afterAll(async () => {
  await t.close();
});

const post = (cookie: string, path: string, body: object) => request(t.app).post(path).set('Cookie', cookie).send(body);
const get = (cookie: string, path: string) => request(t.app).get(path).set('Cookie', cookie);
const patch = (cookie: string, path: string, body: object) => request(t.app).patch(path).set('Cookie', cookie).send(body);

describe('placing and listing pins', () => {
  it('lets the instructor, an admin and the assigned critic pin, numbering per submission; nobody else', async () => {
    const f = await critiqueFixture(t, { instructor, participant }, { title: 'Who pins' });
    const path = `/api/revisions/${f.revisionId}/pins`;
    const a = await post(critic, path, pinBody());
    expect(a.status, a.text).toBe(201);
    expect(a.body).toMatchObject({
      number: 1,
      submissionId: f.submissionId,
      revisionId: f.revisionId,
      placedOnRevision: { id: f.revisionId, number: 1 },
      anchor: { piece: 'plate-01', point: [0, 0], side: 1 },
      scope: 'piece',
      category: 'structure',
      state: 'open',
      camera: CAMERA,
      author: { name: 'Ren\u00e9e Ashcombe' },
      resolvedBy: null,
      outdated: false,
    });
    expect(a.body.comments).toHaveLength(1);
    expect(a.body.comments[0]).toMatchObject({ author: { name: 'Ren\u00e9e Ashcombe', role: 'critic' }, body: 'The corner joint here looks short.' });
    const b = await post(instructor, path, pinBody({ scope: 'orbit', category: 'form', anchor: { piece: 'plate-03', point: [10, -20], side: -1 } }));
    expect(b.status, b.text).toBe(201);
    expect(b.body).toMatchObject({ number: 2, scope: 'orbit', anchor: { piece: 'plate-03', side: -1 } });
    expect(b.body.comments[0].author.role).toBe('instructor');
    const c = await post(admin, path, pinBody());
    expect(c.status).toBe(201);
    expect(c.body.number).toBe(3);
    expect(c.body.comments[0].author.role).toBe('admin');

    for (const who of [participant, otherCritic, otherParticipant]) {
      const res = await post(who, path, pinBody());
      expect(res.status, res.text).toBe(403);
    }
    const list = await get(participant, path);
    expect(list.status).toBe(200);
    expect(list.body.pins.map((p: { number: number }) => p.number)).toEqual([1, 2, 3]);
    expect(list.body.canPin).toBe(false);
    expect(list.body.outdatedEarlier).toEqual([]);
    expect((await get(critic, path)).body.canPin).toBe(true);
    expect((await get(instructor, path)).body.canPin).toBe(true);
    expect((await get(otherCritic, path)).status).toBe(403);
    expect((await get(otherParticipant, path)).status).toBe(403);
  });

  it('checks the anchor against the revision\u2019s pieces, naming the field', async () => {
    const f = await critiqueFixture(t, { instructor, participant }, { title: 'Anchors' });
    const path = `/api/revisions/${f.revisionId}/pins`;
    const unknown = await post(critic, path, pinBody({ anchor: { piece: 'rib-03', point: [0, 0], side: 1 } }));
    expect(unknown.status).toBe(422);
    expect(unknown.body.error.fields['body.anchor.piece']).toMatch(/no piece rib-03/);
    const off = await post(critic, path, pinBody({ anchor: { piece: 'plate-02', point: [80, 0], side: 1 } }));
    expect(off.status).toBe(422);
    expect(off.body.error.fields['body.anchor.point']).toMatch(/not on piece plate-02/);
    // Within the 0.5 mm tolerance of the edge still counts as on the piece.
    const edge = await post(critic, path, pinBody({ anchor: { piece: 'plate-02', point: [50.3, 0], side: 1 } }));
    expect(edge.status, edge.text).toBe(201);
    const bad = await post(critic, path, pinBody({ category: 'colour', body: '  ' }));
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['body.body', 'body.category']);
    expect((await get(critic, path)).body.pins).toHaveLength(1);
  });

  it('takes pins only on the latest revision (409 naming the newer one)', async () => {
    const f = await critiqueFixture(t, { instructor, participant }, { title: 'Latest only' });
    const second = await upload(t, participant, f.briefId, cubePlates(60));
    const res = await post(critic, `/api/revisions/${f.revisionId}/pins`, pinBody());
    expect(res.status).toBe(409);
    expect(res.body.error.message).toBe('Revision 1 is no longer the latest: revision 2 is newer. Place the pin on revision 2.');
    expect((await get(critic, `/api/revisions/${f.revisionId}/pins`)).body.canPin).toBe(false);
    expect((await get(critic, `/api/revisions/${second.revisionId}/pins`)).body.canPin).toBe(true);
    expect((await post(critic, `/api/revisions/${second.revisionId}/pins`, pinBody())).status).toBe(201);
  });

  it('stores markdown bodies verbatim as text, never as rendered HTML', async () => {
    const f = await critiqueFixture(t, { instructor, participant }, { title: 'Verbatim' });
    const nasty = 'See <script>alert("pin")</script> and <img src=x onerror=alert(1)> or [this](javascript:alert(1)) **now**';
    const pin = await post(critic, `/api/revisions/${f.revisionId}/pins`, pinBody({ body: nasty }));
    expect(pin.status).toBe(201);
    expect(pin.headers['content-type']).toMatch(/^application\/json/);
    expect(pin.body.comments[0].body).toBe(nasty);
    const reply = await post(participant, `/api/pins/${pin.body.id}/comments`, { body: `<a href="javascript:void(0)" onerror="x()">ok</a>` });
    expect(reply.status).toBe(201);
    expect(reply.body.body).toBe(`<a href="javascript:void(0)" onerror="x()">ok</a>`);
    const list = await get(instructor, `/api/revisions/${f.revisionId}/pins`);
    expect(list.body.pins[0].comments.map((c: { body: string }) => c.body)).toEqual([nasty, `<a href="javascript:void(0)" onerror="x()">ok</a>`]);
    // The participant's e-mail quotes it as plain text and escapes it in the HTML part.
    const mail = (await t.outbox()).filter((m) => m.subject.startsWith('Pin 1 on revision 1: Verbatim'));
    expect(mail).toHaveLength(1);
    expect(mail[0].text).toContain(nasty);
    expect(mail[0].html).not.toContain('<script>');
    expect(mail[0].html).not.toContain('<img src=x');
    expect(mail[0].html).toContain('&lt;script&gt;alert(&quot;pin&quot;)&lt;/script&gt;');
  });
});

describe('threads and states', () => {
  it('lets the participant, instructor and assigned critics reply; not other critics or participants', async () => {
    const f = await critiqueFixture(t, { instructor, participant }, { title: 'Replies' });
    const pin = (await post(critic, `/api/revisions/${f.revisionId}/pins`, pinBody())).body;
    const path = `/api/pins/${pin.id}/comments`;
    t.clock.advance(60_000);
    const r1 = await post(participant, path, { body: 'I can lengthen it by 4 mm.' });
    expect(r1.status, r1.text).toBe(201);
    expect(r1.body).toMatchObject({ author: { name: 'Kofi Mensah-Lowe', role: 'participant' }, body: 'I can lengthen it by 4 mm.' });
    expect((await post(instructor, path, { body: 'Agreed.' })).status).toBe(201);
    expect((await post(critic, path, { body: 'Thanks.' })).status).toBe(201);
    expect((await post(otherCritic, path, { body: 'Hm.' })).status).toBe(403);
    expect((await post(otherParticipant, path, { body: 'Hm.' })).status).toBe(403);
    expect((await post(participant, path, { body: '' })).status).toBe(400);
    expect((await post(participant, '/api/pins/999999/comments', { body: 'x' })).status).toBe(404);
    const list = await get(participant, `/api/revisions/${f.revisionId}/pins`);
    expect(list.body.pins[0].comments).toHaveLength(4);
    expect(Date.parse(list.body.pins[0].updatedAt)).toBeGreaterThan(Date.parse(list.body.pins[0].createdAt));
  });

  it('changes the version whenever the list changes, and only then', async () => {
    const f = await critiqueFixture(t, { instructor, participant }, { title: 'Versions' });
    const path = `/api/revisions/${f.revisionId}/pins`;
    const v0 = (await get(participant, path)).body.version;
    expect(v0).toBeTypeOf('string');
    const pin = (await post(critic, path, pinBody())).body;
    const v1 = (await get(participant, path)).body.version;
    expect(v1).not.toBe(v0);
    expect((await get(participant, path)).body.version).toBe(v1);
    await post(participant, `/api/pins/${pin.id}/comments`, { body: 'Noted.' });
    const v2 = (await get(participant, path)).body.version;
    expect(v2).not.toBe(v1);
    await patch(participant, `/api/pins/${pin.id}`, { state: 'resolved' });
    expect((await get(participant, path)).body.version).not.toBe(v2);
  });

  it('resolves and reopens (recording who resolved); category only by the author or an instructor', async () => {
    const f = await critiqueFixture(t, { instructor, participant }, { title: 'States' });
    const pin = (await post(critic, `/api/revisions/${f.revisionId}/pins`, pinBody())).body;
    const path = `/api/pins/${pin.id}`;
    const resolved = await patch(participant, path, { state: 'resolved' });
    expect(resolved.status, resolved.text).toBe(200);
    expect(resolved.body).toMatchObject({ state: 'resolved', resolvedBy: { name: 'Kofi Mensah-Lowe' } });
    const reopened = await patch(critic, path, { state: 'open' });
    expect(reopened.body).toMatchObject({ state: 'open', resolvedBy: null });
    expect((await patch(instructor, path, { state: 'resolved' })).body.resolvedBy.name).toBe('Tomasz Elberg');
    expect((await patch(otherParticipant, path, { state: 'open' })).status).toBe(403);
    expect((await patch(otherCritic, path, { state: 'open' })).status).toBe(403);

    const byParticipant = await patch(participant, path, { category: 'form' });
    expect(byParticipant.status).toBe(403);
    expect(byParticipant.body.error.message).toMatch(/author or an instructor/);
    expect((await patch(critic, path, { category: 'fabrication' })).body.category).toBe('fabrication');
    expect((await patch(instructor, path, { category: 'brief' })).body.category).toBe('brief');
    // An instructor's pin: the assigned critic may resolve it but not recategorise it.
    const theirs = (await post(instructor, `/api/revisions/${f.revisionId}/pins`, pinBody())).body;
    expect((await patch(critic, `/api/pins/${theirs.id}`, { category: 'form' })).status).toBe(403);
    expect((await patch(critic, `/api/pins/${theirs.id}`, { state: 'resolved' })).status).toBe(200);
    expect((await patch(critic, path, {})).status).toBe(400);
    expect((await patch(critic, '/api/pins/999999', { state: 'open' })).status).toBe(404);
  });
});

describe('carry-over to the next revision', () => {
  it('keeps pins whose piece still holds the point and leaves the others behind, outdated, with the reason', async () => {
    const f = await critiqueFixture(t, { instructor, participant }, { title: 'Carry' });
    const path1 = `/api/revisions/${f.revisionId}/pins`;
    const centre = (await post(critic, path1, pinBody())).body;
    const corner = (await post(critic, path1, pinBody({ anchor: { piece: 'plate-02', point: [45, 45], side: -1 }, category: 'fabrication' }))).body;
    await post(participant, `/api/pins/${centre.id}/comments`, { body: 'Will do.' });

    // Smaller plates: the centre stays on every plate, the corner point falls off.
    const r2 = await upload(t, participant, f.briefId, cubePlates(30));
    const on2 = await get(participant, `/api/revisions/${r2.revisionId}/pins`);
    expect(on2.status).toBe(200);
    expect(on2.body.pins).toHaveLength(1);
    expect(on2.body.pins[0]).toMatchObject({
      id: centre.id,
      number: 1,
      revisionId: r2.revisionId,
      placedOnRevision: { id: f.revisionId, number: 1 },
      anchor: { piece: 'plate-01', point: [0, 0], side: 1 },
      outdated: false,
    });
    expect(on2.body.pins[0].comments).toHaveLength(2);
    expect(on2.body.outdatedEarlier).toEqual([{ revisionId: f.revisionId, revisionNumber: 1, count: 1 }]);
    const on1 = await get(participant, path1);
    const left = on1.body.pins.find((p: { id: number }) => p.id === corner.id);
    expect(left).toMatchObject({ outdated: true, outdatedReason: 'The pinned point is no longer on plate-02: its outline changed there.' });
    expect(on1.body.pins.find((p: { id: number }) => p.id === centre.id).outdated).toBe(false);

    // A resolve on the carried pin shows on both revisions (one pin, two anchors).
    await patch(participant, `/api/pins/${centre.id}`, { state: 'resolved' });
    expect((await get(participant, path1)).body.pins.find((p: { id: number }) => p.id === centre.id).state).toBe('resolved');

    // The motif renamed: nothing carries to revision 3.
    const renamed = cubePlates(30);
    renamed.motifs = [{ id: 'panel', family: 'faces', outline: [[-30, -30], [30, -30], [30, 30], [-30, 30]] }];
    const r3 = await upload(t, participant, f.briefId, renamed);
    const on3 = await get(participant, `/api/revisions/${r3.revisionId}/pins`);
    expect(on3.body.pins).toEqual([]);
    expect(on3.body.outdatedEarlier).toEqual([
      { revisionId: f.revisionId, revisionNumber: 1, count: 1 },
      { revisionId: r2.revisionId, revisionNumber: 2, count: 1 },
    ]);
    const stayed = (await get(participant, `/api/revisions/${r2.revisionId}/pins`)).body.pins[0];
    expect(stayed).toMatchObject({ id: centre.id, outdated: true, outdatedReason: 'The new revision has no motif plate.' });
    // The pin numbering continues on the new revision.
    const next = await post(critic, `/api/revisions/${r3.revisionId}/pins`, pinBody({ anchor: { piece: 'panel-01', point: [0, 0], side: 1 } }));
    expect(next.status, next.text).toBe(201);
    expect(next.body.number).toBe(3);
  });
});

describe('e-mails', () => {
  it('tells the participant about a new pin once, with the link, number, category, piece and comment', async () => {
    const f = await critiqueFixture(t, { instructor, participant }, { title: 'Mail pins' });
    const before = (await t.outbox()).length;
    const pin = (await post(critic, `/api/revisions/${f.revisionId}/pins`, pinBody({ category: 'fabrication', anchor: { piece: 'plate-04', point: [5, 5], side: 1 } }))).body;
    const mails = (await t.outbox()).slice(before);
    expect(mails).toHaveLength(1);
    expect(mails[0]).toMatchObject({ to: 'participant@example.org', subject: 'Pin 1 on revision 1: Mail pins' });
    expect(mails[0].text).toContain('Ren\u00e9e Ashcombe placed pin 1 (Fabrication) on piece plate-04 of your revision 1 for "Mail pins":');
    expect(mails[0].text).toContain('The corner joint here looks short.');
    expect(mails[0].text).toContain(`http://planewright.test/revisions/${f.revisionId}`);
    expect(mails[0].text).toContain('To turn these e-mails off, open http://planewright.test/settings/notifications.');
    expect(mails[0].html).toContain(`href="http://planewright.test/revisions/${f.revisionId}"`);
    // The model's thumbnail rides along inline (cid); the sink's parser turns it into a data URL of a PNG.
    expect(mails[0].html).toMatch(/<img src="data:image\/png;base64,iVBORw0KGgo[^"]+" alt="The revision's model"/);
    // A state change sends nothing.
    await patch(participant, `/api/pins/${pin.id}`, { state: 'resolved' });
    expect((await t.outbox()).length).toBe(before + 1);
  });

  it('sends a reply to the author, earlier commenters and the participant, never the replier', async () => {
    const f = await critiqueFixture(t, { instructor, participant }, { title: 'Mail replies' });
    const pin = (await post(critic, `/api/revisions/${f.revisionId}/pins`, pinBody())).body;
    let before = (await t.outbox()).length;
    await post(participant, `/api/pins/${pin.id}/comments`, { body: 'Which corner?' });
    let mails = (await t.outbox()).slice(before);
    expect(mails.map((m) => m.to)).toEqual(['critic@example.org']);
    expect(mails[0].subject).toBe('Reply on pin 1: Mail replies');
    expect(mails[0].text).toContain('Kofi Mensah-Lowe replied on pin 1 (Structure, piece plate-01) of Kofi Mensah-Lowe\u2019s revision 1 for "Mail replies":');
    expect(mails[0].text).toContain('Which corner?');

    before = (await t.outbox()).length;
    await post(instructor, `/api/pins/${pin.id}/comments`, { body: 'The lower one.' });
    mails = (await t.outbox()).slice(before);
    expect(mails.map((m) => m.to).sort()).toEqual(['critic@example.org', 'participant@example.org']);
    expect(mails.find((m) => m.to === 'participant@example.org')!.text).toContain('of your revision 1');

    before = (await t.outbox()).length;
    await post(critic, `/api/pins/${pin.id}/comments`, { body: 'Yes, that one.' });
    mails = (await t.outbox()).slice(before);
    expect(mails.map((m) => m.to).sort()).toEqual(['instructor@example.org', 'participant@example.org']);
  });

  it('sends nothing of a kind the person turned off', async () => {
    const f = await critiqueFixture(t, { instructor, participant }, { title: 'Quiet pins' });
    const off = await request(t.app).put('/api/me/notifications').set('Cookie', participant).send({ 'pin-created': false, 'pin-reply': false });
    expect(off.status).toBe(200);
    try {
      const before = (await t.outbox()).length;
      const pin = (await post(critic, `/api/revisions/${f.revisionId}/pins`, pinBody())).body;
      await post(instructor, `/api/pins/${pin.id}/comments`, { body: 'Second opinion.' });
      const to = (await t.outbox()).slice(before).map((m) => m.to);
      expect(to).toEqual(['critic@example.org']);
    } finally {
      await request(t.app).put('/api/me/notifications').set('Cookie', participant).send({ 'pin-created': true, 'pin-reply': true });
    }
  });
});
