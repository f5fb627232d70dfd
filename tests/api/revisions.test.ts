/**
 * Revisions: uploads of design files and of the form (SVG, DXF, drawing-template outlines),
 * photos, every kind of bad input (nothing partial stored), late policies, concurrent uploads,
 * and audits in the worker pool end to end (done with the right figures, failed and retried).
 */
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { Jimp } from 'jimp';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { rawDb } from '../../server/db/raw.js';
import { startTestApp, type TestApp } from './helpers.js';
import { cubePlates, makeBrief, seedDesign, settled } from './support-workflow.js';

let t: TestApp;
let instructor: string;
let participant: string;
let other: string;
let brief: Record<string, any>;

const count = (table: string): number => (rawDb(t.ds).prepare(`SELECT COUNT(*) AS n FROM ${table}`).get() as { n: number }).n;

/** Every file under the blob store (temporary ones included). */
function storedFiles(): string[] {
  const dir = t.ctx.blobDir;
  if (!existsSync(dir)) return [];
  const out: string[] = [];
  const walk = (d: string) => {
    for (const name of readdirSync(d)) {
      const p = join(d, name);
      if (statSync(p).isDirectory()) walk(p);
      else out.push(p);
    }
  };
  walk(dir);
  return out.sort();
}

const json = (o: unknown) => Buffer.from(JSON.stringify(o));
/** Reads any response body as bytes (supertest leaves SVG and images unparsed). */
const bytes = (req: request.Test) =>
  req.buffer(true).parse((r, cb) => {
    const chunks: Buffer[] = [];
    r.on('data', (c: Buffer) => chunks.push(c));
    r.on('end', () => cb(null, Buffer.concat(chunks)));
  });
const upload = (cookie: string, briefId = brief.id) => request(t.app).post(`/api/briefs/${briefId}/revisions`).set('Cookie', cookie);

const SQUARE_SVG = (unit = 'mm', size = 100) =>
  `<?xml version="1.0"?>\n<svg xmlns="http://www.w3.org/2000/svg" width="${size}${unit}" height="${size}${unit}" viewBox="-50 -50 100 100"><path d="M -50 -50 H 50 V 50 H -50 Z"/></svg>`;

/** A closed LWPOLYLINE square, 10 × 10 in the given $INSUNITS (5 = centimetres). */
function squareDxf(insunits: number, half: number): string {
  const lines = ['0', 'SECTION', '2', 'HEADER', '9', '$INSUNITS', '70', String(insunits), '0', 'ENDSEC', '0', 'SECTION', '2', 'ENTITIES', '0', 'LWPOLYLINE', '8', 'cut', '90', '4', '70', '1'];
  for (const [x, y] of [[-half, -half], [half, -half], [half, half], [-half, half]]) lines.push('10', String(x), '20', String(y));
  lines.push('0', 'ENDSEC', '0', 'EOF');
  return lines.join('\n');
}

const formFields = (req: request.Test, motifs: object[] = [{ id: 'plate', family: 'faces', file: 'outline-plate' }]) =>
  req.field('group', 'O').field('families', JSON.stringify([{ id: 'faces', axis: 4, offset: 50 }])).field('motifs', JSON.stringify(motifs));

beforeAll(async () => {
  t = await startTestApp({ auditThreads: 2 });
  instructor = await t.cookieFor('instructor@example.org');
  participant = await t.cookieFor('participant@example.org');
  other = await t.cookieFor('priya.nandakumar@example.org');
  brief = await makeBrief(t, instructor);
});
afterAll(async () => {
  await t.close();
});

