import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { estimateSheets, fitRotation, fitsSheet, minAreaRect } from '../../shared/engine/sheets.js';
import { convexHull } from '../../shared/engine/hull2.js';
import { planeFrame } from '../../shared/engine/frames.js';
import type { Piece, Template } from '../../shared/engine/model.js';
import type { Vec2 } from '../../shared/engine/vec.js';
import { expectClose } from './support.js';

const rotate = (pts: readonly Vec2[], a: number, t: Vec2 = [0, 0]): Vec2[] =>
  pts.map(([x, y]) => [x * Math.cos(a) - y * Math.sin(a) + t[0], x * Math.sin(a) + y * Math.cos(a) + t[1]]);
const box = (w: number, h: number): Vec2[] => [
  [0, 0],
  [w, 0],
  [w, h],
  [0, h],
];

/** Brute-force extents of a point set when direction θ is laid along x. */
function extents(pts: readonly Vec2[], t: number): [number, number] {
  const c = Math.cos(t);
  const s = Math.sin(t);
  let a0 = Infinity;
  let a1 = -Infinity;
  let b0 = Infinity;
  let b1 = -Infinity;
  for (const [x, y] of pts) {
    const a = x * c + y * s;
    const b = -x * s + y * c;
    a0 = Math.min(a0, a);
    a1 = Math.max(a1, a);
    b0 = Math.min(b0, b);
    b1 = Math.max(b1, b);
  }
  return [a1 - a0, b1 - b0];
}

const coord = fc.integer({ min: -100_000, max: 100_000 }).map((v) => v / 1000);
const point = fc.tuple(coord, coord);
const pointSet = fc.array(point, { minLength: 3, maxLength: 14 }).filter((p) => convexHull(p as Vec2[]).length >= 3);

describe('convexHull', () => {
  it('drops interior and collinear points and runs counter-clockwise', () => {
    const hull = convexHull([
      [0, 0],
      [2, 0],
      [4, 0],
      [4, 4],
      [1, 1],
      [0, 4],
      [2, 4],
    ]);
    expect(hull).toEqual([
      [0, 0],
      [4, 0],
      [4, 4],
      [0, 4],
    ]);
  });
  it('when all points coincide gives one point', () => {
    expect(convexHull([
      [1, 1],
      [1, 1],
      [1, 1],
    ])).toEqual([[1, 1]]);
  });
});

describe('minAreaRect', () => {
  it('gives a rotated rectangle its own size, direction and centre back', () => {
    const a = (27 * Math.PI) / 180;
    const r = minAreaRect(rotate(box(80, 30), a, [12, -5]));
    expectClose(r.width, 80, 1e-9, 'width');
    expectClose(r.height, 30, 1e-9, 'height');
    expectClose(r.angle, a, 1e-12, 'angle');
    // Centre of the box (40, 15) rotated by a, then moved by (12, −5).
    const [cx, cy] = rotate([[40, 15]], a, [12, -5])[0];
    expectClose(r.center[0], cx, 1e-9, 'centre x');
    expectClose(r.center[1], cy, 1e-9, 'centre y');
  });

  it('gives a right triangle with legs 3 and 4 the area 12', () => {
    // On paper: a side flush with a leg gives 4 × 3; flush with the hypotenuse 5 × (12/5). Both 12.
    const r = minAreaRect([
      [0, 0],
      [4, 0],
      [0, 3],
    ]);
    expectClose(r.width * r.height, 12, 1e-9, 'area');
  });

  it('gives a regular hexagon of side 1 a 2 × √3 rectangle', () => {
    // Flush with an edge: corner to corner along it is 2, across the flats √3.
    const hex: Vec2[] = Array.from({ length: 6 }, (_, k) => [Math.cos((k * Math.PI) / 3 + 0.1), Math.sin((k * Math.PI) / 3 + 0.1)]);
    const r = minAreaRect(hex);
    expectClose(r.width, 2, 1e-9, 'width');
    expectClose(r.height, Math.sqrt(3), 1e-9, 'height');
  });

  it('when the points are collinear gives a zero-height rectangle along them', () => {
    const r = minAreaRect([
      [0, 0],
      [3, 4],
      [6, 8],
    ]);
    expectClose(r.width, 10, 1e-12);
    expect(r.height).toBe(0);
    expectClose(r.angle, Math.atan2(4, 3), 1e-12);
  });

  it('when there is one point or none gives a 0 × 0 rectangle', () => {
    expect(minAreaRect([[2, 3]])).toEqual({ width: 0, height: 0, angle: 0, center: [2, 3] });
    expect(minAreaRect([])).toEqual({ width: 0, height: 0, angle: 0, center: [0, 0] });
  });

  it('matches a brute-force search over 0.01° steps and encloses every point', () => {
    fc.assert(
      fc.property(pointSet, (raw) => {
        const pts = raw as Vec2[];
        const r = minAreaRect(pts);
        expect(r.width).toBeGreaterThanOrEqual(r.height);
        let brute = Infinity;
        for (let k = 0; k < 9000; k++) {
          const [w, h] = extents(pts, (k * 0.01 * Math.PI) / 180);
          brute = Math.min(brute, w * h);
        }
        const area = r.width * r.height;
        // The search can only miss the optimum by the area's change over half a step (≤ D²·Δθ).
        const d = Math.max(...pts.flatMap((p) => pts.map((q) => Math.hypot(p[0] - q[0], p[1] - q[1]))));
        expect(area).toBeLessThanOrEqual(brute + 1e-9 * d * d);
        expect(area).toBeGreaterThanOrEqual(brute - d * d * ((0.01 * Math.PI) / 180));
        // Every point lies inside the rectangle.
        const [w, h] = extents(pts, r.angle);
        expect(w).toBeLessThanOrEqual(r.width + 1e-9 * d);
        expect(h).toBeLessThanOrEqual(r.height + 1e-9 * d);
        const c = Math.cos(r.angle);
        const s = Math.sin(r.angle);
        for (const [x, y] of pts) {
          const u = (x - r.center[0]) * c + (y - r.center[1]) * s;
          const v = -(x - r.center[0]) * s + (y - r.center[1]) * c;
          expect(Math.abs(u)).toBeLessThanOrEqual(r.width / 2 + 1e-9 * d);
          expect(Math.abs(v)).toBeLessThanOrEqual(r.height / 2 + 1e-9 * d);
        }
      }),
      { numRuns: 60 },
    );
  });
});

