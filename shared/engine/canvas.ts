/**
 * Drawing templates (FORMAT.md §6 `canvas`): an SVG of one family's representative plane to draw
 * its motif on in any vector editor, and the importer that reads the drawn motif back.
 *
 * The template's user units are the plane's frame in millimetres with y flipped (SVG y runs down,
 * the frame's y runs up): the user point (X, Y) is the frame point (X, −Y), and `width`/`height`
 * are given in mm so 1 user unit prints as 1 mm. The root also carries
 * `data-planewright-page="left top width height"`: the frame coordinates of the page's top-left
 * corner and the page size in mm. Editors that rewrite the file in pixels keep the page and the
 * drawing's place on it, so the importer maps through the page, not the user units, and a page
 * whose size no longer matches (a file saved at 90 px per inch and read at 96, or a resized
 * page) is refused with a message instead of giving a silently scaled motif.
 *
 * Choices: the traces of the other planes are drawn across the whole page, not clipped to the
 * envelope's outline — every plane of a design bounds the envelope, so inside the outline a trace
 * could only be one of its edges; the pieces cross along the traces outside it. The motif layer is
 * a `<g id="motif">` marked `data-planewright-layer="motif"` with a `<title>`; no editor-specific
 * namespace is written.
 */
import { parseSync, type INode } from 'svgson';
import { EnvelopeError, envelopeOfFamilies, sectionOutline } from './envelope.js';
import { planeFrame } from './frames.js';
import { getGroup } from './groups.js';
import type { Polygon2, ResolvedDesign } from './model.js';
import { planeOrbit } from './orbits.js';
import { assemblePolygon, bounds } from './polygons.js';
import { type Affine, CHORD_TOL, flattenSvgPath } from './svg-path.js';
import { DEG } from './tolerance.js';
import type { Vec2 } from './vec.js';

/** Unknown family id (the only way {@link drawingTemplate} fails on a resolved design). */
export class CanvasError extends Error {
  override readonly name = 'CanvasError';
}

/** Where the page sits in the plane's frame: frame coordinates of its top-left corner, size in mm. */
export interface PageLayout {
  readonly left: number;
  readonly top: number;
  readonly width: number;
  readonly height: number;
}

/** One line where another plane of the design meets this family's plane. */
export interface Trace {
  readonly family: string;
  /** Plane index in that family's orbit. */
  readonly plane: number;
  readonly from: Vec2;
  readonly to: Vec2;
  readonly angleDeg: number;
  /** Within the angle tolerance of 90°: a joint is possible along this line. */
  readonly perpendicular: boolean;
}

/** What a drawing template shows, before it is written as SVG. */
export interface TemplateContent {
  readonly family: string;
  readonly page: PageLayout;
  /** The envelope cut by the plane (counter-clockwise, frame coordinates), or null. */
  readonly envelope: Vec2[] | null;
  /** Why there is no envelope outline, when there is none. */
  readonly envelopeNote: string | null;
  readonly traces: readonly Trace[];
  /** Existing motifs of this family. */
  readonly motifs: readonly { id: string; polygon: Polygon2 }[];
}

const round10 = (v: number, up: boolean) => (up ? Math.ceil(v / 10) * 10 : Math.floor(v / 10) * 10);

/**
 * The content of the drawing template of `familyId` (see the module comment): the page covers the
 * envelope's outline on the plane and the family's existing motifs with a margin of a quarter of
 * their size (at least 20 mm), on whole centimetres; with neither, ±(1.5 × the largest offset,
 * at least 100 mm). Traces come from every plane of every family except the plane itself and
 * planes parallel to it; coincident traces are drawn once. An envelope that cannot be built
 * (a family through the centre, or families that do not close a solid) gives a note instead.
 * Throws {@link CanvasError} for an unknown family id.
 */
