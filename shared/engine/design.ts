/**
 * The design document (FORMAT.md §1): its zod schema, and the parser that turns raw input into a
 * {@link ResolvedDesign} or a list of input issues naming the field path and the problem.
 *
 * Choices where FORMAT.md is silent (the project's own, documented here):
 * - Objects are strict: an unknown key (say `hole` for `holes`) is an issue, so a typo never
 *   silently loses part of a design.
 * - `title` and `material.name` are non-empty strings of at most 200 characters.
 * - Ids of families and motifs: 1–64 characters from letters, digits, `_`, `.` and `-`, starting
 *   with a letter, digit or `_` (they appear in piece ids, SVG ids and file names). Family ids
 *   and motif ids are each unique.
 * - A family gives exactly one of `axis` (a whole number ≥ 1) or `normal`.
 * - A motif gives exactly one of `outline` (with optional `holes`) or `svgPath`. An `svgPath`'s
 *   subpaths are sorted by containment: the largest is the outline, the others must lie inside
 *   it and are holes (see {@link svgPathToPolygon}).
 * - `motifs` may be empty: a design whose families are planned but not yet drawn is valid (the
 *   drawing templates are made from it).
 * - Limits against absurd input, each an issue with its own message: the text at most 2 MB
 *   ({@link MAX_DESIGN_BYTES}); at most 20 families and 200 motifs; at most 5,000 points in an
 *   outline and 5,000 in a motif's holes together, after flattening; at most 100 holes;
 *   coordinates and offsets within ±10,000 mm; thickness at most 50 mm; kerf at most 5 mm
 *   (a laser kerf is a fraction of a millimetre — common practice, no source); sheet sides at
 *   most 10,000 mm; `maxSheets` a whole number from 1 to 1,000; `angleToleranceDeg` greater than
 *   0 and at most 10; `minJointLength` from 0 to 1,000 mm.
 * - Points of an outline closer than 0.001 mm are one point, and a last point repeating the
 *   first is dropped (outlines are implicitly closed). Rings are stored outer counter-clockwise,
 *   holes clockwise.
 */
import { z } from 'zod';
import { AxisFoldError, GroupNameError, type RotationGroup, canonicalNormal, getGroup } from './groups.js';
import type { Constraints, Polygon2, ResolvedDesign, ResolvedFamily, ResolvedMotif } from './model.js';
import { type Vec2, type Vec3 } from './vec.js';
import { normalizePolygon, removeNearDuplicates, validatePolygon } from './polygons.js';
import { svgPathToPolygon } from './svg-path.js';

/** The `format` value of version 1 of the design document. */
export const DESIGN_FORMAT = 'planewright/design@1';
/** Largest design document text, in bytes of UTF-8 (2 MB). */
export const MAX_DESIGN_BYTES = 2 * 1024 * 1024;
export const MAX_FAMILIES = 20;
export const MAX_MOTIFS = 200;
/** Largest number of points in one outline (and in one motif's holes together), after flattening. */
export const MAX_OUTLINE_POINTS = 5000;
export const MAX_HOLES = 100;
/** Largest absolute coordinate or offset (mm). */
export const MAX_COORDINATE = 10_000;
export const MAX_THICKNESS = 50;
export const MAX_KERF = 5;

/** One problem with an input: where (`motifs[2].outline[5]`, `""` for the whole document) and what. */
export interface InputIssue {
  readonly path: string;
  readonly message: string;
}

const idSchema = z
  .string()
  .regex(/^[A-Za-z0-9_][A-Za-z0-9_.-]{0,63}$/, 'must be 1–64 characters of letters, digits, "_", "." or "-", not starting with "." or "-"');
const coordinate = z
  .number()
  .min(-MAX_COORDINATE, `must be within ±${MAX_COORDINATE} mm`)
  .max(MAX_COORDINATE, `must be within ±${MAX_COORDINATE} mm`);
