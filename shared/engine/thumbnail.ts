/**
 * A still picture of a design's model from the same scene data the 3-D viewer draws
 * ({@link Scene}): every piece's slab (its template geometry placed by the instance matrix),
 * rasterised in software into an RGBA buffer. Pure arithmetic: no DOM, no Node, no GPU, and the
 * same scene always gives the same bytes.
 *
 * Choices (the project's own):
 * - Orthographic view along a fixed direction (by default the viewer's opening direction, from
 *   the front, the right and above), up along +z, framed on the scene's bounding sphere so every
 *   piece fits whatever way the model turns.
 * - Flat shading: each triangle's face normal against one light that comes from over the
 *   viewer's left shoulder, plus an ambient share, so caps and side walls read apart; colour by
 *   family from the palette the viewer uses ({@link familyColour}) on the paper background.
 * - Slabs are closed and wound outwards (see scene.ts), so triangles facing away are culled; a
 *   depth buffer decides what is in front; pixel centres are sampled (a triangle covers a pixel
 *   when the centre is inside or on its edge).
 * - A thin ink outline where a pixel's neighbour shows another piece or the background; then a
 *   `supersample`-fold box filter (default 2) smooths the edges.
 */
import { familyColour, INK, PAPER, rgbOf } from './palette.js';
import type { Scene } from './scene.js';
import { type Vec3, cross, dot, normalize } from './vec.js';

/** Default size of a revision thumbnail (pixels). */
export const THUMBNAIL_WIDTH = 320;
export const THUMBNAIL_HEIGHT = 240;

/**
 * Bumped whenever the picture a scene gives changes (view, light, colours, size), so cached
 * thumbnails made by an older renderer are made again.
 */
export const THUMBNAIL_RENDERER_VERSION = 1;

/** The viewer's opening view direction (from the model's centre towards the eye). */
export const THUMBNAIL_DIRECTION: Vec3 = /* @__PURE__ */ normalize([0.62, -0.78, 0.48]);

export interface ThumbnailOptions {
  readonly width?: number;
  readonly height?: number;
  /** Samples per pixel along each axis (1 to 4); 1 gives hard edges. Default 2. */
  readonly supersample?: number;
  /** From the model's centre towards the eye; any non-zero vector. Default {@link THUMBNAIL_DIRECTION}. */
  readonly direction?: Vec3;
  /** Thin ink outline round each piece. Default true. */
  readonly outline?: boolean;
  /** Share of the shorter image side the bounding sphere's diameter fills. Default 0.92. */
  readonly fill?: number;
}

/** An RGBA picture, row by row from the top left, 4 bytes a pixel, alpha always 255. */
export interface ThumbnailImage {
  readonly width: number;
  readonly height: number;
  readonly data: Uint8ClampedArray;
  /** Triangles drawn (facing the eye) and pieces placed, for the benchmark and tests. */
  readonly triangles: number;
  readonly pieces: number;
}

/** Ambient share of the light; the rest comes from the key light by n · l. */
const AMBIENT = 0.42;
/** Share the ink outline covers a pixel it crosses. */
const OUTLINE_ALPHA = 0.7;

function checkSize(name: string, v: number, max: number): number {
  if (!Number.isInteger(v) || v < 1 || v > max) throw new RangeError(`${name} must be a whole number from 1 to ${max}, got ${v}`);
  return v;
}

/**
 * Renders `scene` into a `width` × `height` RGBA picture (see the module notes). An empty scene
 * (no pieces) gives the plain paper background. Bad sizes throw a RangeError naming the option.
 */
