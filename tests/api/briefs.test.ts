/**
 * Briefs and the material catalogue: who writes and reads them, prohibited materials, states,
 * the changelog and re-audit on a constraint change, the submissions table with its filters and
 * gallery rules, critic assignments, and the CSV export.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_STUDIO_ID, startTestApp, type TestApp } from './helpers.js';
import { PLYWOOD_ID, cubePlates, makeBrief, settled } from './support-workflow.js';

let t: TestApp;
let admin: string;
let instructor: string;
let participant: string;
let priya: string;
let critic: string;

beforeAll(async () => {
  t = await startTestApp();
  admin = await t.cookieFor('admin@example.org');
  instructor = await t.cookieFor('instructor@example.org');
  participant = await t.cookieFor('participant@example.org');
  priya = await t.cookieFor('priya.nandakumar@example.org');
  critic = await t.cookieFor('critic@example.org');
});
afterAll(async () => {
  await t.close();
});

const constraints = (materialId = PLYWOOD_ID) => ({
  allowedGroups: ['O'],
  materialId,
  sheet: [600, 400],
  maxSheets: 4,
});

describe('material catalogue', () => {
  it('lists the seeded catalogue, allowed materials first, with the prohibited ones and their reasons', async () => {
    const res = await request(t.app).get('/api/materials').set('Cookie', participant);
    expect(res.status).toBe(200);
    const names = res.body.map((m: { name: string }) => m.name);
    expect(names.slice(0, 4)).toEqual(['Acrylic (PMMA) 3 mm', 'Birch plywood 3 mm', 'Card 1.5 mm', 'MDF 3 mm']);
    // REFERENCES.md "Laser-cutting practice": kerf on 3 mm stock, and PVC releases hydrogen chloride.
    expect(res.body.find((m: { name: string }) => m.name === 'Birch plywood 3 mm')).toMatchObject({ thickness: 3, kerf: 0.2, prohibited: false });
    expect(res.body.find((m: { name: string }) => m.name === 'MDF 3 mm').kerf).toBe(0.15);
    expect(res.body.find((m: { name: string }) => m.name === 'PVC / vinyl')).toMatchObject({ prohibited: true, prohibitedReason: expect.stringMatching(/hydrogen chloride/) });
    expect(res.body.find((m: { name: string }) => m.name === 'ABS').prohibitedReason).toMatch(/hydrogen cyanide/);
  });

  it('admins add, change and delete materials; a prohibited one needs a reason', async () => {
    const noReason = await request(t.app).post('/api/materials').set('Cookie', admin).send({ name: 'Mystery board', thickness: 3, kerf: 0.2, prohibited: true });
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.fields['body.prohibitedReason']).toMatch(/why/);
    const made = await request(t.app).post('/api/materials').set('Cookie', admin).send({ name: 'Poplar plywood 4 mm', thickness: 4, kerf: 0.22, sheetSizes: [[600, 400]] });
    expect(made.status).toBe(201);
    expect(made.body).toMatchObject({ cuttingSpeed: null, density: null, sheetSizes: [[600, 400]], prohibited: false });
    const dup = await request(t.app).post('/api/materials').set('Cookie', admin).send({ name: 'poplar PLYWOOD 4 mm', thickness: 4, kerf: 0.2 });
    expect(dup.status).toBe(409);
    const mark = await request(t.app).patch(`/api/materials/${made.body.id}`).set('Cookie', admin).send({ prohibited: true });
    expect(mark.status).toBe(422);
    expect(mark.body.error.fields['body.prohibitedReason']).toBeTypeOf('string');
    const ok = await request(t.app).patch(`/api/materials/${made.body.id}`).set('Cookie', admin).send({ kerf: 0.25 });
    expect(ok.body.kerf).toBe(0.25);
    expect((await request(t.app).delete(`/api/materials/${made.body.id}`).set('Cookie', admin)).status).toBe(204);
    const used = await request(t.app).delete(`/api/materials/${PLYWOOD_ID}`).set('Cookie', admin);
    expect(used.status).toBe(409);
    expect(used.body.error.message).toMatch(/briefs use this material; mark it prohibited/);
  });

  it('a brief cannot choose a prohibited or unknown material (422 at body.constraints.materialId)', async () => {
    const list = await request(t.app).get('/api/materials').set('Cookie', instructor);
    const pvc = list.body.find((m: { name: string }) => m.name === 'PVC / vinyl');
    const res = await request(t.app).post(`/api/studios/${DEMO_STUDIO_ID}/briefs`).set('Cookie', instructor).send({ title: 'Vinyl lamp', constraints: constraints(pvc.id), deadline: '2026-06-01T12:00:00Z' });
    expect(res.status).toBe(422);
    expect(res.body.error.fields['body.constraints.materialId']).toMatch(/PVC \/ vinyl is prohibited.*hydrogen chloride/);
    const unknown = await request(t.app).post(`/api/studios/${DEMO_STUDIO_ID}/briefs`).set('Cookie', instructor).send({ title: 'X', constraints: constraints(9999), deadline: '2026-06-01T12:00:00Z' });
    expect(unknown.status).toBe(422);
    expect(unknown.body.error.fields['body.constraints.materialId']).toMatch(/no material/);
    const patch = await request(t.app).patch('/api/briefs/1').set('Cookie', instructor).send({ constraints: constraints(pvc.id) });
    expect(patch.status).toBe(422);
  });
});

describe('briefs', () => {
  it('starts as a draft that only instructors see; publishing e-mails the studio\u2019s participants and critics', async () => {
    const draft = await makeBrief(t, instructor, { publish: false, title: 'Draft lamp' });
    expect(draft.state).toBe('draft');
    const theirs = await request(t.app).get(`/api/studios/${DEMO_STUDIO_ID}/briefs`).set('Cookie', participant);
    expect(theirs.body.map((b: { id: number }) => b.id)).not.toContain(draft.id);
    const mine = await request(t.app).get(`/api/studios/${DEMO_STUDIO_ID}/briefs`).set('Cookie', instructor);
    expect(mine.body.map((b: { id: number }) => b.id)).toContain(draft.id);
    expect((await request(t.app).get(`/api/briefs/${draft.id}`).set('Cookie', participant)).status).toBe(403);

    const before = (await t.outbox()).length;
    const pub = await request(t.app).post(`/api/briefs/${draft.id}/publish`).set('Cookie', instructor);
    expect(pub.body).toMatchObject({ state: 'published', publishedAt: expect.any(String) });
    const mails = (await t.outbox()).slice(before);
    // Demo studio: four participants and one critic.
    expect(mails.map((m) => m.to).sort()).toEqual(
      ['critic@example.org', 'lars.brennholt@example.org', 'mei.tanaka-rowe@example.org', 'participant@example.org', 'priya.nandakumar@example.org'].sort(),
    );
    expect(mails[0].subject).toBe('New brief: Draft lamp');
    expect(mails[0].text).toContain(`/briefs/${draft.id}`);
    expect((await request(t.app).post(`/api/briefs/${draft.id}/publish`).set('Cookie', instructor)).status).toBe(409);
    const closed = await request(t.app).post(`/api/briefs/${draft.id}/close`).set('Cookie', instructor);
    expect(closed.body.state).toBe('closed');
    const edit = await request(t.app).patch(`/api/briefs/${draft.id}`).set('Cookie', instructor).send({ title: 'Later' });
    expect(edit.status).toBe(409);
  });

  it('checks rule axes against the groups (422 naming the rule)', async () => {
    const res = await request(t.app)
      .post(`/api/studios/${DEMO_STUDIO_ID}/briefs`)
      .set('Cookie', instructor)
      .send({ title: 'Fives', constraints: { ...constraints(), requiredFamilies: [{ axis: 5, offsetMin: 10, offsetMax: 20 }] }, deadline: '2026-06-01T12:00:00Z' });
    expect(res.status).toBe(422);
    expect(res.body.error.fields['body.constraints.requiredFamilies.0.axis']).toMatch(/no 5-fold axis/);
    const bad = await request(t.app).post(`/api/studios/${DEMO_STUDIO_ID}/briefs`).set('Cookie', instructor).send({ title: 'Bad', constraints: { ...constraints(), allowedGroups: ['X'] }, deadline: 'soon' });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['body.constraints.allowedGroups.0', 'body.deadline']);
  });

  it('changing a published brief\u2019s constraints writes the changelog and re-audits the latest revisions', async () => {
    const b = await makeBrief(t, instructor, { title: 'Changing lamp' });
    const r1 = await request(t.app).post(`/api/briefs/${b.id}/revisions`).set('Cookie', participant).send({ design: cubePlates(50, 'Old') });
    const r2 = await request(t.app).post(`/api/briefs/${b.id}/revisions`).set('Cookie', participant).send({ design: cubePlates(50, 'New') });
    expect((await settled(t, participant, r2.body.id)).figures.ok).toBe(true);

    const res = await request(t.app).patch(`/api/briefs/${b.id}`).set('Cookie', instructor).send({ constraints: { ...b.constraints, allowedGroups: ['I'], maxSheets: 3 } });
    expect(res.status, res.text).toBe(200);
    const changes = await request(t.app).get(`/api/briefs/${b.id}/changes`).set('Cookie', participant);
    expect(changes.body).toHaveLength(1);
    expect(changes.body[0]).toMatchObject({ by: { name: 'Tomasz Elberg' }, reaudited: 1, summary: 'Changed the constraints; 1 latest revision is audited again.' });
    expect(changes.body[0].details).toEqual(['Allowed groups: O → I.', 'Maximum sheets: 4 → 3.']);
    const latest = await settled(t, participant, r2.body.id);
    expect(latest.audit.report.findings.map((f: { code: string }) => f.code)).toContain('group-not-allowed');
    expect(latest.audit.report.limits.maxSheets).toBe(3);
    // Only the latest revision is audited again; the older one keeps its first audit.
    const older = await settled(t, participant, r1.body.id);
    expect(older.audit.report.limits.maxSheets).toBe(4);

    await request(t.app).patch(`/api/briefs/${b.id}`).set('Cookie', instructor).send({ title: 'Changing lamp 2' }).expect(200);
    const after = await request(t.app).get(`/api/briefs/${b.id}/changes`).set('Cookie', participant);
    expect(after.body[0]).toMatchObject({ summary: 'Title: "Changing lamp" → "Changing lamp 2".', reaudited: 0 });
  });

  it('tells a participant their own submission on the brief list', async () => {
    const res = await request(t.app).get(`/api/studios/${DEMO_STUDIO_ID}/briefs`).set('Cookie', participant);
    const ico = res.body.find((b: { id: number }) => b.id === 1);
    // Seeded: revisions 1 (half keels) and 2 (keel lantern), audited at seed time.
    expect(ico.mySubmission).toMatchObject({ latestRevision: 2, auditState: 'done' });
    expect(ico.templateFamilies.map((f: { id: string }) => f.id)).toEqual(['fold-3', 'fold-2']);
  });
});

describe('submissions table', () => {
  it('shows instructors every row with figures, and filters by state, errors and lateness', async () => {
    const all = await request(t.app).get('/api/briefs/1/submissions').set('Cookie', instructor);
    expect(all.status).toBe(200);
    const byName = Object.fromEntries(all.body.map((r: { participant: { name: string } }) => [r.participant.name, r]));
    // designs README: the keel lantern passes; the closed shell has 4 non-orthogonal-contact errors.
    // The demo seed has begun the critique of Kofi's lantern (pins and a score sheet).
    expect(byName['Kofi Mensah-Lowe']).toMatchObject({ revisions: 2, latestRevision: { number: 2 }, auditState: 'done', errors: 0, pieces: 80, sheets: 2, late: false, critiqueState: 'in-progress' });
    expect(byName['Priya Nandakumar']).toMatchObject({ revisions: 1, errors: 4, components: 1, sheets: 3 });
    const withErrors = await request(t.app).get('/api/briefs/1/submissions?hasErrors=true').set('Cookie', instructor);
    expect(withErrors.body.map((r: { participant: { name: string } }) => r.participant.name)).toEqual(['Priya Nandakumar']);
    const clean = await request(t.app).get('/api/briefs/1/submissions?hasErrors=false&state=done&late=false').set('Cookie', instructor);
    expect(clean.body.map((r: { participant: { name: string } }) => r.participant.name)).toEqual(['Kofi Mensah-Lowe']);
    expect((await request(t.app).get('/api/briefs/1/submissions?state=running').set('Cookie', instructor)).body).toEqual([]);
    expect((await request(t.app).get('/api/briefs/1/submissions?state=later').set('Cookie', instructor)).status).toBe(400);
  });

  it('participants see their own until the gallery opens; critics those assigned to them', async () => {
    const names = async (cookie: string) =>
      (await request(t.app).get('/api/briefs/1/submissions').set('Cookie', cookie)).body.map((r: { participant: { name: string } }) => r.participant.name);
    expect(await names(participant)).toEqual(['Kofi Mensah-Lowe']);
    expect(await names(critic)).toEqual(['Kofi Mensah-Lowe']); // seeded assignment
    const priyaSub = (await request(t.app).get('/api/briefs/1/submissions').set('Cookie', priya)).body[0].submissionId;
    expect((await request(t.app).get(`/api/submissions/${priyaSub}`).set('Cookie', participant)).status).toBe(403);
    expect((await request(t.app).get(`/api/submissions/${priyaSub}`).set('Cookie', critic)).status).toBe(403);

    await request(t.app).patch('/api/briefs/1').set('Cookie', instructor).send({ galleryOpen: true }).expect(200);
    expect(await names(participant)).toEqual(['Kofi Mensah-Lowe', 'Priya Nandakumar']);
    expect((await request(t.app).get(`/api/submissions/${priyaSub}`).set('Cookie', participant)).status).toBe(200);
    expect(await names(critic)).toEqual(['Kofi Mensah-Lowe']);
    await request(t.app).patch('/api/briefs/1').set('Cookie', instructor).send({ galleryOpen: false }).expect(200);

    const criticId = (await t.ds.query(`SELECT id FROM users WHERE email = 'critic@example.org'`))[0].id as number;
    const assigned = await request(t.app).put(`/api/submissions/${priyaSub}/critics`).set('Cookie', instructor).send({ userIds: [criticId] });
    expect(assigned.body.critics).toEqual([{ id: criticId, name: 'Ren\u00e9e Ashcombe' }]);
    expect(await names(critic)).toEqual(['Kofi Mensah-Lowe', 'Priya Nandakumar']);
    const notCritic = await request(t.app).put(`/api/submissions/${priyaSub}/critics`).set('Cookie', instructor).send({ userIds: [criticId, 1] });
    expect(notCritic.status).toBe(422);
    expect(notCritic.body.error.fields['body.userIds.1']).toMatch(/not a critic/);
  });

  it('exports marks and audit figures as CSV that opens cleanly: BOM, CRLF, quoting, formula guard', async () => {
    const b = await makeBrief(t, instructor, {
      title: 'Export, "quoted" lamp',
      rubric: [{ id: 'structure', criterion: 'Structure, joints', weight: 2, levels: [{ score: 1, label: 'Holds' }] }],
    });
    const tricky = await t.addUser('tricky@example.org', '=HYPERLINK("http://example.org")', { studioId: DEMO_STUDIO_ID, role: 'participant' });
    const quoted = await t.addUser('quoted@example.org', 'Doe, "Jo"\nsecond line', { studioId: DEMO_STUDIO_ID, role: 'participant' });
    for (const u of [tricky, quoted]) {
      const cookie = await t.cookieFor(u.email);
      await request(t.app).post(`/api/briefs/${b.id}/revisions`).set('Cookie', cookie).send({ design: cubePlates() }).expect(201);
    }
    await t.ctx.audits.idle();
    const res = await request(t.app).get(`/api/briefs/${b.id}/export`).set('Cookie', instructor).buffer(true);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toBe('attachment; filename="Export-quoted-lamp-submissions.csv"');
    const text = res.text;
    expect(text.charCodeAt(0)).toBe(0xfeff);
    expect(text.endsWith('\r\n')).toBe(true);
    // Rows by name: "=" sorts before letters. A line break inside a quoted cell is a bare LF.
    const lines = text.slice(1).split('\r\n');
    expect(lines[0]).toBe(
      'Participant,E-mail,Revisions,Latest revision,Submitted at,Late,Audit state,Errors,Warnings,Pieces,Connected groups,Sheets,Critique state,"Structure, joints (weight 2)",Final mark,Feedback released',
    );
    expect(lines[1]).toBe(`"'=HYPERLINK(""http://example.org"")",tricky@example.org,1,1,2026-03-02T09:00:00.000Z,no,done,0,0,6,1,1,not-started,,,no`);
    expect(lines[2]).toBe('"Doe, ""Jo""\nsecond line",quoted@example.org,1,1,2026-03-02T09:00:00.000Z,no,done,0,0,6,1,1,not-started,,,no');
  });

  it('re-audits every latest revision on request', async () => {
    const res = await request(t.app).post('/api/briefs/2/reaudit').set('Cookie', instructor);
    // Seeded octahedral brief: two submissions.
    expect(res.body).toEqual({ queued: 2 });
    await t.ctx.audits.idle();
    const rows = await request(t.app).get('/api/briefs/2/submissions').set('Cookie', instructor);
    expect(rows.body.map((r: { auditState: string }) => r.auditState)).toEqual(['done', 'done']);
    expect(rows.body.map((r: { errors: number }) => r.errors).sort()).toEqual([0, 1]);
  });
});