const pointSchema = z.tuple([coordinate, coordinate]);
const ringSchema = z.array(pointSchema).max(MAX_OUTLINE_POINTS, `may have at most ${MAX_OUTLINE_POINTS} points`);

const familySchema = z.strictObject({
  id: idSchema,
  axis: z.number().int('must be a whole number (the fold of a symmetry axis)').min(1, 'must be at least 1').optional(),
  normal: z.tuple([z.number(), z.number(), z.number()]).optional(),
  offset: z.number().min(0, 'must be 0 or more (mm from the centre)').max(MAX_COORDINATE, `may be at most ${MAX_COORDINATE} mm`),
});

const motifSchema = z.strictObject({
  id: idSchema,
  family: z.string(),
  outline: ringSchema.optional(),
  holes: z.array(ringSchema).max(MAX_HOLES, `may have at most ${MAX_HOLES} holes`).optional(),
  svgPath: z.string().max(MAX_DESIGN_BYTES).optional(),
});

const positiveLength = (max: number) => z.number().gt(0, 'must be greater than 0').max(max, `may be at most ${max} mm`);

/** zod schema of the design document exactly as FORMAT.md §1 writes it (before resolution). */
export const designSchema = z.strictObject({
  format: z.literal(DESIGN_FORMAT, { error: `must be "${DESIGN_FORMAT}"` }),
  title: z.string().trim().min(1, 'must not be empty').max(200, 'may be at most 200 characters'),
  symmetry: z.string(),
  material: z.strictObject({
    name: z.string().trim().min(1, 'must not be empty').max(200, 'may be at most 200 characters'),
    thickness: positiveLength(MAX_THICKNESS),
    kerf: z.number().min(0, 'must be 0 or more').max(MAX_KERF, `may be at most ${MAX_KERF} mm`).default(0),
  }),
  families: z.array(familySchema).min(1, 'needs at least one family').max(MAX_FAMILIES, `may have at most ${MAX_FAMILIES} families`),
  motifs: z.array(motifSchema).max(MAX_MOTIFS, `may have at most ${MAX_MOTIFS} motifs`),
  constraints: z
    .strictObject({
      sheet: z.tuple([positiveLength(MAX_COORDINATE), positiveLength(MAX_COORDINATE)]).optional(),
      maxSheets: z.number().int('must be a whole number').min(1, 'must be at least 1').max(1000, 'may be at most 1000').optional(),
      angleToleranceDeg: z.number().gt(0, 'must be greater than 0 (use a small value such as 0.01)').max(10, 'may be at most 10 degrees').optional(),
      minJointLength: z.number().min(0, 'must be 0 or more').max(1000, 'may be at most 1000 mm').optional(),
    })
    .optional(),
});

/** The design document as written (after schema defaults). */
export type DesignDocument = z.infer<typeof designSchema>;

export type ParseDesignResult = { ok: true; design: ResolvedDesign } | { ok: false; errors: InputIssue[] };

/** `["motifs", 2, "outline", 5]` → `motifs[2].outline[5]`. */
export function formatPath(path: readonly PropertyKey[]): string {
  let s = '';
  for (const k of path) {
    if (typeof k === 'number') s += `[${k}]`;
    else s += s ? `.${String(k)}` : String(k);
  }
  return s;
}

const typeName = (v: unknown): string => {
  if (v === null) return 'null';
  if (Array.isArray(v)) return 'a list';
  if (typeof v === 'number') return Number.isNaN(v) ? 'NaN' : Number.isFinite(v) ? 'a number' : 'an infinite number';
  if (typeof v === 'string') return 'text';
  if (typeof v === 'object') return 'an object';
  return typeof v;
};

const expectedName: Record<string, string> = {
  number: 'a number',
  string: 'text',
  array: 'a list',
  object: 'an object',
  tuple: 'a list',
  boolean: 'true or false',
};