export function renderThumbnail(scene: Scene, options: ThumbnailOptions = {}): ThumbnailImage {
  const width = checkSize('width', options.width ?? THUMBNAIL_WIDTH, 4096);
  const height = checkSize('height', options.height ?? THUMBNAIL_HEIGHT, 4096);
  const ss = checkSize('supersample', options.supersample ?? 2, 4);
  const outline = options.outline ?? true;
  const fill = options.fill ?? 0.92;
  if (!(fill > 0 && fill <= 1)) throw new RangeError(`fill must be more than 0 and at most 1, got ${fill}`);
  const dirIn = options.direction ?? THUMBNAIL_DIRECTION;
  if (!(Math.hypot(dirIn[0], dirIn[1], dirIn[2]) > 0)) throw new RangeError('direction must be a non-zero vector');

  const W = width * ss;
  const H = height * ss;
  const paper = rgbOf(PAPER);
  const ink = rgbOf(INK);
  // Hi-res buffers: colour (RGB), depth (towards the eye is larger), piece (instance number + 1, 0 = background).
  const colour = new Uint8Array(W * H * 3);
  for (let i = 0; i < W * H; i++) {
    colour[3 * i] = paper[0];
    colour[3 * i + 1] = paper[1];
    colour[3 * i + 2] = paper[2];
  }
  const depth = new Float32Array(W * H).fill(-Infinity);
  const owner = new Int32Array(W * H);

  // View basis: z towards the eye, x to the right, y up on the image; up is +z unless the view
  // looks (almost) straight along z, then +y.
  const z = normalize(dirIn);
  const upHint: Vec3 = Math.abs(z[2]) > 0.999 ? [0, 1, 0] : [0, 0, 1];
  const x = normalize(cross(upHint, z));
  const y = cross(z, x);
  // Light from over the viewer's left shoulder, in view coordinates.
  const light = normalize([-0.45, 0.6, 0.66]);

  const c = scene.center;
  const scale = scene.radius > 0 ? (fill * Math.min(W, H)) / (2 * scene.radius) : 0;
  const cx = W / 2;
  const cy = H / 2;

  let triangles = 0;
  let pieces = 0;
  if (scale > 0) {
    let scratch = new Float64Array(0);
    for (const mesh of scene.meshes) {
      const P = mesh.geometry.positions;
      const I = mesh.geometry.indices;
      const nv = P.length / 3;
      if (scratch.length < nv * 3) scratch = new Float64Array(nv * 3);
      for (const inst of mesh.instances) {
        pieces++;
        const id = pieces;
        const base = rgbOf(familyColour(inst.family));
        const m = inst.matrix;
        // Rows of (view ∘ placement): screen x, screen y (down), view depth.
        const rx = [0, 0, 0, 0];
        const ry = [0, 0, 0, 0];
        const rz = [0, 0, 0, 0];
        for (let k = 0; k < 3; k++) {
          const col: Vec3 = [m[4 * k], m[4 * k + 1], m[4 * k + 2]];
          rx[k] = dot(x, col) * scale;
          ry[k] = -dot(y, col) * scale;
          rz[k] = dot(z, col);
        }
        const t: Vec3 = [m[12] - c[0], m[13] - c[1], m[14] - c[2]];
        rx[3] = dot(x, t) * scale + cx;
        ry[3] = -dot(y, t) * scale + cy;
        rz[3] = dot(z, t);
        for (let v = 0; v < nv; v++) {
          const px = P[3 * v];
          const py = P[3 * v + 1];
          const pz = P[3 * v + 2];
          scratch[3 * v] = rx[0] * px + rx[1] * py + rx[2] * pz + rx[3];
          scratch[3 * v + 1] = ry[0] * px + ry[1] * py + ry[2] * pz + ry[3];
          scratch[3 * v + 2] = rz[0] * px + rz[1] * py + rz[2] * pz + rz[3];
        }
        for (let k = 0; k < I.length; k += 3) {
          const a = 3 * I[k];
          const b = 3 * I[k + 1];
          const d = 3 * I[k + 2];
          if (drawTriangle(scratch, a, b, d, scale, light, base, id, W, H, colour, depth, owner)) triangles++;
        }
      }
    }
  }

  if (outline) {
    // Ink where the right or lower neighbour belongs to another piece (or the background): the
    // nearer of the two pixels takes it, so the line sits on the front piece's edge.
    for (let py = 0; py < H; py++) {
      for (let px = 0; px < W; px++) {
        const i = py * W + px;
        const o = owner[i];
        let edge = false;
        if (px + 1 < W && owner[i + 1] !== o) edge = depth[i] >= depth[i + 1];
        if (!edge && py + 1 < H && owner[i + W] !== o) edge = depth[i] >= depth[i + W];
        if (!edge && o !== 0 && px > 0 && owner[i - 1] !== o) edge = depth[i] > depth[i - 1];
        if (!edge && o !== 0 && py > 0 && owner[i - W] !== o) edge = depth[i] > depth[i - W];
        if (!edge || o === 0) continue;
        for (let ch = 0; ch < 3; ch++) colour[3 * i + ch] = Math.round(colour[3 * i + ch] + (ink[ch] - colour[3 * i + ch]) * OUTLINE_ALPHA);
      }
    }
  }

  const data = new Uint8ClampedArray(width * height * 4);
  const n = ss * ss;
  for (let py = 0; py < height; py++) {
    for (let px = 0; px < width; px++) {
      let r = 0;
      let g = 0;
      let b = 0;
      for (let sy = 0; sy < ss; sy++) {
        let j = ((py * ss + sy) * W + px * ss) * 3;
        for (let sx = 0; sx < ss; sx++, j += 3) {
          r += colour[j];
          g += colour[j + 1];
          b += colour[j + 2];
        }
      }
      const o = 4 * (py * width + px);
      data[o] = Math.round(r / n);
      data[o + 1] = Math.round(g / n);
      data[o + 2] = Math.round(b / n);
      data[o + 3] = 255;
    }
  }
  return { width, height, data, triangles, pieces };
}

/**
 * Fills one triangle (screen x, screen y downwards, depth towards the eye, read from `s` at
 * offsets a, b, c) where it is nearer than what is drawn. False when it faces away or is
 * degenerate (nothing drawn).
 */