export function templateContent(design: ResolvedDesign, familyId: string): TemplateContent {
  const family = design.families.find((f) => f.id === familyId);
  if (!family) {
    throw new CanvasError(`unknown family "${familyId}" (the families are ${design.families.map((f) => `"${f.id}"`).join(', ')})`);
  }
  const group = getGroup(design.symmetry);
  const frame = planeFrame(family.normal, family.offset);
  let envelope: Vec2[] | null = null;
  let envelopeNote: string | null = null;
  try {
    const env = envelopeOfFamilies(group, design.families.map((f) => ({ normal: f.normal, offset: f.offset, id: f.id })));
    envelope = sectionOutline(env, frame);
    if (!envelope) envelopeNote = 'the envelope does not reach this plane';
  } catch (e) {
    if (!(e instanceof EnvelopeError)) throw e;
    envelopeNote = e.message;
  }
  const motifs = design.motifs.filter((m) => m.family === family.id).map((m) => ({ id: m.id, polygon: m.polygon }));
  const rings = [...(envelope ? [envelope] : []), ...motifs.map((m) => m.polygon.outer)];
  const tolDeg = design.constraints.angleToleranceDeg ?? 0.5;
  const lines = traceLines(design, frame, tolDeg);
  let page: PageLayout;
  if (rings.length) {
    let [x0, y0, x1, y1] = bounds(rings);
    // Reach out to the nearest point of every joint line not too far away: joints are made there.
    const reach = 3 * Math.max(x1 - x0, y1 - y0, 1);
    for (const l of lines) {
      if (!l.perpendicular || Math.abs(l.c) > reach) continue;
      x0 = Math.min(x0, l.a * l.c);
      x1 = Math.max(x1, l.a * l.c);
      y0 = Math.min(y0, l.b * l.c);
      y1 = Math.max(y1, l.b * l.c);
    }
    const margin = Math.max(20, 0.25 * Math.max(x1 - x0, y1 - y0));
    const left = round10(x0 - margin, false);
    const right = round10(x1 + margin, true);
    const bottom = round10(y0 - margin, false);
    const top = round10(y1 + margin, true);
    page = { left, top, width: right - left, height: top - bottom };
  } else {
    const r = round10(Math.max(100, 1.5 * Math.max(...design.families.map((f) => f.offset))), true);
    page = { left: -r, top: r, width: 2 * r, height: 2 * r };
  }

  const traces: Trace[] = [];
  for (const l of lines) {
    const seg = clipLine(l.a, l.b, l.c, page);
    if (seg) traces.push({ family: l.family, plane: l.plane, from: seg[0], to: seg[1], angleDeg: l.angleDeg, perpendicular: l.perpendicular });
  }
  return { family: family.id, page, envelope, envelopeNote, traces, motifs };
}

interface TraceLine {
  family: string;
  plane: number;
  /** The line a·x + b·y = c in the frame, a² + b² = 1. */
  a: number;
  b: number;
  c: number;
  angleDeg: number;
  perpendicular: boolean;
}

/** Lines where the design's other planes meet the plane of `frame` (parallel ones skipped, duplicates once). */
function traceLines(design: ResolvedDesign, frame: ReturnType<typeof planeFrame>, tolDeg: number): TraceLine[] {
  const group = getGroup(design.symmetry);
  const out: TraceLine[] = [];
  const n = frame.normal;
  for (const f of design.families) {
    for (const p of planeOrbit(group, f.normal, f.offset).planes) {
      const m = p.frame.normal;
      const a = m[0] * frame.u[0] + m[1] * frame.u[1] + m[2] * frame.u[2];
      const b = m[0] * frame.v[0] + m[1] * frame.v[1] + m[2] * frame.v[2];
      const len = Math.hypot(a, b);
      if (len < 1e-9) continue; // parallel (or the plane itself)
      let na = a / len;
      let nb = b / len;
      let nc = (f.offset - (m[0] * frame.origin[0] + m[1] * frame.origin[1] + m[2] * frame.origin[2])) / len;
      if (na < -1e-12 || (Math.abs(na) <= 1e-12 && nb < 0)) {
        na = -na;
        nb = -nb;
        nc = -nc;
      }
      if (out.some((s) => Math.abs(s.a - na) < 1e-9 && Math.abs(s.b - nb) < 1e-9 && Math.abs(s.c - nc) < 1e-6)) continue;
      const cos = Math.min(1, Math.abs(m[0] * n[0] + m[1] * n[1] + m[2] * n[2]));
      const angleDeg = Math.acos(cos) / DEG;
      out.push({ family: f.id, plane: p.index, a: na, b: nb, c: nc, angleDeg, perpendicular: Math.abs(90 - angleDeg) <= tolDeg });
    }
  }
  return out;
}

