// Revision thumbnails drawn in software from the viewer's scene data. The expected pictures are
// worked out by hand from the designs: where a plate must appear, which plate is in front from
// which side, and which rotations of the picture must leave a symmetric design's silhouette
// unchanged (a rotation of the model about the line of sight turns its orthographic image by
// the same angle — elementary projective geometry, no source needed beyond that).
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseDesign, parseDesignText } from '../../shared/engine/design.js';
import type { ResolvedDesign } from '../../shared/engine/model.js';
import { FAMILY_COLOURS, PAPER, rgbOf } from '../../shared/engine/palette.js';
import { type Scene, sceneOfDesign } from '../../shared/engine/scene.js';
import { isModelThumbnailFileName, modelThumbnailFileName, renderThumbnail, type ThumbnailImage, type ThumbnailOptions } from '../../shared/engine/thumbnail.js';
import type { Vec3 } from '../../shared/engine/vec.js';

function load(url: URL): ResolvedDesign {
  const r = parseDesignText(readFileSync(url, 'utf8'));
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r.design;
}
const fixture = (name: string) => sceneOfDesign(load(new URL(`../fixtures/designs/${name}.json`, import.meta.url)));
const demo = (name: string) => sceneOfDesign(load(new URL(`../../server/seed/designs/${name}.json`, import.meta.url)));

const paper = rgbOf(PAPER);
const isPaper = (img: ThumbnailImage, i: number): boolean => img.data[4 * i] === paper[0] && img.data[4 * i + 1] === paper[1] && img.data[4 * i + 2] === paper[2];

/** 1 where the picture shows the model (any pixel that is not exactly the paper), else 0. */
function mask(img: ThumbnailImage): Uint8Array {
  const m = new Uint8Array(img.width * img.height);
  for (let i = 0; i < m.length; i++) m[i] = isPaper(img, i) ? 0 : 1;
  return m;
}

/** Share of model pixels that land on background when the mask is turned by `deg` about the image centre (nearest pixel). */
function rotationMismatch(img: ThumbnailImage, deg: number): number {
  const m = mask(img);
  const { width: W, height: H } = img;
  const c = Math.cos((deg * Math.PI) / 180);
  const s = Math.sin((deg * Math.PI) / 180);
  let model = 0;
  let off = 0;
  for (let py = 0; py < H; py++) {
    for (let px = 0; px < W; px++) {
      if (!m[py * W + px]) continue;
      model++;
      const dx = px + 0.5 - W / 2;
      const dy = py + 0.5 - H / 2;
      const qx = Math.floor(W / 2 + c * dx - s * dy);
      const qy = Math.floor(H / 2 + s * dx + c * dy);
      if (qx < 0 || qy < 0 || qx >= W || qy >= H || !m[qy * W + qx]) off++;
    }
  }
  return off / model;
}

function modelBox(img: ThumbnailImage): { x0: number; x1: number; y0: number; y1: number; count: number; cx: number; cy: number } {
  const m = mask(img);
  let x0 = Infinity, x1 = -Infinity, y0 = Infinity, y1 = -Infinity, count = 0, sx = 0, sy = 0;
  for (let py = 0; py < img.height; py++) {
    for (let px = 0; px < img.width; px++) {
      if (!m[py * img.width + px]) continue;
      count++;
      sx += px + 0.5;
      sy += py + 0.5;
      x0 = Math.min(x0, px);
      x1 = Math.max(x1, px);
      y0 = Math.min(y0, py);
      y1 = Math.max(y1, py);
    }
  }
  return { x0, x1, y0, y1, count, cx: sx / count, cy: sy / count };
}

const pixel = (img: ThumbnailImage, px: number, py: number): [number, number, number] => {
  const o = 4 * (py * img.width + px);
  return [img.data[o], img.data[o + 1], img.data[o + 2]];
};

/** Is `rgb` family colour `base` darkened or lightened by one factor (flat shading), within rounding? */
function isShadeOf(rgb: readonly number[], base: readonly number[]): boolean {
  const k = (rgb[0] * base[0] + rgb[1] * base[1] + rgb[2] * base[2]) / (base[0] ** 2 + base[1] ** 2 + base[2] ** 2);
  return rgb.every((v, i) => Math.abs(v - Math.min(255, k * base[i])) <= 1.5);
}