describe('uploading a design document', () => {
  it('stores revision 1 with its file, and the pool audits it against the brief: done with the engine\u2019s figures', async () => {
    const res = await upload(participant).attach('design', json(cubePlates()), { filename: 'plates.json', contentType: 'application/octet-stream' });
    expect(res.status, res.text).toBe(201);
    expect(res.body).toMatchObject({ number: 1, source: 'file', late: false });
    expect(['queued', 'running']).toContain(res.body.auditState);
    expect(res.body.files).toEqual([expect.objectContaining({ role: 'design', originalName: 'plates.json', mediaType: 'application/json' })]);
    const done = await settled(t, participant, res.body.id);
    expect(done.audit.state).toBe('done');
    expect(done.audit.attempts).toBe(1);
    // Six 100 mm plates of 3 mm stock on the 4-fold planes of O at 50 mm: six faces of a cube,
    // twelve edges, each a corner joint at 90° (worked by hand, as the o-cube-plates fixture).
    expect(done.figures).toMatchObject({ errors: 0, pieces: 6, components: 1, joints: 12, ok: true });
    expect(done.audit.report.summary.byKind.corner).toBe(12);
    expect(done.audit.report.limits).toMatchObject({ sheet: [600, 400], maxSheets: 4 });
    // The brief's material (birch plywood 3 mm, kerf 0.2) is what the revision shows.
    expect(done.design.material).toEqual({ name: 'Birch plywood 3 mm', thickness: 3, kerf: 0.2 });
    const file = await request(t.app).get(done.files[0].url).set('Cookie', participant);
    expect(file.status).toBe(200);
    expect(JSON.parse(file.text)).toEqual(cubePlates());
  });

  it('audits a demo lantern under the icosahedral demo brief to the figures its README states', async () => {
    const res = await upload(participant, 1).attach('design', json(seedDesign('i-keel-lantern')), 'lantern.json');
    expect(res.status, res.text).toBe(201);
    const done = await settled(t, participant, res.body.id);
    expect(done.figures).toMatchObject({ errors: 0, warnings: 0, pieces: 80, components: 1, joints: 120, sheets: 2, ok: true });
  });

  it('audits a design that breaks the brief and shows the brief\u2019s findings (not an input error)', async () => {
    const strict = await makeBrief(t, instructor, {
      allowedGroups: ['I'],
      requiredFamilies: [{ axis: 3, offsetMin: 60, offsetMax: 160 }],
      allowedFamilies: [{ axis: 2, offsetMin: 10, offsetMax: 80 }],
    });
    const res = await upload(participant, strict.id).send({ design: cubePlates() });
    expect(res.status, res.text).toBe(201);
    const done = await settled(t, participant, res.body.id);
    const codes = done.audit.report.findings.map((f: { code: string }) => f.code);
    expect(codes).toEqual(expect.arrayContaining(['group-not-allowed', 'family-not-allowed', 'required-family-missing']));
    expect(done.figures.ok).toBe(false);
    expect(done.audit.report.findings.find((f: { code: string }) => f.code === 'group-not-allowed').message).toMatch(/group O.*allows I/);
  });

  it('numbers revisions per submission and keeps one submission per participant and brief', async () => {
    const a = await upload(participant).send({ design: cubePlates(40, 'Second') });
    expect(a.body.number).toBe(2);
    const b = await upload(other).send({ design: cubePlates() });
    expect(b.body.number).toBe(1);
    expect(b.body.submissionId).not.toBe(a.body.submissionId);
    await t.ctx.audits.idle();
    const sub = await request(t.app).get(`/api/submissions/${a.body.submissionId}`).set('Cookie', participant);
    expect(sub.body.revisions.map((r: { number: number }) => r.number)).toEqual([1, 2]);
  });

  it('shows the history across revisions: what got better and worse', async () => {
    const b = await makeBrief(t, instructor, { maxSheets: 1 });
    const apart = { ...cubePlates(), motifs: [{ id: 'tab', family: 'faces', outline: [[20, -5], [40, -5], [40, 5], [20, 5]] }] };
    const r1 = await upload(participant, b.id).send({ design: apart });
    const r2 = await upload(participant, b.id).send({ design: cubePlates() });
    await t.ctx.audits.idle();
    const h = await request(t.app).get(`/api/submissions/${r2.body.submissionId}/history`).set('Cookie', participant);
    expect(h.status).toBe(200);
    expect(h.body.map((e: { revisionId: number }) => e.revisionId)).toEqual([r1.body.id, r2.body.id]);
    expect(h.body[0].figures).toMatchObject({ errors: 1, components: 24 });
    expect(h.body[1].fixedCodes).toEqual(['disconnected']);
    expect(h.body[1].changes).toEqual(
      expect.arrayContaining([
        { figure: 'errors', from: 1, to: 0, better: true },
        { figure: 'components', from: 24, to: 1, better: true },
        { figure: 'joints', from: 0, to: 12, better: true },
      ]),
    );
  });
});