/** The part of the line a·x + b·y = c (a² + b² = 1) inside the page, or null. */
function clipLine(a: number, b: number, c: number, page: PageLayout): [Vec2, Vec2] | null {
  const x0 = page.left;
  const x1 = page.left + page.width;
  const y1 = page.top;
  const y0 = page.top - page.height;
  // Point on the line and its direction.
  const px = a * c;
  const py = b * c;
  const dx = -b;
  const dy = a;
  let t0 = -Infinity;
  let t1 = Infinity;
  const clip = (p: number, d: number, lo: number, hi: number): boolean => {
    if (Math.abs(d) < 1e-15) return p >= lo && p <= hi;
    let ta = (lo - p) / d;
    let tb = (hi - p) / d;
    if (ta > tb) [ta, tb] = [tb, ta];
    t0 = Math.max(t0, ta);
    t1 = Math.min(t1, tb);
    return t0 <= t1;
  };
  if (!clip(px, dx, x0, x1) || !clip(py, dy, y0, y1) || t1 - t0 < 1e-6) return null;
  return [
    [px + t0 * dx, py + t0 * dy],
    [px + t1 * dx, py + t1 * dy],
  ];
}

const num = (v: number): string => {
  const r = Math.round(v * 1e4) / 1e4;
  return Object.is(r, -0) ? '0' : String(r);
};
const esc = (s: string): string => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
/** Frame point → SVG user point (y flipped). */
const P = (p: Vec2): string => `${num(p[0])} ${num(-p[1])}`;

function ringPath(r: readonly Vec2[]): string {
  return r.length ? `M ${r.map(P).join(' L ')} Z` : '';
}

/**
 * The drawing template of one family as SVG text (see the module comment for coordinates): a
 * quiet millimetre grid (1 mm lines, 10 mm major; 5 mm minor lines on pages over 600 mm), the
 * envelope's outline on the plane, the traces of every other plane — perpendicular ones, where
 * joints can be made, as dashed accent lines labelled "joint" — the frame's axes through the
 * family's centre point, the family's existing motifs inside the motif layer (so they import back
 * unchanged), and a title block. Deterministic for a given design. Throws {@link CanvasError} for
 * an unknown family id.
 */
