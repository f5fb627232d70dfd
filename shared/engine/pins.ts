/**
 * Where a critic's pin sits on a model, and where it goes when the design changes.
 *
 * A pin is anchored to one piece: a point in the piece's own 2-D frame and the side of the slab
 * (+1: the face along the plane's normal, −1: the face against it). Anchors are plain numbers, so
 * they survive a re-render, a reload and a new revision; the world position is recomputed from the
 * piece's frame each time.
 *
 * Choices (the project's own):
 * - Orbit pins: the copies of a pin on the other pieces of its motif are the anchor carried by
 *   the pieces' maps (motif frame → piece frame, orthogonal, so the inverse is the transpose). A
 *   map that mirrors (det −1) turns the slab over, so the side flips with it.
 * - Carry-over to a new revision: the pin follows a piece of the same motif on the same plane
 *   (same family normal; the offset may change, it moves the plane but not its 2-D frame) whose
 *   outline still holds the point, within {@link PIN_ON_PIECE_TOL}. Among several such pieces
 *   (a motif split into regions) the one with the pin's piece id wins, then the first. Anything
 *   else leaves the pin on its revision, outdated, with the reason.
 */
import { type PlaneFrame, signedDistance, toFrame, toWorld } from './frames.js';
import type { Piece } from './model.js';
import type { Mat2 } from './orbits.js';
import { locateInPolygon } from './polygons.js';
import { UNIT_TOL } from './tolerance.js';
import type { Vec2, Vec3 } from './vec.js';

/** How far (mm) outside a piece's outline a pin's point may lie and still count as on it. */
export const PIN_ON_PIECE_TOL = 0.5;

export type PinSide = 1 | -1;

export interface PinAnchor {
  readonly piece: string;
  readonly point: Vec2;
  readonly side: PinSide;
}

/** The anchor of a pin placed where a ray hit `piece` at `world` (a point on or in the slab). */
export function anchorAt(piece: Pick<Piece, 'id' | 'frame'>, world: Vec3): PinAnchor {
  const point = toFrame(piece.frame, world);
  return { piece: piece.id, point, side: signedDistance(piece.frame, world) < 0 ? -1 : 1 };
}

/** The pin's point in the world: on the face of the slab (`thickness` mm) it was placed on. */
export function pinWorldPosition(frame: PlaneFrame, anchor: Pick<PinAnchor, 'point' | 'side'>, thickness: number): Vec3 {
  const p = toWorld(frame, anchor.point);
  const h = (anchor.side * thickness) / 2;
  return [p[0] + frame.normal[0] * h, p[1] + frame.normal[1] * h, p[2] + frame.normal[2] * h];
}

const apply = (m: Mat2, p: Vec2): Vec2 => [m[0] * p[0] + m[1] * p[1], m[2] * p[0] + m[3] * p[1]];
const applyInverse = (m: Mat2, p: Vec2): Vec2 => [m[0] * p[0] + m[2] * p[1], m[1] * p[0] + m[3] * p[1]];
const mirrors = (m: Mat2): boolean => m[0] * m[3] - m[1] * m[2] < 0;

/**
 * The anchor on every piece of the pin's motif (the pin's own piece first), for an orbit pin's
 * markers. Copies whose point falls off their piece (a motif merged differently on a plane it
 * meets itself on) are left out. Unknown piece: an empty list.
 */
export function orbitAnchors(pieces: readonly Piece[], anchor: PinAnchor): PinAnchor[] {
  const own = pieces.find((p) => p.id === anchor.piece);
  if (!own) return [];
  const motifPoint = applyInverse(own.map, anchor.point);
  const motifSide: PinSide = mirrors(own.map) ? (-anchor.side as PinSide) : anchor.side;
  const out: PinAnchor[] = [{ piece: own.id, point: anchor.point, side: anchor.side }];
  for (const p of pieces) {
    if (p.motif !== own.motif || p.id === own.id) continue;
    const point = apply(p.map, motifPoint);
    if (locateInPolygon(point, p.polygon, PIN_ON_PIECE_TOL) === 'outside') continue;
    out.push({ piece: p.id, point, side: mirrors(p.map) ? (-motifSide as PinSide) : motifSide });
  }
  return out;
}

export type CarryResult =
  | { readonly carried: true; readonly anchor: PinAnchor }
  | { readonly carried: false; readonly reason: 'piece-unknown' | 'motif-gone' | 'plane-gone' | 'point-off-piece'; readonly message: string };

const sameDirection = (a: Vec3, b: Vec3): boolean => a[0] * b[0] + a[1] * b[1] + a[2] * b[2] > 1 - UNIT_TOL;

/**
 * Where a pin anchored on `from` (the pieces of its revision) sits on the next revision's
 * `to` pieces, or why it stays behind. See the module notes for the rule.
 */
export function carryPin(from: readonly Piece[], to: readonly Piece[], anchor: PinAnchor): CarryResult {
  const old = from.find((p) => p.id === anchor.piece);
  if (!old) return { carried: false, reason: 'piece-unknown', message: `Piece ${anchor.piece} is not in the revision the pin was on.` };
  const sameMotif = to.filter((p) => p.motif === old.motif);
  if (sameMotif.length === 0) return { carried: false, reason: 'motif-gone', message: `The new revision has no motif ${old.motif}.` };
  const samePlane = sameMotif.filter((p) => p.plane === old.plane && sameDirection(p.frame.normal, old.frame.normal));
  if (samePlane.length === 0) {
    return { carried: false, reason: 'plane-gone', message: `Motif ${old.motif} no longer has a piece on the plane ${anchor.piece} was on.` };
  }
  const holding = samePlane.filter((p) => locateInPolygon(anchor.point, p.polygon, PIN_ON_PIECE_TOL) !== 'outside');
  if (holding.length === 0) {
    return { carried: false, reason: 'point-off-piece', message: `The pinned point is no longer on ${anchor.piece}: its outline changed there.` };
  }
  const next = holding.find((p) => p.id === anchor.piece) ?? holding[0];
  return { carried: true, anchor: { piece: next.id, point: anchor.point, side: anchor.side } };
}
