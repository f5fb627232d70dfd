// Polygon primitives. Areas of rectangles, triangles and L-shapes are worked out by hand in each
// case; the union and congruence cases use shapes whose answers follow from the construction.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  assemblePolygon,
  congruent,
  locateInPolygon,
  locateInRing,
  nearlySamePolygon,
  normalizePolygon,
  polygonArea,
  removeNearDuplicates,
  samePolygon,
  segmentsIntersect,
  signedArea,
  transformPolygon,
  unionPolygons,
  validatePolygon,
} from '../../shared/engine/polygons.js';
import type { Polygon2, Ring } from '../../shared/engine/model.js';
import { expectClose } from './support.js';

const rect = (x0: number, y0: number, x1: number, y1: number): Ring => [[x0, y0], [x1, y0], [x1, y1], [x0, y1]];
const poly = (outer: Ring, holes: readonly Ring[] = []): Polygon2 => ({ outer, holes });
const rot = (deg: number): [number, number, number, number] => {
  const a = (deg * Math.PI) / 180;
  return [Math.cos(a), -Math.sin(a), Math.sin(a), Math.cos(a)];
};

describe('signedArea', () => {
  it('is positive for a counter-clockwise rectangle and negative when reversed', () => {
    expect(signedArea(rect(0, 0, 4, 3))).toBe(12);
    expect(signedArea(rect(0, 0, 4, 3).slice().reverse())).toBe(-12);
  });
  it('keeps precision far from the origin', () => {
    expectClose(signedArea(rect(9999, 9999, 9999.5, 10000)), 0.5, 1e-9);
  });
  it('is 0 for fewer than three points', () => {
    expect(signedArea([[0, 0], [1, 1]])).toBe(0);
  });
});

describe('polygonArea', () => {
  it('subtracts holes', () => {
    expect(polygonArea(poly(rect(0, 0, 10, 10), [rect(2, 2, 4, 4)]))).toBe(96);
  });
});

describe('removeNearDuplicates', () => {
  it('drops points closer than 0.001 mm and a repeated closing point', () => {
    const r = removeNearDuplicates([[0, 0], [0.0004, 0], [10, 0], [10, 10], [0, 10], [0, 0]]);
    expect(r).toEqual([[0, 0], [10, 0], [10, 10], [0, 10]]);
  });
  it('keeps points 0.002 mm apart', () => {
    expect(removeNearDuplicates([[0, 0], [0.002, 0], [1, 1]]).length).toBe(3);
  });
});

describe('normalizePolygon', () => {
  it('makes the outline counter-clockwise and holes clockwise', () => {
    const p = normalizePolygon(poly(rect(0, 0, 10, 10).slice().reverse(), [rect(2, 2, 4, 4)]));
    expect(signedArea(p.outer)).toBeGreaterThan(0);
    expect(signedArea(p.holes[0])).toBeLessThan(0);
  });
});

describe('transformPolygon', () => {
  it('restores orientation under a mirror', () => {
    const p = transformPolygon(normalizePolygon(poly(rect(0, 0, 2, 1), [rect(0.5, 0.25, 1, 0.75)])), [1, 0, 0, -1]);
    expect(signedArea(p.outer)).toBe(2);
    expect(signedArea(p.holes[0])).toBeLessThan(0);
  });
});

describe('locateInRing / locateInPolygon', () => {
  const sq = rect(0, 0, 10, 10);
  it('when the point is inside, outside or on an edge', () => {
    expect(locateInRing([5, 5], sq)).toBe('inside');
    expect(locateInRing([15, 5], sq)).toBe('outside');
    expect(locateInRing([10, 5], sq)).toBe('boundary');
    expect(locateInRing([10.0009, 5], sq)).toBe('boundary');
    expect(locateInRing([10.002, 5], sq)).toBe('outside');
  });
  it('when the point is in a hole', () => {
    const p = poly(sq, [rect(2, 2, 4, 4)]);
    expect(locateInPolygon([3, 3], p)).toBe('outside');
    expect(locateInPolygon([2, 3], p)).toBe('boundary');
    expect(locateInPolygon([6, 6], p)).toBe('inside');
  });
});