export function drawingTemplate(design: ResolvedDesign, familyId: string): string {
  const t = templateContent(design, familyId);
  const { page } = t;
  const vx = page.left;
  const vy = -page.top;
  const out: string[] = [];
  out.push('<?xml version="1.0" encoding="UTF-8"?>');
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${num(page.width)}mm" height="${num(page.height)}mm" ` +
      `viewBox="${num(vx)} ${num(vy)} ${num(page.width)} ${num(page.height)}" ` +
      `data-planewright-page="${num(page.left)} ${num(page.top)} ${num(page.width)} ${num(page.height)}" data-planewright-family="${esc(t.family)}">`,
  );
  const family = design.families.find((f) => f.id === familyId)!;
  out.push(
    `<title>${esc(`Drawing template: family "${t.family}" of "${design.title}"`)}</title>`,
    `<desc>${esc(
      `Plane of family "${t.family}" (normal ${family.normal.map((x) => num(x)).join(', ')}, offset ${num(family.offset)} mm, symmetry ${design.symmetry}). ` +
        'Units are millimetres; the frame origin is where the axis meets the plane, x to the right, y up. ' +
        'Draw one closed outline (holes inside it allowed) in the layer "motif"; keep the page size.',
    )}</desc>`,
  );
  // Grid.
  const minor = page.width > 600 || page.height > 600 ? 5 : 1;
  const x0 = page.left;
  const x1 = page.left + page.width;
  const y0 = page.top - page.height;
  const y1 = page.top;
  const minorD: string[] = [];
  const majorD: string[] = [];
  for (let x = Math.ceil(x0 / minor) * minor; x <= x1 + 1e-9; x += minor) (Math.abs(x % 10) < 1e-9 ? majorD : minorD).push(`M ${num(x)} ${num(-y1)} V ${num(-y0)}`);
  for (let y = Math.ceil(y0 / minor) * minor; y <= y1 + 1e-9; y += minor) (Math.abs(y % 10) < 1e-9 ? majorD : minorD).push(`M ${num(x0)} ${num(-y)} H ${num(x1)}`);
  out.push('<g id="grid" fill="none" pointer-events="none">');
  out.push(`<rect x="${num(vx)}" y="${num(vy)}" width="${num(page.width)}" height="${num(page.height)}" fill="#fbf8f1" stroke="none"/>`);
  out.push(`<path d="${minorD.join(' ')}" stroke="#e6ddcc" stroke-width="0.1"/>`);
  out.push(`<path d="${majorD.join(' ')}" stroke="#cfc2a8" stroke-width="0.2"/>`);
  out.push(`<path d="M ${num(x0)} 0 H ${num(x1)} M 0 ${num(-y1)} V ${num(-y0)}" stroke="#8a7b62" stroke-width="0.3" stroke-dasharray="4 1 1 1"/>`);
  out.push('</g>');
  // Envelope.
  out.push('<g id="envelope" fill="none" stroke="#2b2620" stroke-width="0.5">');
  if (t.envelope) out.push(`<path d="${ringPath(t.envelope)}"/>`);
  out.push('</g>');
  // Traces.
  out.push('<g id="traces" fill="none" font-family="sans-serif" font-size="3">');
  for (const tr of t.traces) {
    const label = `${tr.family} ${tr.plane + 1}${tr.perpendicular ? ' · joint' : ` · ${tr.angleDeg.toFixed(1)}°`}`;
    const d = `M ${P(tr.from)} L ${P(tr.to)}`;
    if (tr.perpendicular) out.push(`<path class="joint-line" d="${d}" stroke="#1f6f8b" stroke-width="0.45" stroke-dasharray="6 1.5"/>`);
    else out.push(`<path class="trace" d="${d}" stroke="#9a8f80" stroke-width="0.25" stroke-dasharray="0.6 1.2"/>`);
    // Label near the start, inside the page.
    const lx = tr.from[0] + 0.04 * (tr.to[0] - tr.from[0]);
    const ly = tr.from[1] + 0.04 * (tr.to[1] - tr.from[1]);
    out.push(`<text x="${num(lx)}" y="${num(-ly)}" fill="${tr.perpendicular ? '#1f6f8b' : '#7d7366'}" stroke="none">${esc(label)}</text>`);
  }
  out.push('</g>');
  // Title block.
  out.push(
    `<g id="notes" font-family="sans-serif" font-size="3.5" fill="#2b2620"><text x="${num(x0 + 4)}" y="${num(-y1 + 6)}">${esc(
      `${design.title} — family ${t.family} — draw the motif in the layer "motif" (mm, y up)`,
    )}</text>` +
      (t.envelopeNote ? `<text x="${num(x0 + 4)}" y="${num(-y1 + 11)}" font-size="3">${esc(`No envelope outline: ${t.envelopeNote}`)}</text>` : '') +
      '</g>',
  );
  // Motif layer, last so it is on top.
  out.push('<g id="motif" data-planewright-layer="motif" fill="none" stroke="#c2410c" stroke-width="0.4">');
  out.push('<title>motif: draw one closed outline here</title>');
  for (const m of t.motifs) {
    const d = [m.polygon.outer, ...m.polygon.holes].map(ringPath).join(' ');
    out.push(`<path id="motif-${esc(m.id)}" d="${d}"/>`);
  }
  out.push('</g>');
  out.push('</svg>');
  return out.join('\n') + '\n';
}

// ---------------------------------------------------------------------------------------------
// Import

export interface ImportOptions {
  /** Page layout to map through when the file has no `data-planewright-page` (or to override it). */
  readonly page?: PageLayout;
  /** Chord error bound, mm (default 0.05). */
  readonly tolerance?: number;
}

export type ImportResult = { ok: true; rings: Vec2[][]; polygon: Polygon2 } | { ok: false; errors: string[] };

/** Largest SVG text accepted (characters). */
export const MAX_SVG_CHARS = 5 * 1024 * 1024;