describe('fitsSheet', () => {
  it('when the rectangle plus kerf touches the sheet exactly, it fits; one kerf more and it does not', () => {
    expect(fitsSheet({ width: 99.8, height: 49.8 }, [100, 50], 0.2)).toBe(true);
    expect(fitsSheet({ width: 100, height: 50 }, [100, 50], 0.2)).toBe(false);
  });
  it('turns a piece by 90° when that fits', () => {
    expect(fitsSheet({ width: 50, height: 100 }, [100, 50], 0)).toBe(true);
  });
  it('finds a diagonal fit for a long thin piece (130 × 5 in 100 × 100: at 45° both extents are 135/√2 ≈ 95.5)', () => {
    expect(fitsSheet({ width: 130, height: 5 }, [100, 100], 0)).toBe(true);
  });
  it('rejects 145 × 5 in 100 × 100 (both extents ≤ 100 would need cos²+sin² ≤ 0.89)', () => {
    expect(fitsSheet({ width: 145, height: 5 }, [100, 100], 0)).toBe(false);
  });
});

describe('fitRotation', () => {
  it('agrees with a sampled search: a sampled fit is found, and a returned angle really fits', () => {
    const sheetFactor = fc.tuple(fc.double({ min: 0.5, max: 1.3, noNaN: true }), fc.double({ min: 0.3, max: 1.2, noNaN: true }));
    fc.assert(
      fc.property(pointSet, sheetFactor, (raw, [fw, fh]) => {
        const pts = raw as Vec2[];
        const r = minAreaRect(pts);
        const sheet: [number, number] = [r.width * fw + 1, r.width * fh + 1];
        const kerf = 0.5;
        const t = fitRotation(pts, sheet, kerf);
        let sampled = false;
        for (let k = 0; k < 3600 && !sampled; k++) {
          const [w, h] = extents(pts, (k * 0.05 * Math.PI) / 180);
          sampled = w + kerf <= sheet[0] && h + kerf <= sheet[1];
        }
        if (sampled) expect(t).toBeDefined();
        if (t !== undefined) {
          const [w, h] = extents(pts, t);
          expect(w + kerf).toBeLessThanOrEqual(sheet[0] + 1e-6);
          expect(h + kerf).toBeLessThanOrEqual(sheet[1] + 1e-6);
        }
      }),
      { numRuns: 300 },
    );
  });
});

const FRAME = planeFrame([0, 0, 1], 50);
function piece(id: string, outer: Vec2[], template = 0, holes: Vec2[][] = []): Piece {
  return { id, motif: 'm', family: 'f', plane: 0, frame: FRAME, polygon: { outer, holes }, elements: [0], map: [1, 0, 0, 1], template };
}
function templatesOf(pieces: readonly Piece[]): Template[] {
  const by = new Map<number, string[]>();
  for (const p of pieces) by.set(p.template, [...(by.get(p.template) ?? []), p.id]);
  return [...by].map(([index, ids]) => ({ index, representative: ids[0], pieces: ids, count: ids.length }));
}
const copies = (n: number, w: number, h: number, template = 0, prefix = 'p'): Piece[] =>
  Array.from({ length: n }, (_, k) => piece(`${prefix}-${String(k + 1).padStart(2, '0')}`, rotate(box(w, h), k * 0.3), template));