function issueMessage(issue: z.core.$ZodIssue, input: unknown): string {
  const at = valueAt(input, issue.path);
  switch (issue.code) {
    case 'invalid_type':
      if (at === undefined) return 'is required';
      if (!issue.message.startsWith('Invalid input')) return issue.message;
      if (issue.expected === 'int') return 'must be a whole number';
      return `must be ${expectedName[issue.expected] ?? issue.expected}, not ${typeName(at)}`;
    case 'unrecognized_keys':
      return `has unknown key${issue.keys.length > 1 ? 's' : ''} ${issue.keys.map((k) => `"${k}"`).join(', ')}`;
    case 'too_small':
      if (issue.origin === 'array' && Array.isArray(at)) return issue.message.startsWith('Too small') ? `needs at least ${String(issue.minimum)} items` : issue.message;
      return issue.message;
    case 'too_big':
      if (issue.origin === 'array' && Array.isArray(at) && issue.message.startsWith('Too big')) return `has ${at.length} items; at most ${String(issue.maximum)} allowed`;
      return issue.message;
    default:
      return issue.message;
  }
}

function valueAt(input: unknown, path: readonly PropertyKey[]): unknown {
  let v: unknown = input;
  for (const k of path) {
    if (v === null || typeof v !== 'object') return undefined;
    v = (v as Record<PropertyKey, unknown>)[k];
  }
  return v;
}

/**
 * Validates and resolves a design document given as a parsed JSON value. Never throws and never
 * returns a partial result: either `{ ok: true, design }` or every issue found (schema issues
 * first; the geometric checks of families and motifs run only on a well-formed document).
 *
 * Resolution: `symmetry` must name a rotation group (C<n> n ≥ 1, D<n> n ≥ 2, T, O, I); an `axis`
 * becomes the canonical normal of that fold (FORMAT.md §1 table) and a fold the group lacks is an
 * issue; an explicit `normal` must be finite and non-zero and is normalised; a motif's `family`
 * must name a family; outlines are cleaned (points closer than 0.001 mm merged), must keep at least
 * 3 distinct points, must not cross or touch themselves, and holes must lie strictly inside the
 * outline and apart from each other; an `svgPath` is flattened to within 0.05 mm first.
 */
export function parseDesign(input: unknown): ParseDesignResult {
  try {
    return parseDesignUnsafe(input);
  } catch (e) {
    return { ok: false, errors: [{ path: '', message: `the design could not be read (${e instanceof Error ? e.message : String(e)})` }] };
  }
}