const PX_PER: Readonly<Record<string, number>> = {
  // CSS Values and Units Level 3: 1in = 96px, 1cm = 96/2.54 px, 1mm = 1/10 cm, 1pt = 1/72 in, 1pc = 12 pt.
  px: 1,
  in: 96,
  cm: 96 / 2.54,
  mm: 96 / 25.4,
  pt: 96 / 72,
  pc: 16,
};

class ImportError extends Error {}

/** A length with optional unit → CSS px. Percentages and unknown units are errors. */
function lengthPx(text: string | undefined, what: string): number | undefined {
  if (text === undefined) return undefined;
  const m = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(px|in|cm|mm|pt|pc|%|[a-z]+)?\s*$/.exec(text);
  if (!m) throw new ImportError(`${what} "${text}" is not a length`);
  const unit = m[2] ?? 'px';
  if (unit === '%') throw new ImportError(`${what} "${text}" is a percentage, which has no size on paper; give it in mm`);
  const k = PX_PER[unit];
  if (k === undefined) throw new ImportError(`${what} "${text}" has an unknown unit "${unit}"`);
  const v = Number(m[1]) * k;
  if (!Number.isFinite(v)) throw new ImportError(`${what} "${text}" is out of range`);
  return v;
}

function numbers(text: string, what: string): number[] {
  const parts = text.trim().split(/[\s,]+/).filter((s) => s !== '');
  const out = parts.map(Number);
  if (out.some((v) => !Number.isFinite(v))) throw new ImportError(`${what} "${text.slice(0, 60)}" is not a list of numbers`);
  return out;
}

const IDENTITY: Affine = [1, 0, 0, 1, 0, 0];

/** m ∘ n: apply n first, then m (SVG transform lists compose left to right this way). */
function mul(m: Affine, n: Affine): Affine {
  return [
    m[0] * n[0] + m[2] * n[1],
    m[1] * n[0] + m[3] * n[1],
    m[0] * n[2] + m[2] * n[3],
    m[1] * n[2] + m[3] * n[3],
    m[0] * n[4] + m[2] * n[5] + m[4],
    m[1] * n[4] + m[3] * n[5] + m[5],
  ];
}

/**
 * Parses an SVG `transform` attribute: matrix, translate, scale, rotate (with optional centre),
 * skewX, skewY, in a list applied right to left. Unknown functions or bad arguments are errors.
 */
export function parseTransform(text: string): Affine {
  let m: Affine = IDENTITY;
  const re = /\s*([a-zA-Z]+)\s*\(([^)]*)\)\s*,?/y;
  let pos = 0;
  const src = text.trim();
  while (pos < src.length) {
    re.lastIndex = pos;
    const hit = re.exec(src);
    if (!hit) throw new ImportError(`transform "${src.slice(0, 60)}" could not be read`);
    pos = re.lastIndex;
    const name = hit[1];
    const a = numbers(hit[2], `transform ${name}`);
    const need = (ok: boolean) => {
      if (!ok) throw new ImportError(`transform ${name}(${hit[2]}) has the wrong number of arguments`);
    };
    let t: Affine;
    switch (name) {
      case 'matrix':
        need(a.length === 6);
        t = [a[0], a[1], a[2], a[3], a[4], a[5]];
        break;
      case 'translate':
        need(a.length === 1 || a.length === 2);
        t = [1, 0, 0, 1, a[0], a[1] ?? 0];
        break;
      case 'scale':
        need(a.length === 1 || a.length === 2);
        t = [a[0], 0, 0, a[1] ?? a[0], 0, 0];
        break;
      case 'rotate': {
        need(a.length === 1 || a.length === 3);
        const r = a[0] * DEG;
        const c = Math.cos(r);
        const s = Math.sin(r);
        t = [c, s, -s, c, 0, 0];
        if (a.length === 3) t = mul(mul([1, 0, 0, 1, a[1], a[2]], t), [1, 0, 0, 1, -a[1], -a[2]]);
        break;
      }
      case 'skewX':
        need(a.length === 1);
        t = [1, 0, Math.tan(a[0] * DEG), 1, 0, 0];
        break;
      case 'skewY':
        need(a.length === 1);
        t = [1, Math.tan(a[0] * DEG), 0, 1, 0, 0];
        break;
      default:
        throw new ImportError(`transform function "${name}" is not known`);
    }
    m = mul(m, t);
  }
  if (!m.every(Number.isFinite)) throw new ImportError('a transform has numbers out of range');
  return m;
}

