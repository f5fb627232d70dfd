/**
 * Turns an upload into a design document: either the uploaded document itself, or one built from
 * the form (group, families, motifs with outline files). Every problem is an HttpError naming
 * the field or file and the engine's own message; nothing is stored on the way.
 */
import type { z } from 'zod';
import { revisionFormFieldsSchema, UPLOAD_LIMITS } from '../../shared/api/revisions.js';
import { importDrawing } from '../../shared/engine/canvas.js';
import { DESIGN_FORMAT, parseDesign, parseDesignText, type InputIssue } from '../../shared/engine/design.js';
import { dxfToPolygon } from '../../shared/engine/dxf.js';
import type { Polygon2 } from '../../shared/engine/model.js';
import type { BriefMaterial } from '../audits/brief-rules.js';
import { BadRequestError, UnprocessableError } from '../http/errors.js';
import { fieldsOf } from '../http/validate.js';
import { KIND_NAMES, PayloadTooLargeError, UnsupportedFileError, mb, sniff, textOf, type SniffedKind } from './upload.js';

export type UploadedFile = Pick<Express.Multer.File, 'fieldname' | 'originalname' | 'buffer' | 'size'>;

export interface StoredFileSpec {
  role: 'design' | 'outline' | 'drawing';
  originalName: string;
  mediaType: string;
  data: Buffer;
}

export interface BuiltDesign {
  doc: Record<string, unknown>;
  title: string;
  source: 'file' | 'form';
  files: StoredFileSpec[];
}

function issuesFields(prefix: string, issues: readonly InputIssue[]): Record<string, string> {
  const out: Record<string, string> = {};
  for (const i of issues.slice(0, 20)) {
    const key = i.path ? `${prefix}.${i.path}` : prefix;
    if (!(key in out)) out[key] = i.message;
  }
  return out;
}

function invalidDesign(where: string, issues: readonly InputIssue[], extra: Record<string, string> = {}): never {
  const first = issues[0];
  throw new UnprocessableError(`${where} is not a valid design: ${first.path || '(document)'}: ${first.message}`, { ...extra, ...issuesFields('design', issues) });
}

/** From an uploaded design document (multipart file `design`). */
export function designFromFile(file: UploadedFile): BuiltDesign {
  const field = `files.${file.fieldname}`;
  if (file.size > UPLOAD_LIMITS.design) {
    throw new PayloadTooLargeError(`${file.originalname} is larger than the ${mb(UPLOAD_LIMITS.design)} limit for a design document.`, { [field]: `larger than ${mb(UPLOAD_LIMITS.design)}` });
  }
  const kind = sniff(file.buffer);
  if (kind !== 'json') {
    throw new UnsupportedFileError(`${file.originalname} is ${KIND_NAMES[kind]}, not a design document (JSON).`, { [field]: `expected a design document (JSON), got ${KIND_NAMES[kind]}` });
  }
  const text = textOf(file.buffer);
  if (text === null) throw new UnprocessableError(`${file.originalname} is not UTF-8 text.`, { [field]: 'not UTF-8 text' });
  const parsed = parseDesignText(text);
  if (!parsed.ok) invalidDesign(file.originalname, parsed.errors, { [field]: `${parsed.errors[0].path || '(document)'}: ${parsed.errors[0].message}` });
  const doc = JSON.parse(text) as Record<string, unknown>;
  return { doc, title: parsed.design.title, source: 'file', files: [{ role: 'design', originalName: file.originalname, mediaType: 'application/json', data: file.buffer }] };
}

/** From a design document sent as JSON (`{ design: … }`). */
export function designFromJson(design: unknown): BuiltDesign {
  if (typeof design !== 'object' || design === null || Array.isArray(design)) {
    throw new BadRequestError('Send the design document as the object `design`.', { 'body.design': 'expected a design document object' });
  }
  const parsed = parseDesign(design);
  if (!parsed.ok) invalidDesign('The design', parsed.errors);
  const text = JSON.stringify(design);
  if (Buffer.byteLength(text) > UPLOAD_LIMITS.design) throw new PayloadTooLargeError(`The design is larger than ${mb(UPLOAD_LIMITS.design)}.`, { 'body.design': `larger than ${mb(UPLOAD_LIMITS.design)}` });
  return { doc: design as Record<string, unknown>, title: parsed.design.title, source: 'file', files: [{ role: 'design', originalName: 'design.json', mediaType: 'application/json', data: Buffer.from(text) }] };
}

function jsonField(fields: Record<string, unknown>, name: string): unknown {
  const raw = fields[name];
  if (raw === undefined) return undefined;
  if (typeof raw !== 'string') throw new BadRequestError(`Send ${name} once, as JSON text.`, { [`body.${name}`]: 'expected one JSON text field' });
  try {
    return JSON.parse(raw);
  } catch {
    throw new BadRequestError(`The field ${name} is not valid JSON.`, { [`body.${name}`]: 'not valid JSON' });
  }
}

const round = (p: Polygon2) => {
  const r = (ring: readonly (readonly [number, number])[]) => ring.map(([x, y]) => [Math.round(x * 1e4) / 1e4, Math.round(y * 1e4) / 1e4]);
  return { outline: r(p.outer), ...(p.holes.length ? { holes: p.holes.map(r) } : {}) };
};