function parseDesignUnsafe(input: unknown): ParseDesignResult {
  const parsed = designSchema.safeParse(input);
  if (!parsed.success) {
    const seen = new Set<string>();
    const errors: InputIssue[] = [];
    for (const issue of parsed.error.issues) {
      const e = { path: formatPath(issue.path), message: issueMessage(issue, input) };
      const key = `${e.path}\u0000${e.message}`;
      if (seen.has(key)) continue;
      seen.add(key);
      errors.push(e);
      if (errors.length >= 50) break;
    }
    return { ok: false, errors };
  }
  const doc = parsed.data;
  const errors: InputIssue[] = [];

  let group: RotationGroup | null = null;
  try {
    group = getGroup(doc.symmetry.trim());
  } catch (e) {
    if (!(e instanceof GroupNameError)) throw e;
    errors.push({ path: 'symmetry', message: e.message });
  }

  const families: ResolvedFamily[] = [];
  const familyIds = new Map<string, number>();
  doc.families.forEach((f, i) => {
    const at = `families[${i}]`;
    if (familyIds.has(f.id)) errors.push({ path: `${at}.id`, message: `duplicate family id "${f.id}" (also families[${familyIds.get(f.id)}])` });
    else familyIds.set(f.id, i);
    if ((f.axis === undefined) === (f.normal === undefined)) {
      errors.push({ path: at, message: 'give exactly one of "axis" (the fold of a symmetry axis) or "normal" (a direction)' });
      return;
    }
    let normal: Vec3 | null = null;
    if (f.axis !== undefined) {
      if (!group) return;
      try {
        normal = canonicalNormal(group, f.axis);
      } catch (e) {
        if (!(e instanceof AxisFoldError)) throw e;
        errors.push({ path: `${at}.axis`, message: e.message });
        return;
      }
    } else {
      const n = f.normal!;
      const len = Math.hypot(n[0], n[1], n[2]);
      if (!(len > 0) || !Number.isFinite(len)) {
        errors.push({ path: `${at}.normal`, message: 'must be a non-zero direction [x, y, z]' });
        return;
      }
      normal = [n[0] / len, n[1] / len, n[2] / len];
      if (!normal.every(Number.isFinite) || Math.abs(Math.hypot(...normal) - 1) > 1e-9) {
        errors.push({ path: `${at}.normal`, message: 'is too small to give a direction; scale it up' });
        return;
      }
    }
    families.push({ id: f.id, axis: f.axis ?? null, normal, offset: f.offset });
  });

  const motifs: ResolvedMotif[] = [];
  const motifIds = new Map<string, number>();
  doc.motifs.forEach((m, i) => {
    const at = `motifs[${i}]`;
    if (motifIds.has(m.id)) errors.push({ path: `${at}.id`, message: `duplicate motif id "${m.id}" (also motifs[${motifIds.get(m.id)}])` });
    else motifIds.set(m.id, i);
    if (!familyIds.has(m.family)) {
      const known = [...familyIds.keys()].map((k) => `"${k}"`).join(', ');
      errors.push({ path: `${at}.family`, message: `unknown family "${m.family}"${known ? ` (the families are ${known})` : ''}` });
    }
    const polygon = resolveMotifShape(m, at, errors);
    if (polygon) motifs.push({ id: m.id, family: m.family, polygon });
  });

  if (errors.length || !group) return { ok: false, errors };
  const constraints: Constraints = { ...(doc.constraints ?? {}) };
  return {
    ok: true,
    design: {
      title: doc.title,
      symmetry: group.name,
      material: { name: doc.material.name, thickness: doc.material.thickness, kerf: doc.material.kerf },
      families,
      motifs,
      constraints,
    },
  };
}

