// SVG path flattening. Path command semantics follow the SVG 2 specification, "Paths" chapter
// (path data grammar, implementation notes for elliptical arcs); the circle figures are
// π·r² and the chord (sagitta) bound r·(1 − cos(θ/2)) of elementary geometry.
import { describe, expect, it } from 'vitest';
import { CHORD_TOL, flattenSvgPath, svgPathToPolygon } from '../../shared/engine/svg-path.js';
import { polygonArea, signedArea } from '../../shared/engine/polygons.js';
import type { Ring } from '../../shared/engine/model.js';
import { expectClose } from './support.js';

function rings(d: string): Ring[] {
  const r = flattenSvgPath(d);
  if (!r.ok) throw new Error(r.errors.join('; '));
  return r.rings;
}

function maxDistanceBetween(a: Ring, b: Ring): number {
  // Largest distance from a vertex of a to the nearest vertex of b (same sampling → tiny).
  return Math.max(...a.map((p) => Math.min(...b.map((q) => Math.hypot(p[0] - q[0], p[1] - q[1])))));
}

/** Worst distance of any chord midpoint and vertex from the circle (centre c, radius r). */
function worstCircleError(ring: Ring, cx: number, cy: number, r: number): number {
  let worst = 0;
  for (let i = 0; i < ring.length; i++) {
    const p = ring[i];
    const q = ring[(i + 1) % ring.length];
    worst = Math.max(worst, Math.abs(Math.hypot(p[0] - cx, p[1] - cy) - r));
    const mx = (p[0] + q[0]) / 2;
    const my = (p[1] + q[1]) / 2;
    worst = Math.max(worst, Math.abs(Math.hypot(mx - cx, my - cy) - r));
  }
  return worst;
}