/**
 * A plain SVG outline (not one of our drawing templates) has no motif layer: wrap the root's
 * content in one, so the importer reads every shape with the root's width, height and viewBox.
 */
function asMotifLayer(svg: string): string {
  const open = /<svg\b[^>]*>/i.exec(svg);
  const close = svg.toLowerCase().lastIndexOf('</svg>');
  if (!open || open[0].endsWith('/>') || close < open.index) return svg;
  const start = open.index + open[0].length;
  return `${svg.slice(0, start)}<g id="motif" data-planewright-layer="motif">${svg.slice(start, close)}</g>${svg.slice(close)}`;
}

function outlineOf(file: UploadedFile, motifId: string): { polygon: Polygon2; spec: StoredFileSpec } {
  const field = `files.${file.fieldname}`;
  if (file.size > UPLOAD_LIMITS.outline) {
    throw new PayloadTooLargeError(`${file.originalname} is larger than the ${mb(UPLOAD_LIMITS.outline)} limit for an outline.`, { [field]: `larger than ${mb(UPLOAD_LIMITS.outline)}` });
  }
  const kind: SniffedKind = sniff(file.buffer);
  if (kind !== 'svg' && kind !== 'drawing' && kind !== 'dxf') {
    throw new UnsupportedFileError(`${file.originalname} (motif "${motifId}") is ${KIND_NAMES[kind]}; send an SVG or DXF outline or a filled-in drawing template.`, {
      [field]: `expected SVG, DXF or a drawing template, got ${KIND_NAMES[kind]}`,
    });
  }
  const text = textOf(file.buffer);
  if (text === null) throw new UnprocessableError(`${file.originalname} is not UTF-8 text.`, { [field]: 'not UTF-8 text' });
  const r = kind === 'dxf' ? dxfToPolygon(text) : importDrawing(kind === 'svg' ? asMotifLayer(text) : text);
  if (!r.ok) {
    throw new UnprocessableError(`${file.originalname} (motif "${motifId}") could not be read: ${r.errors[0]}`, { [field]: r.errors.slice(0, 3).join('; ') });
  }
  return {
    polygon: r.polygon,
    spec: { role: kind === 'drawing' ? 'drawing' : 'outline', originalName: file.originalname, mediaType: kind === 'dxf' ? 'application/dxf' : 'image/svg+xml', data: file.buffer },
  };
}

/** From the form: text fields `group`, `families`, `motifs`, `title`, and one outline file per motif. */
export function designFromForm(fields: Record<string, unknown>, files: readonly UploadedFile[], material: BriefMaterial, fallbackTitle: string): BuiltDesign {
  const raw = { title: fields.title, group: fields.group, families: jsonField(fields, 'families'), motifs: jsonField(fields, 'motifs') ?? [] };
  const r = revisionFormFieldsSchema.safeParse(raw);
  if (!r.success) {
    const f = fieldsOf('body', r.error as z.ZodError);
    const first = Object.entries(f)[0];
    throw new BadRequestError(`Check ${first[0]}: ${first[1]}`, f);
  }
  const form = r.data;
  const byField = new Map(files.map((f) => [f.fieldname, f]));
  const motifs: Record<string, unknown>[] = [];
  const stored: StoredFileSpec[] = [];
  const motifIndexOfField = new Map<string, number>();
  form.motifs.forEach((m, i) => {
    const file = byField.get(m.file);
    if (!file) throw new UnprocessableError(`No file was sent for motif "${m.id}" (field ${m.file}).`, { [`files.${m.file}`]: `missing: the outline of motif "${m.id}"`, [`body.motifs.${i}.file`]: 'no such file field' });
    const { polygon, spec } = outlineOf(file, m.id);
    motifIndexOfField.set(m.file, i);
    motifs.push({ id: m.id, family: m.family, ...round(polygon) });
    stored.push(spec);
  });
  const doc: Record<string, unknown> = {
    format: DESIGN_FORMAT,
    title: form.title ?? fallbackTitle,
    symmetry: form.group,
    material: { name: material.name, thickness: material.thickness, kerf: material.kerf },
    families: form.families,
    motifs,
  };
  const parsed = parseDesign(doc);
  if (!parsed.ok) {
    // Point each problem at the form field or file it came from.
    const mapped: Record<string, string> = {};
    for (const issue of parsed.errors.slice(0, 20)) {
      const m = /^motifs\[(\d+)\](?:\.(outline|holes).*)?/.exec(issue.path);
      const fam = /^families(\[\d+\].*)?$/.exec(issue.path);
      let key: string;
      if (m && m[2]) key = `files.${form.motifs[Number(m[1])].file}`;
      else if (m) key = `body.motifs${issue.path.slice('motifs'.length).replace(/\[(\d+)\]/g, '.$1')}`;
      else if (fam) key = `body.${issue.path.replace(/\[(\d+)\]/g, '.$1')}`;
      else if (issue.path === 'symmetry') key = 'body.group';
      else key = issue.path ? `body.${issue.path}` : 'body';
      if (!(key in mapped)) mapped[key] = issue.message;
    }
    const first = parsed.errors[0];
    throw new UnprocessableError(`The form does not make a valid design: ${first.path || '(document)'}: ${first.message}`, mapped);
  }
  return { doc, title: parsed.design.title, source: 'form', files: stored };
}