function resolveMotifShape(m: DesignDocument['motifs'][number], at: string, errors: InputIssue[]): Polygon2 | null {
  const hasOutline = m.outline !== undefined;
  const hasPath = m.svgPath !== undefined;
  if (hasOutline === hasPath) {
    errors.push({ path: at, message: 'give exactly one of "outline" (a list of points, with optional "holes") or "svgPath" (SVG path data)' });
    return null;
  }
  if (hasPath) {
    if (m.holes !== undefined) {
      errors.push({ path: `${at}.holes`, message: 'holes go into the svgPath as further subpaths, not into "holes"' });
      return null;
    }
    const r = svgPathToPolygon(m.svgPath!, { maxPoints: 4 * MAX_OUTLINE_POINTS, maxCoordinate: MAX_COORDINATE });
    if (!r.ok) {
      for (const message of r.errors) errors.push({ path: `${at}.svgPath`, message });
      return null;
    }
    const holePoints = r.polygon.holes.reduce((s, h) => s + h.length, 0);
    if (r.polygon.outer.length > MAX_OUTLINE_POINTS) {
      errors.push({ path: `${at}.svgPath`, message: `the outline flattens to ${r.polygon.outer.length} points; at most ${MAX_OUTLINE_POINTS} allowed (simplify the curves)` });
      return null;
    }
    if (holePoints > MAX_OUTLINE_POINTS || r.polygon.holes.length > MAX_HOLES) {
      errors.push({ path: `${at}.svgPath`, message: `the holes flatten to ${holePoints} points in ${r.polygon.holes.length} holes; at most ${MAX_OUTLINE_POINTS} points and ${MAX_HOLES} holes allowed` });
      return null;
    }
    return r.polygon;
  }

  const rings: { ring: Vec2[]; index: number[]; path: string }[] = [];
  const clean = (raw: readonly (readonly [number, number])[], path: string) => {
    const kept: Vec2[] = [];
    const index: number[] = [];
    const dedup = removeNearDuplicates(raw.map((p) => [p[0], p[1]] as Vec2));
    // Map the kept points back to their first index in the input, for messages.
    let j = 0;
    for (const p of dedup) {
      while (j < raw.length && (raw[j][0] !== p[0] || raw[j][1] !== p[1])) j++;
      kept.push(p);
      index.push(Math.min(j, raw.length - 1));
    }
    rings.push({ ring: kept, index, path });
  };
  clean(m.outline!, `${at}.outline`);
  (m.holes ?? []).forEach((h, k) => clean(h, `${at}.holes[${k}]`));
  const holePoints = rings.slice(1).reduce((s, r) => s + r.ring.length, 0);
  if (holePoints > MAX_OUTLINE_POINTS) {
    errors.push({ path: `${at}.holes`, message: `the holes have ${holePoints} points together; at most ${MAX_OUTLINE_POINTS} allowed` });
    return null;
  }
  const raw: Polygon2 = { outer: rings[0].ring, holes: rings.slice(1).map((r) => r.ring) };
  const problems = validatePolygon(raw);
  if (problems.length) {
    for (const p of problems) {
      const r = rings[p.ring + 1];
      const path = p.index >= 0 && r.index[p.index] !== undefined ? `${r.path}[${r.index[p.index]}]` : r.path;
      let message = p.message;
      if (p.otherRing !== undefined && p.otherIndex !== undefined && p.index >= 0) {
        const o = rings[p.otherRing + 1];
        const next = (k: number, rr: typeof r) => rr.index[(k + 1) % rr.index.length];
        message += ` (the edge ${r.path}[${r.index[p.index]}]–[${next(p.index, r)}] and the edge ${o.path}[${o.index[p.otherIndex]}]–[${next(p.otherIndex, o)}])`;
      }
      errors.push({ path, message });
    }
    return null;
  }
  return normalizePolygon(raw);
}

/**
 * Validates design document text (JSON). Text over {@link MAX_DESIGN_BYTES} bytes, a byte-order
 * mark aside, is refused before parsing; malformed JSON gives one issue with line and column
 * when the JSON parser reports a position. Otherwise as {@link parseDesign}. Never throws.
 */
export function parseDesignText(text: string): ParseDesignResult {
  try {
    if (typeof text !== 'string') return { ok: false, errors: [{ path: '', message: 'the design must be JSON text' }] };
    const bytes = utf8Length(text, MAX_DESIGN_BYTES + 1);
    if (bytes > MAX_DESIGN_BYTES) {
      return { ok: false, errors: [{ path: '', message: `the design file is larger than 2 MB (${MAX_DESIGN_BYTES} bytes); designs are far smaller — check it is the right file` }] };
    }
    const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
    if (body.trim() === '') return { ok: false, errors: [{ path: '', message: 'the design file is empty' }] };
    let value: unknown;
    try {
      value = JSON.parse(body);
    } catch (e) {
      return { ok: false, errors: [{ path: '', message: jsonErrorMessage(body, e) }] };
    }
    return parseDesign(value);
  } catch (e) {
    return { ok: false, errors: [{ path: '', message: `the design could not be read (${e instanceof Error ? e.message : String(e)})` }] };
  }
}

/** UTF-8 byte length of `s`, counting stops once it exceeds `stopAt`. */
export function utf8Length(s: string, stopAt = Infinity): number {
  let n = 0;
  for (let i = 0; i < s.length && n <= stopAt; i++) {
    const c = s.charCodeAt(i);
    if (c < 0x80) n += 1;
    else if (c < 0x800) n += 2;
    else if (c >= 0xd800 && c <= 0xdbff && i + 1 < s.length) {
      n += 4;
      i++;
    } else n += 3;
  }
  return n;
}

