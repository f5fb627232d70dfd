import type { Response } from 'express';
import { CanvasError, drawingTemplate } from '../../shared/engine/canvas.js';
import { parseDesign } from '../../shared/engine/design.js';
import { NotFoundError, UnprocessableError } from '../http/errors.js';

/** Answers the drawing template of `familyId` of the design document as an SVG download. */
export function sendDrawingTemplate(res: Response, doc: unknown, familyId: string, baseName: string): void {
  const parsed = parseDesign(doc);
  if (!parsed.ok) {
    const e = parsed.errors[0];
    throw new UnprocessableError(`The design cannot make a drawing template: ${e.path || '(document)'}: ${e.message}`);
  }
  if (!parsed.design.families.some((f) => f.id === familyId)) {
    throw new NotFoundError(`There is no family "${familyId}"; the families are ${parsed.design.families.map((f) => f.id).join(', ')}.`);
  }
  let svg: string;
  try {
    svg = drawingTemplate(parsed.design, familyId);
  } catch (e) {
    if (e instanceof CanvasError) throw new UnprocessableError(`No drawing template for family "${familyId}": ${e.message}`);
    throw e;
  }
  const name = `${baseName}-${familyId}.svg`.replace(/[^A-Za-z0-9_.-]+/g, '-');
  res.setHeader('Content-Type', 'image/svg+xml; charset=utf-8');
  res.setHeader('Content-Disposition', `attachment; filename="${name}"`);
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.send(svg);
}
