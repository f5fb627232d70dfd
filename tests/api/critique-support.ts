/**
 * Shared fixtures of the critique API tests: a published brief with a participant's revision of
 * square plates (pieces plate-01 … plate-06, each the square ±half mm in its own frame), the
 * demo critic assigned, and a valid pin body.
 */
import request from 'supertest';
import { expect } from 'vitest';
import { piecesOfRevision } from '../../server/critique/pieces.js';
import { locateInPolygon } from '../../shared/engine/polygons.js';
import type { TestApp } from './helpers.js';
import { cubePlates, makeBrief } from './support-workflow.js';

export const CAMERA = { position: [300, 200, 400] as [number, number, number], target: [0, 0, 0] as [number, number, number] };

export const pinBody = (over: Record<string, unknown> = {}) => ({
  anchor: { piece: 'plate-01', point: [0, 0], side: 1 },
  category: 'structure',
  camera: CAMERA,
  body: 'The corner joint here looks short.',
  ...over,
});

export interface CritiqueFixture {
  briefId: number;
  submissionId: number;
  revisionId: number;
}

/** Uploads a revision as `cookie` to `briefId`, waits for its audit, and returns its ids (201 expected). */
export async function upload(t: TestApp, cookie: string, briefId: number, design: Record<string, unknown>): Promise<{ revisionId: number; submissionId: number }> {
  const res = await request(t.app).post(`/api/briefs/${briefId}/revisions`).set('Cookie', cookie).send({ design });
  expect(res.status, res.text).toBe(201);
  // The audit's "revision received" e-mail goes out when it finishes; wait so mail counts are exact.
  await t.ctx.audits.idle();
  return { revisionId: res.body.id, submissionId: res.body.submissionId };
}

/** A brief, participant@'s revision of plates, critic@ assigned to it. */
export async function critiqueFixture(t: TestApp, cookies: { instructor: string; participant: string }, o: { title?: string; rubric?: object[] } = {}): Promise<CritiqueFixture> {
  const brief = await makeBrief(t, cookies.instructor, { title: o.title ?? 'Pinned plates', rubric: o.rubric });
  const { revisionId, submissionId } = await upload(t, cookies.participant, brief.id, cubePlates());
  const critic = (await t.ds.query(`SELECT id FROM users WHERE email = 'critic@example.org'`)) as { id: number }[];
  const assign = await request(t.app).put(`/api/submissions/${submissionId}/critics`).set('Cookie', cookies.instructor).send({ userIds: [critic[0].id] });
  expect(assign.status, assign.text).toBe(200);
  return { briefId: brief.id, submissionId, revisionId };
}

/** The first piece of a revision and a point well inside it (read from the server's piece cache). */
export function pointOn(t: TestApp, revisionId: number): { piece: string; point: [number, number]; side: 1 } {
  const built = piecesOfRevision(t.ds, revisionId);
  if (!built.ok) throw new Error(built.error);
  const piece = built.pieces[0];
  const xs = piece.polygon.outer.map((p) => p[0]);
  const ys = piece.polygon.outer.map((p) => p[1]);
  const [x0, x1, y0, y1] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
  for (let i = 1; i < 20; i++) {
    for (let j = 1; j < 20; j++) {
      const point: [number, number] = [x0 + ((x1 - x0) * i) / 20, y0 + ((y1 - y0) * j) / 20];
      if (locateInPolygon(point, piece.polygon) === 'inside') return { piece: piece.id, point, side: 1 };
    }
  }
  throw new Error(`no point inside ${piece.id}`);
}
