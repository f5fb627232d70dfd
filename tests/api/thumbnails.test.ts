/**
 * Revision thumbnails: `GET /api/revisions/:revisionId/thumbnail` answers a PNG of the model
 * drawn from the stored design, made once and kept in the blob store as a revision file of role
 * `thumbnail`; drawn again when the brief's material changes; 404 with a sentence when the
 * design cannot be read; the same callers as `GET /api/revisions/:revisionId` may see it.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Express } from 'express';
import { Jimp } from 'jimp';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { listRoutes } from '../../server/app.js';
import { rawDb } from '../../server/db/raw.js';
import { PAPER, rgbOf } from '../../shared/engine/palette.js';
import { isModelThumbnailFileName } from '../../shared/engine/thumbnail.js';
import { DEMO_STUDIO_ID, startTestApp, type TestApp } from './helpers.js';

const ROUTE = '/api/revisions/:revisionId/thumbnail';

let t: TestApp;
let app: Express;
const cookies: Record<string, string> = {};

/** The real app, which declares the route under the revision's own policy action. */
function appUnderTest(t: TestApp): Express {
  expect(listRoutes(t.app).find((r) => r.method === 'GET' && r.path === ROUTE)?.action).toBe('submission.view');
  return t.app;
}

const db = () => rawDb(t.ds);
const png = (req: request.Test) =>
  req.buffer(true).parse((r, cb) => {
    const chunks: Buffer[] = [];
    r.on('data', (c: Buffer) => chunks.push(c));
    r.on('end', () => cb(null, Buffer.concat(chunks)));
  });

function revisionOf(email: string, file: string): number {
  const row = db()
    .prepare(`SELECT r.id FROM revisions r JOIN submissions s ON s.id = r.submission_id JOIN users u ON u.id = s.participant_id WHERE u.email = ? AND r.title LIKE ? ORDER BY r.number DESC`)
    .get(email, `%${file}%`) as { id: number } | undefined;
  if (!row) throw new Error(`no seeded revision of ${email} titled like ${file}`);
  return row.id;
}

const modelFiles = (revisionId: number) =>
  (db().prepare(`SELECT id, role, original_name, blob_sha256 FROM revision_files WHERE revision_id = ? AND role = 'thumbnail'`).all(revisionId) as {
    id: number;
    role: string;
    original_name: string;
    blob_sha256: string;
  }[]).filter((f) => isModelThumbnailFileName(f.original_name));

let lantern: number;

beforeAll(async () => {
  t = await startTestApp();
  app = appUnderTest(t);
  await t.addUser('outsider@example.org', 'Oona Outside');
  await t.addUser('peer@example.org', 'Pim Peer', { studioId: DEMO_STUDIO_ID, role: 'participant' });
  for (const who of ['admin', 'instructor', 'critic', 'participant', 'technician', 'outsider', 'peer']) cookies[who] = await t.cookieFor(`${who}@example.org`);
  lantern = revisionOf('participant@example.org', 'lantern');
});
afterAll(async () => {
  await t?.close();
});