describe('segmentsIntersect', () => {
  it('when the segments cross', () => expect(segmentsIntersect([0, 0], [2, 2], [0, 2], [2, 0])).toBe(true));
  it('when they are parallel and apart', () => expect(segmentsIntersect([0, 0], [2, 0], [0, 1], [2, 1])).toBe(false));
  it('when one ends within the tolerance of the other', () => expect(segmentsIntersect([0, 0], [2, 0], [1, 0.0008], [1, 1])).toBe(true));
  it('when one ends just beyond the tolerance', () => expect(segmentsIntersect([0, 0], [2, 0], [1, 0.0015], [1, 1])).toBe(false));
  it('when they overlap collinearly', () => expect(segmentsIntersect([0, 0], [2, 0], [1, 0], [3, 0])).toBe(true));
});

describe('validatePolygon', () => {
  it('accepts a square with a hole', () => {
    expect(validatePolygon(normalizePolygon(poly(rect(0, 0, 10, 10), [rect(2, 2, 4, 4)])))).toEqual([]);
  });
  it('when the outline is a bow-tie', () => {
    const p = validatePolygon(poly([[0, 0], [10, 0], [0, 10], [10, 10]]));
    expect(p[0].message).toMatch(/crosses itself near \(5, 5\)/);
  });
  it('when the outline touches itself at a vertex', () => {
    // A notch whose tip reaches the opposite edge.
    const p = validatePolygon(poly([[0, 0], [10, 0], [10, 10], [5, 0.0005], [0, 10]]));
    expect(p.length).toBeGreaterThan(0);
    expect(p[0].message).toMatch(/touches itself/);
  });
  it('when two vertices coincide (figure of eight)', () => {
    const p = validatePolygon(poly([[0, 0], [5, 5], [10, 0], [10, 10], [5, 5], [0, 10]]));
    expect(p.length).toBeGreaterThan(0);
  });
  it('when a zero-width spike folds back', () => {
    const p = validatePolygon(poly([[0, 0], [10, 0], [20, 0], [10, 0.0001], [10, 10], [0, 10]]));
    expect(p.length).toBeGreaterThan(0);
  });
  it('when the points are collinear', () => {
    expect(validatePolygon(poly([[0, 0], [5, 0], [10, 0]]))[0].message).toMatch(/no area/);
  });
  it('when there are fewer than 3 points', () => {
    expect(validatePolygon(poly([[0, 0], [5, 0]]))[0].message).toMatch(/at least 3/);
  });
  it('when a hole crosses the outline', () => {
    const p = validatePolygon(poly(rect(0, 0, 10, 10), [rect(8, 2, 12, 4)]));
    expect(p[0].message).toMatch(/hole 1 crosses the outline/);
    expect(p[0].ring).toBe(0);
  });
  it('when a hole touches the outline', () => {
    expect(validatePolygon(poly(rect(0, 0, 10, 10), [rect(2, 0, 4, 4)])).length).toBeGreaterThan(0);
  });
  it('when a hole lies outside the outline', () => {
    expect(validatePolygon(poly(rect(0, 0, 10, 10), [rect(20, 2, 24, 4)]))[0].message).toMatch(/not inside/);
  });
  it('when one hole lies inside another', () => {
    expect(validatePolygon(poly(rect(0, 0, 10, 10), [rect(1, 1, 9, 9), rect(3, 3, 4, 4)]))[0].message).toMatch(/inside hole/);
  });
  it('when two holes overlap', () => {
    expect(validatePolygon(poly(rect(0, 0, 10, 10), [rect(1, 1, 5, 5), rect(4, 4, 8, 8)]))[0].message).toMatch(/hole 2 crosses hole 1/);
  });
  it('checks a 5,000-point circle in reasonable work (no quadratic blow-up on a valid ring)', () => {
    const ring: [number, number][] = [];
    for (let i = 0; i < 5000; i++) ring.push([100 * Math.cos((2 * Math.PI * i) / 5000), 100 * Math.sin((2 * Math.PI * i) / 5000)]);
    expect(validatePolygon(poly(ring))).toEqual([]);
  });
});

describe('assemblePolygon', () => {
  it('takes the largest ring as the outline whatever the order', () => {
    const r = assemblePolygon([rect(2, 2, 4, 4), rect(0, 0, 10, 10)]);
    expect(r.ok && polygonArea(r.polygon)).toBe(96);
  });
  it('when two rings lie side by side', () => {
    const r = assemblePolygon([rect(0, 0, 10, 10), rect(20, 0, 30, 10)]);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors[0]).toMatch(/2 separate closed outlines/);
  });
});