function jsonErrorMessage(text: string, e: unknown): string {
  const raw = e instanceof Error ? e.message : String(e);
  let line: number | null = null;
  let column: number | null = null;
  const lc = /line (\d+) column (\d+)/.exec(raw);
  const pos = /position (\d+)/.exec(raw);
  if (lc) {
    line = Number(lc[1]);
    column = Number(lc[2]);
  } else if (pos) {
    const p = Math.min(Number(pos[1]), text.length);
    const before = text.slice(0, p);
    line = before.split('\n').length;
    column = p - before.lastIndexOf('\n');
  } else {
    const p = locateJsonError(text);
    if (p !== null) {
      const before = text.slice(0, p);
      line = before.split('\n').length;
      column = p - before.lastIndexOf('\n');
    }
  }
  const what = raw
    .replace(/\s*\(line \d+ column \d+\)/, '')
    .replace(/\s*in JSON at position \d+/, '')
    .replace(/, ".*" is not valid JSON$/s, '');
  return `the design is not valid JSON${line !== null ? ` at line ${line}, column ${column}` : ''}: ${what}`;
}

/**
 * Offset of the first character where `text` stops being JSON (RFC 8259), or null when it is
 * valid. Iterative (no recursion), so deep nesting cannot overflow the stack. Used only to place
 * a message when the platform's JSON parser does not say where it failed.
 */
export function locateJsonError(text: string): number | null {
  const n = text.length;
  let i = 0;
  const stack: number[] = []; // 0 = array, 1 = object
  const ws = () => {
    while (i < n && (text[i] === ' ' || text[i] === '\t' || text[i] === '\n' || text[i] === '\r')) i++;
  };
  const str = (): boolean => {
    if (text[i] !== '"') return false;
    i++;
    while (i < n) {
      const c = text.charCodeAt(i);
      if (c === 34) {
        i++;
        return true;
      }
      if (c < 32) return false;
      if (c === 92) {
        const e = text[i + 1];
        if (e === 'u') {
          if (!/^[0-9a-fA-F]{4}$/.test(text.slice(i + 2, i + 6))) return false;
          i += 6;
        } else if (e !== undefined && '"\\/bfnrt'.includes(e)) i += 2;
        else return false;
      } else i++;
    }
    return false;
  };
  const scalar = (): boolean => {
    for (const lit of ['true', 'false', 'null']) {
      if (text.startsWith(lit, i)) {
        i += lit.length;
        return true;
      }
    }
    const m = /^-?(0|[1-9][0-9]*)(\.[0-9]+)?([eE][+-]?[0-9]+)?/.exec(text.slice(i, i + 400));
    if (!m || m[0] === '' || m[0] === '-') return false;
    i += m[0].length;
    return true;
  };
  // State machine: expecting a value, then after it a separator or a close.
  let expectValue = true;
  ws();
  for (;;) {
    if (expectValue) {
      ws();
      if (i >= n) return i;
      const c = text[i];
      if (c === '[') {
        i++;
        ws();
        if (text[i] === ']') {
          i++;
          expectValue = false;
        } else stack.push(0);
        continue;
      }
      if (c === '{') {
        i++;
        ws();
        if (text[i] === '}') {
          i++;
          expectValue = false;
          continue;
        }
        if (!str()) return i;
        ws();
        if (text[i] !== ':') return i;
        i++;
        stack.push(1);
        continue;
      }
      if (c === '"' ? !str() : !scalar()) return i;
      expectValue = false;
      continue;
    }
    ws();
    if (stack.length === 0) return i < n ? i : null;
    const top = stack[stack.length - 1];
    if (i >= n) return i;
    if (text[i] === ',') {
      i++;
      if (top === 1) {
        ws();
        if (!str()) return i;
        ws();
        if (text[i] !== ':') return i;
        i++;
      }
      expectValue = true;
      continue;
    }
    if ((top === 0 && text[i] === ']') || (top === 1 && text[i] === '}')) {
      i++;
      stack.pop();
      continue;
    }
    return i;
  }
}