describe(`GET ${ROUTE}`, () => {
  it('answers a 320 × 240 PNG of the model, private and cacheable, drawn on the paper', async () => {
    const res = await png(request(app).get(`/api/revisions/${lantern}/thumbnail`).set('Cookie', cookies.participant));
    expect(res.status, String(res.body)).toBe(200);
    expect(res.headers['content-type']).toBe('image/png');
    expect(res.headers['cache-control']).toMatch(/^private, max-age=\d+$/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    const img = await Jimp.read(res.body as Buffer);
    expect([img.bitmap.width, img.bitmap.height]).toEqual([320, 240]);
    const paper = rgbOf(PAPER);
    const d = img.bitmap.data;
    let model = 0;
    for (let i = 0; i < 320 * 240; i++) if (d[4 * i] !== paper[0] || d[4 * i + 1] !== paper[1] || d[4 * i + 2] !== paper[2]) model++;
    expect(model / (320 * 240), 'share of model pixels').toBeGreaterThan(0.1);
    expect([d[0], d[1], d[2]]).toEqual([...paper]);
  });

  it('is made once: a second request answers the stored bytes, kept as one revision file of role thumbnail', async () => {
    const first = await png(request(app).get(`/api/revisions/${lantern}/thumbnail`).set('Cookie', cookies.participant));
    const files = modelFiles(lantern);
    expect(files).toHaveLength(1);
    const storedBefore = (db().prepare('SELECT COUNT(*) AS n FROM blobs').get() as { n: number }).n;
    const again = await png(request(app).get(`/api/revisions/${lantern}/thumbnail`).set('Cookie', cookies.instructor));
    expect(again.status).toBe(200);
    expect(Buffer.compare(first.body as Buffer, again.body as Buffer)).toBe(0);
    expect(modelFiles(lantern)).toEqual(files);
    expect((db().prepare('SELECT COUNT(*) AS n FROM blobs').get() as { n: number }).n).toBe(storedBefore);
    // Served from the store, not drawn again: a marked copy in the store is what comes back.
    const path = join(t.ctx.blobDir, files[0].blob_sha256.slice(0, 2), files[0].blob_sha256);
    expect(Buffer.compare(readFileSync(path), first.body as Buffer)).toBe(0);
    const marked = Buffer.concat([first.body as Buffer, Buffer.from('marked')]);
    writeFileSync(path, marked);
    try {
      const fromStore = await png(request(app).get(`/api/revisions/${lantern}/thumbnail`).set('Cookie', cookies.critic));
      expect(Buffer.compare(fromStore.body as Buffer, marked)).toBe(0);
    } finally {
      writeFileSync(path, first.body as Buffer);
    }
    // The revision lists it among its files, and the file route serves the same bytes.
    const detail = await request(app).get(`/api/revisions/${lantern}`).set('Cookie', cookies.participant);
    const listed = (detail.body.files as { id: number; role: string; originalName: string; url: string }[]).filter((f) => isModelThumbnailFileName(f.originalName));
    expect(listed.map((f) => f.role)).toEqual(['thumbnail']);
    const served = await png(request(app).get(listed[0].url).set('Cookie', cookies.participant));
    expect(Buffer.compare(served.body as Buffer, first.body as Buffer)).toBe(0);
  });

  it('two first requests at once store one picture', async () => {
    const other = revisionOf('lars.brennholt@example.org', 'lamp');
    expect(modelFiles(other)).toHaveLength(0);
    const [a, b] = await Promise.all([0, 1].map(() => png(request(app).get(`/api/revisions/${other}/thumbnail`).set('Cookie', cookies.admin))));
    expect([a.status, b.status]).toEqual([200, 200]);
    expect(Buffer.compare(a.body as Buffer, b.body as Buffer)).toBe(0);
    expect(modelFiles(other)).toHaveLength(1);
  });

  it('is drawn again when the brief’s material changes (thicker slabs), replacing the older picture', async () => {
    const before = await png(request(app).get(`/api/revisions/${lantern}/thumbnail`).set('Cookie', cookies.participant));
    const old = modelFiles(lantern);
    const { material_id: materialId, thickness } = db()
      .prepare('SELECT b.material_id, m.thickness FROM revisions r JOIN submissions s ON s.id = r.submission_id JOIN briefs b ON b.id = s.brief_id JOIN materials m ON m.id = b.material_id WHERE r.id = ?')
      .get(lantern) as { material_id: number; thickness: number };
    db().prepare('UPDATE materials SET thickness = ? WHERE id = ?').run(thickness * 3, materialId);
    try {
      const after = await png(request(app).get(`/api/revisions/${lantern}/thumbnail`).set('Cookie', cookies.participant));
      expect(after.status).toBe(200);
      expect(Buffer.compare(before.body as Buffer, after.body as Buffer)).not.toBe(0);
      const now = modelFiles(lantern);
      expect(now).toHaveLength(1);
      expect(now[0].original_name).not.toBe(old[0].original_name);
    } finally {
      db().prepare('UPDATE materials SET thickness = ? WHERE id = ?').run(thickness, materialId);
    }
  });

  it('answers 404 with a sentence when the design cannot be read, and for an unknown revision', async () => {
    const broken = revisionOf('lars.brennholt@example.org', 'doubled');
    db().prepare('UPDATE revisions SET design = ? WHERE id = ?').run(JSON.stringify({ format: 'planewright/design@1', title: 'Broken', symmetry: 'Q7', families: [], motifs: [] }), broken);
    const res = await request(app).get(`/api/revisions/${broken}/thumbnail`).set('Cookie', cookies.admin);
    expect(res.status).toBe(404);
    expect(res.body.error.message).toMatch(/could not be read into a model/);
    expect(modelFiles(broken)).toHaveLength(0);
    const unknown = await request(app).get('/api/revisions/999999/thumbnail').set('Cookie', cookies.admin);
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.message).toMatch(/no revision/);
    const bad = await request(app).get('/api/revisions/abc/thumbnail').set('Cookie', cookies.admin);
    expect(bad.status).toBe(400);
    expect(JSON.stringify(bad.body.error.fields)).toMatch(/revisionId/);
  });

  it('lets exactly the callers who may open the revision see it (same answer as GET /api/revisions/:id)', async () => {
    const statuses: Record<string, [number, number]> = {};
    for (const who of ['anonymous', 'admin', 'instructor', 'critic', 'participant', 'technician', 'outsider', 'peer']) {
      const withCookie = (r: request.Test) => (who === 'anonymous' ? r : r.set('Cookie', cookies[who]));
      const thumb = await withCookie(request(app).get(`/api/revisions/${lantern}/thumbnail`));
      const detail = await withCookie(request(app).get(`/api/revisions/${lantern}`));
      statuses[who] = [thumb.status, detail.status];
    }
    for (const [who, [thumb, detail]] of Object.entries(statuses)) expect(thumb, `${who}: thumbnail ${thumb}, revision ${detail}`).toBe(detail);
    expect(statuses.anonymous[0]).toBe(401);
    expect(statuses.participant[0]).toBe(200);
    expect(statuses.critic[0]).toBe(200);
    expect(statuses.outsider[0]).toBe(403);
    expect(statuses.peer[0]).toBe(403);
  });
});