/** Two square plates on horizontal planes, z = +10 (family "upper", 40 mm) and z = −10 ("lower", 80 mm), under C1. */
function stackedPlates(): Scene {
  const square = (h: number) => [[-h, -h], [h, -h], [h, h], [-h, h]];
  const r = parseDesign({
    format: 'planewright/design@1',
    title: 'Two stacked plates',
    symmetry: 'C1',
    material: { name: 'Birch plywood', thickness: 3 },
    families: [
      { id: 'upper', normal: [0, 0, 1], offset: 10 },
      { id: 'lower', normal: [0, 0, -1], offset: 10 },
    ],
    motifs: [
      { id: 'small', family: 'upper', outline: square(20) },
      { id: 'large', family: 'lower', outline: square(40) },
    ],
  });
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return sceneOfDesign(r.design);
}

const hard: ThumbnailOptions = { supersample: 1, outline: false };

describe('renderThumbnail', () => {
  it('draws the model on the paper: about a third of the keel lantern is model, the corners are paper', () => {
    const img = renderThumbnail(demo('i-keel-lantern'));
    expect([img.width, img.height, img.data.length]).toEqual([320, 240, 320 * 240 * 4]);
    expect(img.pieces).toBe(80);
    const m = mask(img);
    const share = m.reduce((s, v) => s + v, 0) / m.length;
    expect(share, `model share ${share}`).toBeGreaterThan(0.2);
    expect(share).toBeLessThan(0.8);
    for (const [x, y] of [[0, 0], [319, 0], [0, 239], [319, 239]]) expect(pixel(img, x, y)).toEqual([...paper]);
    for (let i = 3; i < img.data.length; i += 4) if (img.data[i] !== 255) throw new Error(`alpha ${img.data[i]} at byte ${i}`);
  });

  it('centres the model and fits it inside the frame (bounding sphere over 92 % of the shorter side)', () => {
    for (const scene of [demo('i-keel-lantern'), fixture('o-cube-plates'), demo('o-facet-lamp')]) {
      const img = renderThumbnail(scene, hard);
      const b = modelBox(img);
      // The sphere's image is a disc of radius 0.46 · 240 = 110 px about the centre; the model lies in it.
      expect(b.x0).toBeGreaterThanOrEqual(160 - 111);
      expect(b.x1).toBeLessThanOrEqual(160 + 111);
      expect(b.y0).toBeGreaterThanOrEqual(120 - 111);
      expect(b.y1).toBeLessThanOrEqual(120 + 111);
      // Box and centroid of the silhouette near the centre (these designs are symmetric about the origin).
      expect(Math.abs((b.x0 + b.x1 + 1) / 2 - 160), 'box centre x').toBeLessThan(6);
      expect(Math.abs((b.y0 + b.y1 + 1) / 2 - 120), 'box centre y').toBeLessThan(6);
      expect(Math.abs(b.cx - 160), 'centroid x').toBeLessThan(6);
      expect(Math.abs(b.cy - 120), 'centroid y').toBeLessThan(6);
      // And it fills the frame: wider than half the shorter side.
      expect(b.x1 - b.x0).toBeGreaterThan(120);
    }
  });

  it('an empty scene gives the plain paper', () => {
    const r = parseDesign({ format: 'planewright/design@1', title: 'Empty', symmetry: 'C1', material: { name: 'Card', thickness: 1 }, families: [{ id: 'f', axis: 1, offset: 0 }], motifs: [] });
    if (!r.ok) throw new Error(JSON.stringify(r.errors));
    const img = renderThumbnail(sceneOfDesign(r.design), { width: 16, height: 12 });
    expect(mask(img).every((v) => v === 0)).toBe(true);
    expect(img.triangles).toBe(0);
  });

  it('colours every model pixel as a shade of its family colour, each family its own', () => {
    const scene = fixture('d4-fins-deck');
    expect(scene.families).toEqual(['deck', 'fins']);
    const img = renderThumbnail(scene, hard);
    const deck = rgbOf(FAMILY_COLOURS[0]);
    const fins = rgbOf(FAMILY_COLOURS[1]);
    let ofDeck = 0;
    let ofFins = 0;
    for (let i = 0; i < img.width * img.height; i++) {
      if (isPaper(img, i)) continue;
      const rgb = [img.data[4 * i], img.data[4 * i + 1], img.data[4 * i + 2]];
      const d = isShadeOf(rgb, deck);
      const f = isShadeOf(rgb, fins);
      expect(d || f, `pixel ${i % img.width},${Math.floor(i / img.width)} is [${rgb}], a shade of neither family`).toBe(true);
      if (d) ofDeck++;
      if (f) ofFins++;
    }
    expect(ofDeck).toBeGreaterThan(500);
    expect(ofFins).toBeGreaterThan(500);
  });

  it('keeps the nearer plate in front: from above the small upper plate covers the centre, from below the large lower one', () => {
    const scene = stackedPlates();
    const upper = rgbOf(FAMILY_COLOURS[0]);
    const lower = rgbOf(FAMILY_COLOURS[1]);
    const above = renderThumbnail(scene, { ...hard, width: 101, height: 101, direction: [0, 0, 1] });
    const below = renderThumbnail(scene, { ...hard, width: 101, height: 101, direction: [0, 0, -1] });
    expect(isShadeOf(pixel(above, 50, 50), upper), `centre from above ${pixel(above, 50, 50)}`).toBe(true);
    expect(isShadeOf(pixel(below, 50, 50), lower), `centre from below ${pixel(below, 50, 50)}`).toBe(true);
    // The lower plate's rim shows round the upper plate from above: half-way out along a side.
    // Sphere radius = √(40² + 40² + 10²) + 3 ≈ 60.4 mm onto 46.5 px: 30 mm out is about 23 px.
    expect(isShadeOf(pixel(above, 50 + 23, 50), lower), `rim from above ${pixel(above, 73, 50)}`).toBe(true);
    expect(isShadeOf(pixel(below, 50 + 23, 50), lower)).toBe(true);
  });

  it('a design with a 4-fold axis seen along it gives a silhouette unchanged by a quarter turn (and not by an eighth)', () => {
    const opts = { ...hard, width: 200, height: 200, direction: [0, 0, 1] as Vec3 };
    const d4 = renderThumbnail(fixture('d4-fins-deck'), opts);
    expect(rotationMismatch(d4, 90), 'D4 quarter turn').toBeLessThan(0.01);
    expect(rotationMismatch(d4, 180), 'D4 half turn').toBeLessThan(0.01);
    // A square deck turned by 45° leaves its corners on background: the check can fail.
    expect(rotationMismatch(d4, 45), 'D4 eighth turn').toBeGreaterThan(0.05);
    const cube = renderThumbnail(fixture('o-cube-plates'), opts);
    expect(rotationMismatch(cube, 90), 'cube quarter turn').toBeLessThan(0.01);
  });

  it('a design under O seen along a 3-fold axis gives a silhouette unchanged by a third of a turn', () => {
    const img = renderThumbnail(demo('o-facet-lamp'), { ...hard, width: 240, height: 240, direction: [1, 1, 1] });
    expect(rotationMismatch(img, 120), 'third turn').toBeLessThan(0.02);
    expect(rotationMismatch(img, 240), 'two thirds').toBeLessThan(0.02);
  });

  it('is deterministic: the same scene gives the same bytes; another view gives others', () => {
    const scene = demo('i-keel-lantern');
    const a = renderThumbnail(scene);
    const b = renderThumbnail(demo('i-keel-lantern'));
    expect(Buffer.from(a.data).equals(Buffer.from(b.data))).toBe(true);
    const c = renderThumbnail(scene, { direction: [0, 0, 1] });
    expect(Buffer.from(a.data).equals(Buffer.from(c.data))).toBe(false);
  });

  it('the outline and the supersampling change the picture but not where the model is', () => {
    const scene = fixture('o-cube-plates');
    const plain = renderThumbnail(scene, hard);
    const inked = renderThumbnail(scene, { supersample: 1, outline: true });
    const smooth = renderThumbnail(scene);
    expect(Buffer.from(plain.data).equals(Buffer.from(inked.data))).toBe(false);
    const bp = modelBox(plain);
    const bs = modelBox(smooth);
    expect(Math.abs(bp.cx - bs.cx)).toBeLessThan(1.5);
    expect(Math.abs(bp.cy - bs.cy)).toBeLessThan(1.5);
    expect(Math.abs(bp.count - bs.count) / bp.count).toBeLessThan(0.05);
  });

  it('refuses sizes it cannot draw, naming the option', () => {
    const scene = fixture('o-cube-plates');
    expect(() => renderThumbnail(scene, { width: 0 })).toThrow(/width/);
    expect(() => renderThumbnail(scene, { height: 1.5 })).toThrow(/height/);
    expect(() => renderThumbnail(scene, { supersample: 9 })).toThrow(/supersample/);
    expect(() => renderThumbnail(scene, { direction: [0, 0, 0] })).toThrow(/direction/);
  });
});

describe('model thumbnail file names', () => {
  it('never match a photo thumbnail name', () => {
    const name = modelThumbnailFileName('0123456789ab');
    expect(name).toBe('model-view-0123456789ab.png');
    expect(isModelThumbnailFileName(name)).toBe(true);
    for (const photo of ['model-view-0123456789ab-thumbnail.png', 'lamp-thumbnail.jpg', 'model-view-0123456789ab.png-thumbnail.png']) expect(isModelThumbnailFileName(photo)).toBe(false);
    expect(() => modelThumbnailFileName('xyz')).toThrow(/12 lower-case hex/);
  });
});
