/**
 * Orbits of planes under a rotation group (FORMAT.md §1 families, §2 replication).
 */
import type { RotationGroup } from './groups.js';
import { type Mat3, apply } from './mat3.js';
import { type PlaneFrame, planeFrame } from './frames.js';
import { type Vec3, dot, normalize, sameDirection, scale } from './vec.js';
import { LENGTH_TOL } from './tolerance.js';

/** A 2 × 2 linear map [a, b, c, d] acting as (x, y) → (a x + b y, c x + d y). */
export type Mat2 = readonly [number, number, number, number];

/** One plane of a family's orbit. */
export interface OrbitPlane {
  /** Position in the orbit, 0 for the representative plane. */
  readonly index: number;
  readonly frame: PlaneFrame;
}

/** Where group element g sends the representative plane, and how the motif lands there. */
export interface OrbitImage {
  readonly element: number;
  readonly plane: number;
  /** Linear map from the representative frame's coordinates to the target plane's frame. */
  readonly map: Mat2;
  /** True when the map reverses orientation (offset-0 planes reached with their normal reversed). */
  readonly flips: boolean;
}

export interface PlaneOrbit {
  readonly planes: readonly OrbitPlane[];
  /** One entry per group element, in element order. */
  readonly images: readonly OrbitImage[];
  /** Indices of the elements that map the representative plane onto itself. */
  readonly stabiliser: readonly number[];
}

const DIR_TOL = 1e-7;

/**
 * The orbit of the plane {x : x·n̂ = offset} under `group`. Planes are listed in the order the
 * group's elements first reach them. With offset 0 (within {@link LENGTH_TOL}) the normals n̂ and
 * −n̂ are one plane: the plane keeps the normal that reached it first, and images arriving with the
 * opposite normal are mirrored in its frame (`flips`). The orbit size always divides the order.
 */
export function planeOrbit(group: RotationGroup, normal: Vec3, offset: number): PlaneOrbit {
  const n = normalize(normal);
  const rep = planeFrame(n, offset);
  const throughCentre = Math.abs(offset) <= LENGTH_TOL;
  const planes: OrbitPlane[] = [];
  const images: OrbitImage[] = [];
  for (const e of group.elements) {
    const gn = apply(e.matrix, n);
    let index = planes.findIndex((p) => sameDirection(p.frame.normal, gn, DIR_TOL));
    let reversed = false;
    if (index < 0 && throughCentre) {
      index = planes.findIndex((p) => sameDirection(p.frame.normal, scale(gn, -1), DIR_TOL));
      reversed = index >= 0;
    }
    if (index < 0) {
      index = planes.length;
      planes.push({ index, frame: planeFrame(gn, offset) });
    }
    const target = planes[index].frame;
    const map = frameMap(e.matrix, rep, target);
    images.push({ element: e.index, plane: index, map, flips: reversed });
  }
  const stabiliser = images.filter((im) => im.plane === 0).map((im) => im.element);
  return { planes, images, stabiliser };
}

function frameMap(g: Mat3, from: PlaneFrame, to: PlaneFrame): Mat2 {
  const gu = apply(g, from.u);
  const gv = apply(g, from.v);
  return [dot(gu, to.u), dot(gv, to.u), dot(gu, to.v), dot(gv, to.v)];
}

/** Applies a {@link Mat2} to a point. */
export function applyMat2(m: Mat2, p: readonly [number, number]): [number, number] {
  return [m[0] * p[0] + m[1] * p[1], m[2] * p[0] + m[3] * p[1]];
}