/** Root user units → page millimetres (viewBox and preserveAspectRatio honoured). */
function rootViewport(root: INode): { toPage: Affine; scale: [number, number]; widthMm: number; heightMm: number } {
  const a = root.attributes;
  const vb = a.viewBox !== undefined ? numbers(a.viewBox, 'viewBox') : null;
  if (vb && (vb.length !== 4 || !(vb[2] > 0) || !(vb[3] > 0))) throw new ImportError(`viewBox "${a.viewBox}" needs four numbers with positive width and height`);
  const wPx = lengthPx(a.width, 'width') ?? (vb ? vb[2] : undefined);
  const hPx = lengthPx(a.height, 'height') ?? (vb ? vb[3] : undefined);
  if (wPx === undefined || hPx === undefined) throw new ImportError('the drawing has neither width/height nor a viewBox, so its size is unknown');
  if (!(wPx > 0) || !(hPx > 0)) throw new ImportError('the drawing has a zero or negative width or height');
  const mmPerPx = 25.4 / 96;
  const widthMm = wPx * mmPerPx;
  const heightMm = hPx * mmPerPx;
  if (!vb) return { toPage: [mmPerPx, 0, 0, mmPerPx, 0, 0], scale: [mmPerPx, mmPerPx], widthMm, heightMm };
  let sx = widthMm / vb[2];
  let sy = heightMm / vb[3];
  let tx = 0;
  let ty = 0;
  const par = (a.preserveAspectRatio ?? 'xMidYMid meet').trim().split(/\s+/);
  if (par[0] !== 'none') {
    const s = par[1] === 'slice' ? Math.max(sx, sy) : Math.min(sx, sy);
    const align = par[0] ?? 'xMidYMid';
    const ax = /xMin/.test(align) ? 0 : /xMax/.test(align) ? 1 : 0.5;
    const ay = /YMin/.test(align) ? 0 : /YMax/.test(align) ? 1 : 0.5;
    tx = ax * (widthMm - vb[2] * s);
    ty = ay * (heightMm - vb[3] * s);
    sx = s;
    sy = s;
  }
  return { toPage: [sx, 0, 0, sy, tx - vb[0] * sx, ty - vb[1] * sy], scale: [sx, sy], widthMm, heightMm };
}

const SKIP = new Set(['defs', 'clipPath', 'mask', 'symbol', 'marker', 'pattern', 'title', 'desc', 'metadata', 'style', 'script', 'text', 'linearGradient', 'radialGradient', 'filter']);

function hidden(n: INode): boolean {
  const a = n.attributes;
  return a.display === 'none' || a.visibility === 'hidden' || /(^|;)\s*display\s*:\s*none/.test(a.style ?? '');
}

function isMotifLayer(n: INode): boolean {
  return n.attributes.id === 'motif' || n.attributes['data-planewright-layer'] === 'motif';
}

/** Finds the motif layer and the transform from its coordinates to the root's user units. */
function findLayer(n: INode, m: Affine, depth: number): { node: INode; ctm: Affine } | null {
  if (depth > 200) throw new ImportError('the drawing is nested too deeply');
  for (const c of n.children) {
    if (c.type !== 'element' || SKIP.has(c.name)) continue;
    const ctm = c.attributes.transform !== undefined ? mul(m, parseTransform(c.attributes.transform)) : m;
    if (isMotifLayer(c)) return { node: c, ctm };
    const hit = findLayer(c, ctm, depth + 1);
    if (hit) return hit;
  }
  return null;
}