describe('unionPolygons', () => {
  it('merges two overlapping squares into one L-free region of the right area', () => {
    const r = unionPolygons([poly(rect(0, 0, 10, 10)), poly(rect(5, 5, 15, 15))]);
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect(r.regions.length).toBe(1);
      expectClose(polygonArea(r.regions[0]), 175, 1e-9);
      expect(signedArea(r.regions[0].outer)).toBeGreaterThan(0);
    }
  });
  it('keeps disjoint squares apart', () => {
    const r = unionPolygons([poly(rect(0, 0, 1, 1)), poly(rect(5, 5, 6, 6))]);
    expect(r.ok && r.regions.length).toBe(2);
  });
  it('makes a ring of four bars into a region with a hole', () => {
    const r = unionPolygons([poly(rect(0, 0, 10, 2)), poly(rect(8, 0, 10, 10)), poly(rect(0, 8, 10, 10)), poly(rect(0, 0, 2, 10))]);
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect(r.regions.length).toBe(1);
      expect(r.regions[0].holes.length).toBe(1);
      expectClose(polygonArea(r.regions[0]), 100 - 36, 1e-9);
      expect(signedArea(r.regions[0].holes[0])).toBeLessThan(0);
    }
  });
});

describe('samePolygon / nearlySamePolygon', () => {
  it('when the start vertex differs', () => {
    expect(samePolygon(poly(rect(0, 0, 2, 1)), poly([[2, 0], [2, 1], [0, 1], [0, 0]]))).toBe(true);
  });
  it('when a ring has extra points along its edges', () => {
    const a = poly(rect(0, 0, 2, 1));
    const b = poly([[0, 0], [1, 0], [2, 0], [2, 1], [0, 1]]);
    expect(samePolygon(a, b)).toBe(false);
    expect(nearlySamePolygon(a, b, 0.01)).toBe(true);
  });
  it('when the shapes differ by more than the tolerance', () => {
    expect(nearlySamePolygon(poly(rect(0, 0, 2, 1)), poly(rect(0, 0, 2, 1.1)), 0.05)).toBe(false);
  });
});

describe('congruent', () => {
  const L = normalizePolygon(poly([[0, 0], [6, 0], [6, 2], [2, 2], [2, 5], [0, 5]], [rect(0.5, 0.5, 1.5, 1.5)]));
  it('when one is a rotated and moved copy', () => {
    const b = transformPolygon(L, rot(37), 100, -40);
    expect(congruent(L, b)).toBe(true);
  });
  it('when one is a mirror image (the part turned over)', () => {
    expect(congruent(L, transformPolygon(L, [-1, 0, 0, 1], 3, 3))).toBe(true);
  });
  it('when the hole is elsewhere', () => {
    const other = normalizePolygon(poly(L.outer, [rect(0.5, 3, 1.5, 4)]));
    expect(congruent(L, other)).toBe(false);
  });
  it('when the outlines differ by 0.01 mm', () => {
    const other = normalizePolygon(poly([[0, 0], [6.01, 0], [6.01, 2], [2, 2], [2, 5], [0, 5]], L.holes));
    expect(congruent(L, other)).toBe(false);
  });
  it('ignores collinear extra points', () => {
    expect(congruent(poly(rect(0, 0, 4, 2)), poly([[0, 0], [2, 0], [4, 0], [4, 2], [0, 2]]))).toBe(true);
  });
  it('holds for random rigid motions of a random star (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 5, max: 50, noNaN: true }), { minLength: 5, maxLength: 12 }),
        fc.double({ min: 0, max: 360, noNaN: true }),
        fc.boolean(),
        fc.double({ min: -500, max: 500, noNaN: true }),
        (radii, deg, mirror, shift) => {
          const n = radii.length;
          const star = normalizePolygon(poly(radii.map((r, i) => [r * Math.cos((2 * Math.PI * i) / n), r * Math.sin((2 * Math.PI * i) / n)])));
          const m = rot(deg);
          const mm: [number, number, number, number] = mirror ? [m[0], -m[1], m[2], -m[3]] : m;
          return congruent(star, transformPolygon(star, mm, shift, -shift));
        },
      ),
      { numRuns: 100 },
    );
  });
});