function drawTriangle(
  s: Float64Array,
  a: number,
  b: number,
  c: number,
  scale: number,
  light: Vec3,
  base: readonly [number, number, number],
  id: number,
  W: number,
  H: number,
  colour: Uint8Array,
  depth: Float32Array,
  owner: Int32Array,
): boolean {
  const ax = s[a], ay = s[a + 1], az = s[a + 2];
  const bx = s[b], by = s[b + 1], bz = s[b + 2];
  const qx = s[c], qy = s[c + 1], qz = s[c + 2];
  // Twice the signed area on the image (y down): facing the eye means clockwise here.
  const area = (bx - ax) * (qy - ay) - (by - ay) * (qx - ax);
  if (!(area < 0)) return false;
  // Face normal in view coordinates (x right, y up, z towards the eye) for the shading.
  const ux = (bx - ax) / scale, uy = -(by - ay) / scale, uz = bz - az;
  const vx = (qx - ax) / scale, vy = -(qy - ay) / scale, vz = qz - az;
  const nx = uy * vz - uz * vy;
  const ny = uz * vx - ux * vz;
  const nz = ux * vy - uy * vx;
  const nl = Math.hypot(nx, ny, nz);
  if (!(nl > 0)) return false;
  const lambert = Math.max(0, (nx * light[0] + ny * light[1] + nz * light[2]) / nl);
  const shade = AMBIENT + (1 - AMBIENT) * lambert;
  const r = Math.min(255, Math.round(base[0] * shade));
  const g = Math.min(255, Math.round(base[1] * shade));
  const bl = Math.min(255, Math.round(base[2] * shade));
  // Depth as a plane over the image: z = z0 + dzdx·x + dzdy·y.
  const inv = 1 / area;
  const dzdx = ((bz - az) * (qy - ay) - (qz - az) * (by - ay)) * inv;
  const dzdy = ((qz - az) * (bx - ax) - (bz - az) * (qx - ax)) * inv;
  const y0 = Math.max(0, Math.ceil(Math.min(ay, by, qy) - 0.5));
  const y1 = Math.min(H - 1, Math.floor(Math.max(ay, by, qy) - 0.5));
  if (y0 > y1) return true;
  // Edge functions e(x, y) = A·x + B·y + C, all ≤ 0 inside (clockwise on the image).
  const A0 = ay - by, B0 = bx - ax, C0 = ax * by - ay * bx;
  const A1 = by - qy, B1 = qx - bx, C1 = bx * qy - by * qx;
  const A2 = qy - ay, B2 = ax - qx, C2 = qx * ay - qy * ax;
  const eps = 1e-9 * Math.abs(area);
  for (let py = y0; py <= y1; py++) {
    const yc = py + 0.5;
    let lo = -Infinity;
    let hi = Infinity;
    // Each edge bounds x on one side: A·x + (B·y + C) ≤ 0.
    let empty = false;
    for (let e = 0; e < 3 && !empty; e++) {
      const A = e === 0 ? A0 : e === 1 ? A1 : A2;
      const K = (e === 0 ? B0 * yc + C0 : e === 1 ? B1 * yc + C1 : B2 * yc + C2) - eps;
      if (A > 0) hi = Math.min(hi, -K / A);
      else if (A < 0) lo = Math.max(lo, -K / A);
      else if (K > 0) empty = true;
    }
    if (empty || lo > hi) continue;
    const x0 = Math.max(0, Math.ceil(lo - 0.5));
    const x1 = Math.min(W - 1, Math.floor(hi - 0.5));
    let zr = az + dzdx * (x0 + 0.5 - ax) + dzdy * (yc - ay);
    let i = py * W + x0;
    for (let px = x0; px <= x1; px++, i++, zr += dzdx) {
      if (zr <= depth[i]) continue;
      depth[i] = zr;
      owner[i] = id;
      colour[3 * i] = r;
      colour[3 * i + 1] = g;
      colour[3 * i + 2] = bl;
    }
  }
  return true;
}

/**
 * The name a stored model thumbnail carries among a revision's files (role `thumbnail`, which
 * photo thumbnails share): `model-view-<key>.png`, where `key` (12 lower-case hex digits) names
 * what it was drawn from. A photo's thumbnail is always called `<photo>-thumbnail.<ext>`, so the
 * two never share a name.
 */
export function modelThumbnailFileName(key: string): string {
  if (!/^[0-9a-f]{12}$/.test(key)) throw new RangeError(`a model thumbnail key is 12 lower-case hex digits, got ${key}`);
  return `model-view-${key}.png`;
}

/** True for the name of a stored model thumbnail (see {@link modelThumbnailFileName}). */
export function isModelThumbnailFileName(name: string): boolean {
  return /^model-view-[0-9a-f]{12}\.png$/.test(name);
}
