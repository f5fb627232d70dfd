/**
 * Revision thumbnails: a PNG of the model drawn from the stored design (with the brief's
 * material, as the audit and the viewer see it) by the engine's software renderer, made once and
 * kept in the blob store as a revision file of role `thumbnail`.
 *
 * The file's name carries a key of what it was drawn from (the design document, the material
 * and the renderer's version and size), so a brief whose material changes, or a new renderer,
 * gives a new picture; the row of the older picture is replaced in the same transaction.
 */
import { createHash } from 'node:crypto';
import { Jimp } from 'jimp';
import { parseDesign } from '../../shared/engine/design.js';
import { sceneOfDesign } from '../../shared/engine/scene.js';
import {
  THUMBNAIL_HEIGHT,
  THUMBNAIL_RENDERER_VERSION,
  THUMBNAIL_WIDTH,
  isModelThumbnailFileName,
  modelThumbnailFileName,
  renderThumbnail,
} from '../../shared/engine/thumbnail.js';
import { withBriefMaterial } from '../audits/brief-rules.js';
import type { AppContext } from '../context.js';
import { rawDb, sqlDate, whenNoTransaction } from '../db/raw.js';
import { createBlobStore } from '../storage/blob-store.js';

interface SourceRow {
  design: string;
  material_name: string;
  thickness: number;
  kerf: number;
}

interface FileRow {
  id: number;
  original_name: string;
  sha256: string;
}

/** The key of a picture: what it is drawn from and how (12 hex digits of a SHA-256). */
export function thumbnailKey(doc: unknown): string {
  const what = JSON.stringify({ doc, renderer: THUMBNAIL_RENDERER_VERSION, size: [THUMBNAIL_WIDTH, THUMBNAIL_HEIGHT] });
  return createHash('sha256').update(what).digest('hex').slice(0, 12);
}

/** Draws the design as a PNG; null when it cannot be read into a model or has no pieces. */
export async function renderDesignPng(doc: unknown): Promise<Buffer | null> {
  const parsed = parseDesign(doc);
  if (!parsed.ok) return null;
  let scene;
  try {
    scene = sceneOfDesign(parsed.design);
  } catch {
    return null;
  }
  if (scene.pieceCount === 0) return null;
  const img = renderThumbnail(scene, { width: THUMBNAIL_WIDTH, height: THUMBNAIL_HEIGHT });
  const jimp = Jimp.fromBitmap({ width: img.width, height: img.height, data: Buffer.from(img.data.buffer, img.data.byteOffset, img.data.byteLength) });
  return jimp.getBuffer('image/png');
}

async function readAll(stream: NodeJS.ReadableStream): Promise<Buffer> {
  const parts: Buffer[] = [];
  for await (const chunk of stream) parts.push(typeof chunk === 'string' ? Buffer.from(chunk) : (chunk as Buffer));
  return Buffer.concat(parts);
}

/** Pictures being drawn right now, so two first requests for one revision draw it once. */
const drawing = new Map<string, Promise<Buffer | null>>();

/**
 * The PNG thumbnail of a revision's model: the stored one when it was drawn from the same
 * design and material, else drawn now and stored. Null when there is no such revision, or its
 * design cannot be read into a model (or has no pieces).
 */
export async function thumbnailPng(ctx: AppContext, revisionId: number): Promise<Buffer | null> {
  const db = rawDb(ctx.dataSource);
  const store = createBlobStore(ctx.blobDir);
  const src = db
    .prepare(
      `SELECT r.design, m.name AS material_name, m.thickness, m.kerf
         FROM revisions r JOIN submissions s ON s.id = r.submission_id JOIN briefs b ON b.id = s.brief_id
         JOIN materials m ON m.id = b.material_id WHERE r.id = ?`,
    )
    .get(revisionId) as SourceRow | undefined;
  if (!src) return null;
  let stored: unknown;
  try {
    stored = JSON.parse(src.design);
  } catch {
    return null;
  }
  const doc = withBriefMaterial(stored, { name: src.material_name, thickness: src.thickness, kerf: src.kerf }).doc;
  const name = modelThumbnailFileName(thumbnailKey(doc));
  const filesOf = () =>
    (
      db
        .prepare(`SELECT f.id, f.original_name, f.blob_sha256 AS sha256 FROM revision_files f WHERE f.revision_id = ? AND f.role = 'thumbnail' ORDER BY f.id`)
        .all(revisionId) as FileRow[]
    ).filter((f) => isModelThumbnailFileName(f.original_name));
  const existing = filesOf().find((f) => f.original_name === name);
  if (existing && store.has(existing.sha256)) return readAll(store.open(existing.sha256));

  const job = `${revisionId}:${name}`;
  const running = drawing.get(job);
  if (running) return running;
  const made = (async (): Promise<Buffer | null> => {
    const png = await renderDesignPng(doc);
    if (!png) return null;
    const blob = await store.put(png);
    const now = sqlDate(ctx.clock.now());
    try {
      await whenNoTransaction(db);
      db.transaction(() => {
        const current = filesOf();
        if (current.some((f) => f.original_name === name && f.sha256 === blob.sha256)) return;
        // Older pictures of this revision (another design key, or a lost blob) give way.
        const drop = db.prepare('DELETE FROM revision_files WHERE id = ?');
        for (const f of current) drop.run(f.id);
        db.prepare('INSERT OR IGNORE INTO blobs (sha256, size, media_type, created_at) VALUES (?, ?, ?, ?)').run(blob.sha256, blob.size, 'image/png', now);
        db.prepare(`INSERT INTO revision_files (revision_id, blob_sha256, role, original_name) VALUES (?, ?, 'thumbnail', ?)`).run(revisionId, blob.sha256, name);
      })();
    } catch (e) {
      const referenced = db.prepare('SELECT 1 FROM blobs WHERE sha256 = ?').get(blob.sha256);
      if (blob.created && !referenced) await store.remove(blob.sha256);
      throw e;
    }
    return png;
  })();
  drawing.set(job, made);
  try {
    return await made;
  } finally {
    drawing.delete(job);
  }
}