describe('building a revision in the form', () => {
  it('takes an SVG outline (width in mm and viewBox honoured) and a DXF outline in centimetres ($INSUNITS 5)', async () => {
    const svg = await formFields(upload(participant)).attach('outline-plate', Buffer.from(SQUARE_SVG()), { filename: 'plate.txt', contentType: 'text/plain' });
    expect(svg.status, svg.text).toBe(201);
    expect(svg.body.source).toBe('form');
    expect(svg.body.files[0]).toMatchObject({ role: 'outline', mediaType: 'image/svg+xml', originalName: 'plate.txt' });
    const dxf = await formFields(upload(participant)).attach('outline-plate', Buffer.from(squareDxf(5, 5)), 'plate.dxf');
    expect(dxf.status, dxf.text).toBe(201);
    expect(dxf.body.files[0]).toMatchObject({ role: 'outline', mediaType: 'application/dxf' });
    for (const r of [svg, dxf]) {
      const done = await settled(t, participant, r.body.id);
      const outline = (done.design.motifs[0].outline as number[][]).map(([x, y]) => [Math.abs(x), Math.abs(y)]);
      for (const [x, y] of outline) {
        expect(x).toBeCloseTo(50, 6);
        expect(y).toBeCloseTo(50, 6);
      }
      expect(done.figures).toMatchObject({ pieces: 6, joints: 12, errors: 0 });
    }
  });

  it('takes a drawing template downloaded from a revision back, filled in', async () => {
    const first = await upload(participant).send({ design: cubePlates(45) });
    const tpl = await bytes(request(t.app).get(`/api/revisions/${first.body.id}/templates/faces`).set('Cookie', participant));
    expect(tpl.status).toBe(200);
    expect(tpl.headers['content-type']).toMatch(/^image\/svg\+xml/);
    expect(tpl.headers['content-disposition']).toMatch(/^attachment; filename="revision-\d+-faces\.svg"$/);
    const form = upload(participant)
      .field('group', 'O')
      .field('families', JSON.stringify([{ id: 'faces', axis: 4, offset: 45 }]))
      .field('motifs', JSON.stringify([{ id: 'plate', family: 'faces', file: 'drawing' }]));
    const res = await form.attach('drawing', tpl.body as Buffer, 'faces.svg');
    expect(res.status, res.text).toBe(201);
    expect(res.body.files[0].role).toBe('drawing');
    const done = await settled(t, participant, res.body.id);
    expect(done.figures).toMatchObject({ pieces: 6, joints: 12, errors: 0 });
  });

  it('downloads a brief\u2019s drawing template per family rule', async () => {
    const res = await bytes(request(t.app).get('/api/briefs/1/templates/fold-3').set('Cookie', participant));
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toBe('attachment; filename="brief-1-fold-3.svg"');
    expect((res.body as Buffer).toString('utf8')).toContain('data-planewright-page');
    const missing = await request(t.app).get('/api/briefs/1/templates/nope').set('Cookie', participant);
    expect(missing.status).toBe(404);
    expect(missing.body.error.message).toMatch(/fold-3/);
  });
});

describe('photos', () => {
  it('re-encodes JPEG and PNG photos without their metadata and adds 320 px thumbnails', async () => {
    const jpeg = await new Jimp({ width: 800, height: 500, color: 0x4477aaff }).getBuffer('image/jpeg');
    // An APP1 Exif segment right after the start marker, carrying a location string.
    const secret = Buffer.from('Exif\0\0GPS 51.5N 0.1W secret-location');
    const app1 = Buffer.concat([Buffer.from([0xff, 0xe1, (secret.length + 2) >> 8, (secret.length + 2) & 0xff]), secret]);
    const tagged = Buffer.concat([jpeg.subarray(0, 2), app1, jpeg.subarray(2)]);
    expect(tagged.includes('secret-location')).toBe(true);
    const png = await new Jimp({ width: 200, height: 100, color: 0xaa3300ff }).getBuffer('image/png');
    const res = await upload(participant)
      .attach('design', json(cubePlates()), 'd.json')
      .attach('photos', tagged, { filename: 'built.jpeg', contentType: 'image/jpeg' })
      .attach('photos', png, 'detail.png');
    expect(res.status, res.text).toBe(201);
    const roles = res.body.files.map((f: { role: string }) => f.role);
    expect(roles).toEqual(['design', 'photo', 'thumbnail', 'photo', 'thumbnail']);
    const photo = await bytes(request(t.app).get(res.body.files[1].url).set('Cookie', participant));
    expect(photo.headers['content-type']).toBe('image/jpeg');
    const stored = photo.body as Buffer;
    expect(stored.includes('secret-location')).toBe(false);
    expect((await Jimp.read(stored)).bitmap.width).toBe(800);
    const thumbs = res.body.files.filter((f: { role: string }) => f.role === 'thumbnail');
    const thumbBytes = await bytes(request(t.app).get(thumbs[0].url).set('Cookie', participant));
    expect((await Jimp.read(thumbBytes.body as Buffer)).bitmap).toMatchObject({ width: 320, height: 200 });
    // A PNG narrower than 320 px keeps its size.
    expect(thumbs[1].size).toBeGreaterThan(0);
  });
});