describe('flattenSvgPath', () => {
  describe('a full circle of radius 20 from two arcs', () => {
    const d = 'M -20 0 A 20 20 0 1 0 20 0 A 20 20 0 1 0 -20 0 Z';
    const [ring] = rings(d);
    it('has every vertex and every chord midpoint within 0.05 mm of the circle', () => {
      expect(worstCircleError(ring, 0, 0, 20)).toBeLessThanOrEqual(CHORD_TOL);
    });
    it('has an area between π·20² minus perimeter × 0.05 and π·20²', () => {
      const a = Math.abs(signedArea(ring));
      expect(a).toBeLessThanOrEqual(Math.PI * 400);
      expect(a).toBeGreaterThanOrEqual(Math.PI * 400 - 2 * Math.PI * 20 * CHORD_TOL);
    });
    it('uses no more chords than needed for a much finer bound (not over-sampled by 10×)', () => {
      // Chords for sagitta 0.05 on r = 20: θ = 2·acos(1 − 0.05/20) ≈ 0.1414 rad → ≥ 45 chords.
      expect(ring.length).toBeGreaterThanOrEqual(45);
      expect(ring.length).toBeLessThan(450);
    });
  });

  it('gives the same ring for relative and absolute commands', () => {
    const abs = rings('M 10 10 L 50 10 C 60 10 70 20 70 30 Q 70 50 50 50 A 10 10 0 0 1 30 50 H 10 V 10 Z')[0];
    const rel = rings('m 10 10 l 40 0 c 10 0 20 10 20 20 q 0 20 -20 20 a 10 10 0 0 1 -20 0 h -20 v -40 z')[0];
    expect(rel.length).toBe(abs.length);
    expect(maxDistanceBetween(abs, rel)).toBeLessThan(1e-9);
  });

  it('expands smooth cubic S like the equivalent C with the reflected control point', () => {
    const s = rings('M 0 0 C 0 10 10 10 10 0 S 20 -10 20 0 L 20 -20 L 0 -20 Z')[0];
    const c = rings('M 0 0 C 0 10 10 10 10 0 C 10 -10 20 -10 20 0 L 20 -20 L 0 -20 Z')[0];
    expect(maxDistanceBetween(s, c)).toBeLessThan(1e-9);
  });

  it('expands smooth quadratic T like the equivalent Q', () => {
    const t = rings('M 0 0 Q 10 10 20 0 T 40 0 L 40 -20 L 0 -20 Z')[0];
    const q = rings('M 0 0 Q 10 10 20 0 Q 30 -10 40 0 L 40 -20 L 0 -20 Z')[0];
    expect(maxDistanceBetween(t, q)).toBeLessThan(1e-9);
  });

  it('keeps a cubic within 0.05 mm of the true curve (dense sampling as the reference)', () => {
    const [ring] = rings('M 0 0 C 0 80 100 80 100 0 Z');
    const bez = (t: number) => {
      const u = 1 - t;
      return [3 * u * u * t * 0 + 3 * u * t * t * 100 + t * t * t * 100, 3 * u * u * t * 80 + 3 * u * t * t * 80];
    };
    let worst = 0;
    for (let k = 0; k <= 2000; k++) {
      const p = bez(k / 2000);
      let best = Infinity;
      for (let i = 0; i < ring.length; i++) {
        const a = ring[i];
        const b = ring[(i + 1) % ring.length];
        const dx = b[0] - a[0];
        const dy = b[1] - a[1];
        const t = Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / (dx * dx + dy * dy)));
        best = Math.min(best, Math.hypot(p[0] - a[0] - t * dx, p[1] - a[1] - t * dy));
      }
      worst = Math.max(worst, best);
    }
    expect(worst).toBeLessThanOrEqual(CHORD_TOL);
  });

  it('draws a straight line for an arc with radius 0 (SVG 2 arc implementation notes)', () => {
    const [ring] = rings('M 0 0 A 0 5 0 0 1 10 0 L 10 10 Z');
    expect(ring.length).toBe(3);
  });

  it('scales up radii too small to reach the end point (SVG 2 arc notes): a half circle of radius 10', () => {
    const [ring] = rings('M -10 0 A 1 1 0 0 1 10 0 Z');
    expectClose(Math.abs(signedArea(ring)), (Math.PI * 100) / 2, Math.PI * 10 * CHORD_TOL);
  });

  it('closes a subpath whose last point returns to its start without Z', () => {
    expect(rings('M 0 0 L 10 0 L 10 10 L 0 0').length).toBe(1);
  });

  it('starts a new subpath after Z at the previous start', () => {
    const r = rings('M 0 0 L 10 0 L 10 10 Z L -10 0 L -10 -10 Z');
    expect(r.length).toBe(2);
    expect(r[1][0]).toEqual([0, 0]);
  });

  it('applies a transform before flattening', () => {
    const r = flattenSvgPath('M 0 0 L 1 0 L 1 1 Z', { transform: [10, 0, 0, 10, 5, 5] });
    expect(r.ok && r.rings[0]).toEqual([[5, 5], [15, 5], [15, 15]]);
  });

  describe('when the input is bad', () => {
    it.each([
      ['', /empty/],
      ['L 10 10', /start with/],
      ['M 0 0 L 10 0 L 10 10', /subpath 1 is open/],
      ['M 0 0 L 10 x', /path data/],
      ['M 0 0 L 1e400 0 L 0 1 Z', /non-finite|beyond/],
      ['M 0 0 L 20000 0 L 0 1 Z', /beyond ±10000/],
      ['M 0 0', /no closed shape/],
      ['M 0 0 A 5 5 0 2 1 10 0 Z', /arc flag/],
    ])('%j', (d, msg) => {
      const r = flattenSvgPath(d);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.errors.join(' ')).toMatch(msg);
    });
    it('stops when the curve would need too many points', () => {
      const r = flattenSvgPath('M -9000 0 A 9000 9000 0 1 0 9000 0 A 9000 9000 0 1 0 -9000 0 Z', { tolerance: 1e-6 });
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.errors[0]).toMatch(/more than 20000 points/);
    });
  });
});

describe('svgPathToPolygon', () => {
  it('treats inner subpaths as holes whatever the drawing order', () => {
    const r = svgPathToPolygon('M 2 2 h 2 v 2 h -2 Z M 0 0 h 10 v 10 h -10 Z');
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect(r.polygon.holes.length).toBe(1);
      expect(polygonArea(r.polygon)).toBe(96);
    }
  });
  it('refuses two outlines side by side', () => {
    const r = svgPathToPolygon('M 0 0 h 10 v 10 h -10 Z M 20 0 h 10 v 10 h -10 Z');
    expect(r.ok).toBe(false);
  });
  it('refuses a self-crossing path', () => {
    const r = svgPathToPolygon('M 0 0 L 10 10 L 10 0 L 0 10 Z');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors[0]).toMatch(/crosses itself/);
  });
});