/** Path data of one shape element (in its own user units), or null for elements that draw nothing. */
function shapePath(n: INode): string | null {
  const a = n.attributes;
  const L = (k: string, dflt?: number): number => {
    const v = lengthPx(a[k], `${n.name} ${k}`);
    if (v === undefined) {
      if (dflt === undefined) throw new ImportError(`a ${n.name} has no ${k}`);
      return dflt;
    }
    return v;
  };
  switch (n.name) {
    case 'path':
      if (a.d === undefined || a.d.trim() === '') return null;
      return a.d;
    case 'rect': {
      const x = L('x', 0);
      const y = L('y', 0);
      const w = L('width');
      const h = L('height');
      if (!(w > 0) || !(h > 0)) return null;
      let rx = a.rx !== undefined && a.rx !== 'auto' ? L('rx') : undefined;
      let ry = a.ry !== undefined && a.ry !== 'auto' ? L('ry') : undefined;
      rx ??= ry ?? 0;
      ry ??= rx;
      rx = Math.min(Math.max(0, rx), w / 2);
      ry = Math.min(Math.max(0, ry), h / 2);
      if (rx === 0 || ry === 0) return `M ${x} ${y} H ${x + w} V ${y + h} H ${x} Z`;
      return (
        `M ${x + rx} ${y} H ${x + w - rx} A ${rx} ${ry} 0 0 1 ${x + w} ${y + ry} V ${y + h - ry} ` +
        `A ${rx} ${ry} 0 0 1 ${x + w - rx} ${y + h} H ${x + rx} A ${rx} ${ry} 0 0 1 ${x} ${y + h - ry} V ${y + ry} A ${rx} ${ry} 0 0 1 ${x + rx} ${y} Z`
      );
    }
    case 'circle':
    case 'ellipse': {
      const cx = L('cx', 0);
      const cy = L('cy', 0);
      const rx = n.name === 'circle' ? L('r') : L('rx');
      const ry = n.name === 'circle' ? rx : L('ry');
      if (!(rx > 0) || !(ry > 0)) return null;
      return `M ${cx - rx} ${cy} A ${rx} ${ry} 0 1 0 ${cx + rx} ${cy} A ${rx} ${ry} 0 1 0 ${cx - rx} ${cy} Z`;
    }
    case 'polygon':
    case 'polyline': {
      const v = numbers(a.points ?? '', `${n.name} points`);
      if (v.length < 6 || v.length % 2) throw new ImportError(`a ${n.name} needs at least three x,y pairs`);
      const pts: string[] = [];
      for (let i = 0; i < v.length; i += 2) pts.push(`${v[i]} ${v[i + 1]}`);
      return `M ${pts.join(' L ')}${n.name === 'polygon' ? ' Z' : ''}`;
    }
    case 'line':
      throw new ImportError('the motif layer has a line, which is not a closed outline');
    case 'use':
    case 'image':
    case 'svg':
    case 'foreignObject':
      throw new ImportError(`the motif layer has a ${n.name} element; convert it to a path`);
    default:
      return null;
  }
}

/**
 * Reads the motif drawn in a drawing template's motif layer (a `<g id="motif">`, or any element
 * marked `data-planewright-layer="motif"`) back into the plane's frame, in millimetres, y up.
 *
 * Honoured: `width`/`height` with units (mm, cm, in, pt, pc, px; unitless is px; CSS 1 in = 96
 * px), `viewBox` with `preserveAspectRatio`, nested `transform`s (matrix, translate, scale,
 * rotate, skewX, skewY) on every ancestor and shape; shapes: path, rect (rounded too), circle,
 * ellipse, polygon and closed polyline. Hidden elements and text are skipped.
 *
 * Mapping: through the page (`options.page`, else the file's `data-planewright-page`): the page's
 * top-left corner is frame (left, top) and page millimetres run right and down. If the file's page
 * size differs from the recorded one by more than 0.1 %, the file was rescaled and is refused.
 * With no page recorded, the root's user units are read as the frame itself (user (X, Y) → frame
 * (X, −Y) scaled to mm), which is what an untouched template uses.
 *
 * Returns the rings and the motif polygon (largest ring the outline, the others holes, validated),
 * or errors; never throws.
 */
export function importDrawing(svgText: string, options: ImportOptions = {}): ImportResult {
  try {
    return importUnsafe(svgText, options);
  } catch (e) {
    if (e instanceof ImportError) return { ok: false, errors: [e.message] };
    return { ok: false, errors: [`the drawing could not be read (${e instanceof Error ? e.message : String(e)})`] };
  }
}