describe('bad input: a clear message at the right field, nothing stored', () => {
  async function refused(req: request.Test, status: number, field: string, message: RegExp) {
    const rows = [count('revisions'), count('revision_files'), count('blobs'), count('audits'), count('submissions')];
    const files = storedFiles();
    const res = await req;
    expect(res.status, res.text).toBe(status);
    expect(res.body.error.fields?.[field], JSON.stringify(res.body)).toBeTypeOf('string');
    expect(res.body.error.message).toMatch(message);
    expect([count('revisions'), count('revision_files'), count('blobs'), count('audits'), count('submissions')]).toEqual(rows);
    expect(storedFiles()).toEqual(files);
    return res;
  }

  it('a PNG sent as the design document is refused by its content (415)', async () => {
    const png = await new Jimp({ width: 4, height: 4, color: 0xffffffff }).getBuffer('image/png');
    await refused(upload(participant).attach('design', png, { filename: 'design.json', contentType: 'application/json' }), 415, 'files.design', /a PNG image, not a design document/);
  });

  it('a text file as a photo, and an SVG as an outline that is really a DXF-less text, are refused (415)', async () => {
    await refused(upload(participant).attach('design', json(cubePlates()), 'd.json').attach('photos', Buffer.from('not a photo'), 'photo.jpg'), 415, 'files.photos', /JPEG or PNG/);
    await refused(formFields(upload(participant)).attach('outline-plate', Buffer.from('hello'), 'plate.svg'), 415, 'files.outline-plate', /SVG or DXF/);
  });

  it('an oversize design document is 413 naming the 2 MB limit; an oversize outline names 1 MB', async () => {
    const big = Buffer.from(JSON.stringify({ ...cubePlates(), title: 'x'.repeat(50), pad: ' '.repeat(2 * 1024 * 1024) }));
    await refused(upload(participant).attach('design', big, 'big.json'), 413, 'files.design', /2 MB limit/);
    const bigSvg = Buffer.from(SQUARE_SVG().replace('<path', `<!-- ${'x'.repeat(1024 * 1024)} --><path`));
    await refused(formFields(upload(participant)).attach('outline-plate', bigSvg, 'plate.svg'), 413, 'files.outline-plate', /1 MB limit/);
  });

  it('a file over 8 MB is 413 naming the limit, and more than 10 files is 413', async () => {
    await refused(upload(participant).attach('photos', Buffer.alloc(8 * 1024 * 1024 + 10, 1), 'huge.png'), 413, 'files.photos', /8 MB/);
    let req = upload(participant).attach('design', json(cubePlates()), 'd.json');
    for (let i = 0; i < 10; i++) req = req.attach('photos', Buffer.from([0xff, 0xd8, 0xff, i]), `p${i}.jpg`);
    await refused(req, 413, 'files', /at most 10 files/);
  });

  it('a photo that declares a huge image, or cannot be decoded, is 422 before anything is stored', async () => {
    const png = await new Jimp({ width: 4, height: 4, color: 0xffffffff }).getBuffer('image/png');
    const bomb = Buffer.from(png);
    bomb.writeUInt32BE(60_000, 16); // IHDR width
    bomb.writeUInt32BE(60_000, 20); // IHDR height
    await refused(upload(participant).attach('design', json(cubePlates()), 'd.json').attach('photos', bomb, 'bomb.png'), 422, 'files.photos', /60000 × 60000 pixels; photos may have at most 40 million/);
    const broken = Buffer.concat([png.subarray(0, 40), Buffer.alloc(20)]);
    await refused(upload(participant).attach('design', json(cubePlates()), 'd.json').attach('photos', broken, 'broken.png'), 422, 'files.photos', /could not be read as an image/);
  });

  it('a truncated multipart upload leaves no row and no file', async () => {
    const boundary = 'cutoffboundary';
    const body = Buffer.concat([
      Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="design"; filename="d.json"\r\nContent-Type: application/json\r\n\r\n`),
      json(cubePlates()).subarray(0, 60),
    ]);
    const res = await refused(
      upload(participant).set('Content-Type', `multipart/form-data; boundary=${boundary}`).send(body),
      400,
      'files',
      /cut off.*nothing was stored/,
    );
    expect(res.body.error.code).toBe('upload_incomplete');
    expect(storedFiles().some((f) => f.includes(`${join('blobs', 'tmp')}`))).toBe(false);
  });

  it('malformed JSON, SVG and DXF are 422 naming the file and the reader\u2019s message', async () => {
    const bad = await refused(upload(participant).attach('design', Buffer.from('{"format": "planewright/design@1", "title": '), 'd.json'), 422, 'files.design', /d\.json is not a valid design/);
    expect(bad.body.error.fields['files.design']).toMatch(/JSON/i);
    const wrongField = { ...cubePlates(), families: [{ id: 'faces', axis: 7, offset: 50 }] };
    const wf = await refused(upload(participant).attach('design', json(wrongField), 'd.json'), 422, 'design.families[0].axis', /families\[0\]\.axis/);
    expect(wf.body.error.fields['design.families[0].axis']).toMatch(/7-fold/);
    await refused(formFields(upload(participant)).attach('outline-plate', Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" width="100%"><path d="M 0 0 L 10"/></svg>'), 'p.svg'), 422, 'files.outline-plate', /p\.svg \(motif "plate"\) could not be read/);
    await refused(formFields(upload(participant)).attach('outline-plate', Buffer.from('0\nSECTION\n2\nENTITIES\n0\nLWPOLYLINE\n90\nabc\n'), 'p.dxf'), 422, 'files.outline-plate', /p\.dxf \(motif "plate"\) could not be read/);
  });

  it('form fields that are not JSON or break the schema are 400 naming the field; a missing outline file is 422', async () => {
    await refused(upload(participant).field('group', 'O').field('families', '[{').field('motifs', '[]'), 400, 'body.families', /not valid JSON/);
    await refused(upload(participant).field('group', 'O').field('families', JSON.stringify([{ id: 'faces', axis: 4, offset: -1 }])).field('motifs', '[]'), 400, 'body.families.0.offset', /body\.families\.0\.offset/);
    await refused(formFields(upload(participant)), 422, 'files.outline-plate', /No file was sent for motif "plate"/);
    await refused(upload(participant).field('group', 'Q').field('families', JSON.stringify([{ id: 'faces', axis: 4, offset: 50 }])).field('motifs', '[]'), 422, 'body.group', /symmetry/);
  });

  it('a JSON body that is not a design is 400/422 at body.design', async () => {
    await refused(upload(participant).send({ design: 'plates' }), 400, 'body.design', /design document/);
    await refused(upload(participant).send({ design: { ...cubePlates(), motifs: [{ id: 'p', family: 'nope', outline: [[0, 0], [1, 0], [0, 1]] }] } }), 422, 'design.motifs[0].family', /motifs\[0\]\.family/);
  });
});

describe('deadlines and brief states', () => {
  it('refuses late revisions under "refuse", marks them late under "accept-marked-late", and closed briefs take none', async () => {
    const past = new Date(t.clock.now().getTime() - 3_600_000).toISOString();
    const refuse = await makeBrief(t, instructor, { deadline: past, latePolicy: 'refuse' });
    const r = await upload(participant, refuse.id).send({ design: cubePlates() });
    expect(r.status).toBe(422);
    expect(r.body.error.message).toMatch(/deadline .* has passed and this brief does not accept late revisions/);
    expect(r.body.error.fields['brief.deadline']).toBeTypeOf('string');
    const marked = await makeBrief(t, instructor, { deadline: past, latePolicy: 'accept-marked-late' });
    const m = await upload(participant, marked.id).send({ design: cubePlates() });
    expect(m.status).toBe(201);
    expect(m.body.late).toBe(true);
    const accept = await makeBrief(t, instructor, { deadline: past, latePolicy: 'accept' });
    expect((await upload(participant, accept.id).send({ design: cubePlates() })).body.late).toBe(false);
    await request(t.app).post(`/api/briefs/${accept.id}/close`).set('Cookie', instructor).expect(200);
    const closed = await upload(participant, accept.id).send({ design: cubePlates() });
    expect(closed.status).toBe(422);
    expect(closed.body.error.message).toMatch(/closed/);
    await t.ctx.audits.idle();
  });

  it('a draft brief takes no revisions (403: participants do not see drafts)', async () => {
    const draft = await makeBrief(t, instructor, { publish: false });
    expect((await upload(participant, draft.id).send({ design: cubePlates() })).status).toBe(403);
  });
});

describe('concurrent uploads', () => {
  it('20 uploads at once lose nothing and duplicate nothing: revisions 1..20, 20 rows, equal content stored once', async () => {
    const b = await makeBrief(t, instructor);
    const before = { blobs: count('blobs'), files: storedFiles().length };
    const docs = Array.from({ length: 20 }, (_, i) => cubePlates(50, `Copy ${i % 5}`)); // 5 distinct files
    const results = await Promise.all(docs.map((d, i) => upload(participant, b.id).attach('design', json(d), `copy-${i}.json`)));
    for (const r of results) expect(r.status, r.text).toBe(201);
    const numbers = results.map((r) => r.body.number as number).sort((x, y) => x - y);
    expect(numbers).toEqual(Array.from({ length: 20 }, (_, i) => i + 1));
    expect(new Set(results.map((r) => r.body.submissionId)).size).toBe(1);
    const db = rawDb(t.ds);
    const sub = results[0].body.submissionId as number;
    expect((db.prepare('SELECT COUNT(*) AS n FROM revisions WHERE submission_id = ?').get(sub) as { n: number }).n).toBe(20);
    expect((db.prepare('SELECT COUNT(*) AS n FROM revision_files f JOIN revisions r ON r.id = f.revision_id WHERE r.submission_id = ?').get(sub) as { n: number }).n).toBe(20);
    expect(count('blobs') - before.blobs).toBe(5);
    expect(storedFiles().length - before.files).toBe(5);
    await t.ctx.audits.idle();
    const states = db.prepare('SELECT a.state, COUNT(*) AS n FROM audits a JOIN revisions r ON r.id = a.revision_id WHERE r.submission_id = ? GROUP BY a.state').all(sub);
    expect(states).toEqual([{ state: 'done', n: 20 }]);
  });
});

describe('failing audits', () => {
  it('an audit that runs out of time is failed with a sentence, and a retry runs it again to done', async () => {
    const lantern = seedDesign('i-closed-shell');
    t.ctx.audits.timeoutMs = 1;
    const res = await upload(participant, 1).send({ design: lantern });
    const failed = await settled(t, participant, res.body.id);
    t.ctx.audits.timeoutMs = 20_000;
    expect(failed.audit.state).toBe('failed');
    expect(failed.audit.error).toMatch(/took longer than 0 s and was stopped.*retry/);
    expect(failed.audit.report).toBeNull();
    const again = await request(t.app).post(`/api/revisions/${res.body.id}/retry`).set('Cookie', participant);
    expect(again.status).toBe(200);
    expect(['queued', 'running']).toContain(again.body.state);
    const done = await settled(t, participant, res.body.id);
    expect(done.audit).toMatchObject({ state: 'done', attempts: 2, error: null });
    // i-closed-shell under the icosahedral brief: 4 non-orthogonal-contact findings (designs README).
    expect(done.figures).toMatchObject({ errors: 4, pieces: 80, components: 1 });
    const twice = await request(t.app).post(`/api/revisions/${res.body.id}/retry`).set('Cookie', participant);
    expect(twice.status).toBe(409);
  });

  it('a stored design the engine cannot read fails with the reader\u2019s message', async () => {
    const res = await upload(participant).send({ design: cubePlates() });
    await t.ctx.audits.idle();
    rawDb(t.ds).prepare(`UPDATE revisions SET design = ? WHERE id = ?`).run(JSON.stringify({ format: 'planewright/design@1' }), res.body.id);
    await request(t.app).post(`/api/briefs/${brief.id}/reaudit`).set('Cookie', instructor).expect(200);
    const failed = await settled(t, participant, res.body.id);
    expect(failed.audit.state).toBe('failed');
    expect(failed.audit.error).toMatch(/The design could not be read: title/);
  });

  it('audits a crash left queued or running are queued again when the app starts', async () => {
    const res = await upload(participant).send({ design: cubePlates(30) });
    await t.ctx.audits.idle();
    rawDb(t.ds).prepare(`UPDATE audits SET state = 'running', report = NULL WHERE revision_id = ?`).run(res.body.id);
    expect(t.ctx.audits.resumeStale()).toBeGreaterThanOrEqual(1);
    const done = await settled(t, participant, res.body.id);
    expect(done.audit.state).toBe('done');
    expect(done.figures.pieces).toBe(6);
  });
});