describe('estimateSheets', () => {
  it('puts four 290 × 190 pieces on one 600 × 400 sheet (2 × 293 ≤ 597, 2 × 193 ≤ 397) and a fifth on a second', () => {
    const four = copies(4, 290, 190);
    const one = estimateSheets(four, templatesOf(four), { sheet: [600, 400], kerf: 0 });
    expect(one.findings).toEqual([]);
    expect(one.estimate).toEqual({ size: [600, 400], count: 1, utilization: 0.918 }); // 4·290·190 / 240000
    const five = copies(5, 290, 190);
    expect(estimateSheets(five, templatesOf(five), { sheet: [600, 400], kerf: 0 }).estimate?.count).toBe(2);
  });

  it('keeps the part gap between parts and from the edge: 297 × 197 fit four to a sheet only without it', () => {
    const four = copies(4, 297, 197);
    expect(estimateSheets(four, templatesOf(four), { sheet: [600, 400], kerf: 0, partGap: 0 }).estimate?.count).toBe(1);
    // With 3 mm: each takes 300 × 200 in a 597 × 397 field, so two fit per sheet at best.
    expect(estimateSheets(four, templatesOf(four), { sheet: [600, 400], kerf: 0 }).estimate?.count).toBe(2);
  });

  it('adds the kerf to each piece: 298 × 198 with a 2.5 mm kerf behave like 300 × 200', () => {
    const four = copies(4, 298, 198);
    expect(estimateSheets(four, templatesOf(four), { sheet: [600, 400], kerf: 0, partGap: 0 }).estimate?.count).toBe(1);
    expect(estimateSheets(four, templatesOf(four), { sheet: [600, 400], kerf: 2.5, partGap: 0 }).estimate?.count).toBe(2);
  });

  it('reports a piece that fits in no rotation, names it, and leaves it out of the estimate', () => {
    // 650 × 100 in 600 × 400: on paper the best tilt still needs cos² + sin² ≤ 0.954, so no fit.
    const small = copies(2, 100, 100, 0, 'cap');
    const big = copies(3, 650, 100, 1, 'rib');
    const all = [...small, ...big];
    const r = estimateSheets(all, templatesOf(all), { sheet: [600, 400], kerf: 0.2 });
    expect(r.findings).toHaveLength(1);
    const f = r.findings[0];
    expect(f.code).toBe('piece-exceeds-sheet');
    expect(f.severity).toBe('error');
    expect(f.pieces).toEqual(['rib-01', 'rib-02', 'rib-03']);
    expect(f.message).toContain('650.2 × 100.2 mm');
    expect(f.message).toContain('600 × 400 mm');
    expect(f.message).toContain('left out');
    expect(f.message).toMatch(/larger sheet/);
    // Only the two caps are nested: 2 · 100² / 240000.
    expect(r.estimate).toEqual({ size: [600, 400], count: 1, utilization: 0.083 });
  });

  it('gives a piece that fits only diagonally a sheet of its own instead of an error', () => {
    // 640 × 40 in 600 × 400: both extents fit near 32° (cos² + sin² can reach 1.14 ≥ 1).
    const diag = [piece('long-01', box(640, 40), 0), piece('sq-01', box(100, 100), 1)];
    const r = estimateSheets(diag, templatesOf(diag), { sheet: [600, 400], kerf: 0 });
    expect(r.findings).toEqual([]);
    expect(r.estimate?.count).toBe(2);
  });

  it('subtracts holes from the utilization', () => {
    const holed = [piece('ring-01', box(200, 200), 0, [[[50, 50], [50, 150], [150, 150], [150, 50]]])];
    expect(estimateSheets(holed, templatesOf(holed), { sheet: [600, 400], kerf: 0 }).estimate?.utilization).toBe(0.125);
  });

  it('reports sheet-limit-exceeded when the estimate needs more sheets than the brief allows', () => {
    const five = copies(5, 290, 190);
    const r = estimateSheets(five, templatesOf(five), { sheet: [600, 400], kerf: 0, maxSheets: 1 });
    expect(r.estimate?.count).toBe(2);
    expect(r.findings.map((f) => f.code)).toEqual(['sheet-limit-exceeded']);
    expect(r.findings[0].message).toContain('needs 2 sheets');
    expect(r.findings[0].message).toContain('allows 1');
    expect(estimateSheets(five, templatesOf(five), { sheet: [600, 400], kerf: 0, maxSheets: 2 }).findings).toEqual([]);
  });

  it('when there are no pieces uses no sheets', () => {
    expect(estimateSheets([], [], { sheet: [600, 400], kerf: 0.2 })).toEqual({
      estimate: { size: [600, 400], count: 0, utilization: 0 },
      findings: [],
    });
  });

  it('when the options are unusable gives no estimate and a finding naming the field', () => {
    const p = copies(1, 10, 10);
    const bad = estimateSheets(p, templatesOf(p), { sheet: [600, -1], kerf: 0.2 });
    expect(bad.estimate).toBeUndefined();
    expect(bad.findings[0].message).toContain('constraints.sheet');
    expect(estimateSheets(p, templatesOf(p), { sheet: [600, 400], kerf: Number.NaN }).findings[0].message).toContain('material.kerf');
    expect(estimateSheets(p, templatesOf(p), { sheet: [600, 400], kerf: 0, maxSheets: 1.5 }).findings[0].message).toContain('maxSheets');
  });

  it('measures a piece outside any listed template on its own', () => {
    const p = [piece('odd-01', box(290, 190), 7)];
    expect(estimateSheets(p, [], { sheet: [600, 400], kerf: 0 }).estimate?.count).toBe(1);
  });
});