function importUnsafe(svgText: string, options: ImportOptions): ImportResult {
  if (typeof svgText !== 'string') return { ok: false, errors: ['the drawing must be SVG text'] };
  if (svgText.length > MAX_SVG_CHARS) return { ok: false, errors: [`the drawing is larger than ${MAX_SVG_CHARS / 1024 / 1024} MB`] };
  if (!/<svg[\s>]/.test(svgText)) return { ok: false, errors: ['this is not an SVG drawing (no <svg> element)'] };
  let root: INode;
  try {
    root = parseSync(svgText);
  } catch {
    return { ok: false, errors: ['the drawing is not well-formed SVG (XML) text'] };
  }
  if (!root || root.name !== 'svg' || !Array.isArray(root.children)) return { ok: false, errors: ['the drawing has no single <svg> root element'] };
  const vp = rootViewport(root);
  let page = options.page;
  if (!page && root.attributes['data-planewright-page'] !== undefined) {
    const v = numbers(root.attributes['data-planewright-page'], 'data-planewright-page');
    if (v.length !== 4 || !(v[2] > 0) || !(v[3] > 0)) throw new ImportError('the data-planewright-page record is damaged; download a new template');
    page = { left: v[0], top: v[1], width: v[2], height: v[3] };
  }
  if (page) {
    const rel = (a: number, b: number) => Math.abs(a - b) / b;
    if (rel(vp.widthMm, page.width) > 1e-3 || rel(vp.heightMm, page.height) > 1e-3) {
      const ratio = vp.widthMm / page.width;
      const hint = Math.abs(ratio - 90 / 96) < 2e-3 ? ' — the ratio 90/96 means it was saved at 90 pixels per inch instead of the standard 96' : '';
      throw new ImportError(
        `the page is ${vp.widthMm.toFixed(2)} × ${vp.heightMm.toFixed(2)} mm but the template was ${page.width} × ${page.height} mm, ` +
          `so the drawing was rescaled${hint}; set the document units to millimetres and keep the page size`,
      );
    }
  }
  const layer = findLayer(root, IDENTITY, 0);
  if (!layer) return { ok: false, errors: ['the drawing has no motif layer (a group with id "motif"); draw in the template\'s motif layer'] };
  const toMm: Affine = page ? vp.toPage : [vp.scale[0], 0, 0, vp.scale[1], 0, 0];
  const rings: Vec2[][] = [];
  const errors: string[] = [];
  const tol = options.tolerance ?? CHORD_TOL;
  let shapes = 0;
  const walk = (n: INode, ctm: Affine, depth: number) => {
    if (depth > 200) throw new ImportError('the drawing is nested too deeply');
    for (const c of n.children) {
      if (c.type !== 'element' || SKIP.has(c.name) || hidden(c)) continue;
      const m = c.attributes.transform !== undefined ? mul(ctm, parseTransform(c.attributes.transform)) : ctm;
      if (c.name === 'g' || c.name === 'a' || c.name === 'switch') {
        walk(c, m, depth + 1);
        continue;
      }
      const d = shapePath(c);
      if (d === null) continue;
      shapes++;
      const flat = flattenSvgPath(d, { transform: mul(toMm, m), tolerance: tol, maxCoordinate: 1e6 });
      if (!flat.ok) {
        errors.push(...flat.errors.map((e) => `${c.name}${c.attributes.id ? ` "${c.attributes.id}"` : ''} in the motif layer: ${e}`));
        continue;
      }
      for (const r of flat.rings) rings.push(page ? r.map(([x, y]) => [page.left + x, page.top - y] as Vec2) : r.map(([x, y]) => [x, -y] as Vec2));
    }
  };
  if (!hidden(layer.node)) walk(layer.node, layer.ctm, 0);
  if (errors.length) return { ok: false, errors };
  if (shapes === 0 || rings.length === 0) return { ok: false, errors: ['the motif layer is empty: draw one closed outline in it'] };
  const poly = assemblePolygon(rings);
  if (!poly.ok) return poly;
  return { ok: true, rings, polygon: poly.polygon };
}
