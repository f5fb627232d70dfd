/**
 * The pieces of a revision as the viewer builds them: the stored design with the brief's
 * material in place of its own, parsed and cut into pieces by the engine. Designs never change
 * once stored, so the pieces are kept per revision (and material) in a small LRU cache; pins are
 * validated and carried over against them.
 */
import type { DataSource } from 'typeorm';
import { parseDesign } from '../../shared/engine/design.js';
import type { Piece } from '../../shared/engine/model.js';
import { buildPieces } from '../../shared/engine/pieces.js';
import { withBriefMaterial } from '../audits/brief-rules.js';
import { rawDb } from '../db/raw.js';

/** How many revisions' pieces are kept. */
export const PIECE_CACHE_SIZE = 24;

export type RevisionPieces = { ok: true; pieces: readonly Piece[] } | { ok: false; error: string };

const cache = new Map<string, RevisionPieces>();

/** The pieces of a design document (as stored) with `material`; an unreadable design is `ok: false`. */
export function piecesOfDesign(design: unknown, material: { name: string; thickness: number; kerf: number }): RevisionPieces {
  const parsed = parseDesign(withBriefMaterial(design, material).doc);
  if (!parsed.ok) return { ok: false, error: `The design could not be read: ${parsed.errors[0]?.message ?? 'unknown problem'}.` };
  try {
    return { ok: true, pieces: buildPieces(parsed.design).pieces };
  } catch (e) {
    return { ok: false, error: `The pieces could not be built: ${e instanceof Error ? e.message : String(e)}.` };
  }
}

/** The pieces of revision `revisionId` (cached). An unknown revision is `ok: false`. */
export function piecesOfRevision(ds: DataSource, revisionId: number): RevisionPieces {
  const row = rawDb(ds)
    .prepare(
      `SELECT r.design, m.id AS material_id, m.name, m.thickness, m.kerf FROM revisions r JOIN submissions s ON s.id = r.submission_id
         JOIN briefs b ON b.id = s.brief_id JOIN materials m ON m.id = b.material_id WHERE r.id = ?`,
    )
    .get(revisionId) as { design: string; material_id: number; name: string; thickness: number; kerf: number } | undefined;
  if (!row) return { ok: false, error: 'There is no revision with this id.' };
  const key = `${revisionId}:${row.material_id}:${row.thickness}:${row.kerf}`;
  const hit = cache.get(key);
  if (hit) {
    cache.delete(key);
    cache.set(key, hit);
    return hit;
  }
  let design: unknown;
  try {
    design = JSON.parse(row.design);
  } catch {
    design = null;
  }
  const built = piecesOfDesign(design, { name: row.name, thickness: row.thickness, kerf: row.kerf });
  cache.set(key, built);
  while (cache.size > PIECE_CACHE_SIZE) cache.delete(cache.keys().next().value!);
  return built;
}

/** Empties the cache (tests). */
export function clearPieceCache(): void {
  cache.clear();
}
