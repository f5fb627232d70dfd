/**
 * Shared fixtures of the studio-workflow API tests: a brief made through the API, small designs,
 * a wait for the audit pool to finish.
 */
import { readFileSync } from 'node:fs';
import request from 'supertest';
import { expect } from 'vitest';
import { DEMO_STUDIO_ID, type TestApp } from './helpers.js';

export const PLYWOOD_ID = 1;

export const seedDesign = (name: string): Record<string, unknown> =>
  JSON.parse(readFileSync(new URL(`../../server/seed/designs/${name}.json`, import.meta.url), 'utf8')) as Record<string, unknown>;

/** Six square plates on the 4-fold planes of O: 6 pieces, 12 square corner joints, passes. */
export const cubePlates = (half = 50, title = 'Plate box'): Record<string, unknown> => ({
  format: 'planewright/design@1',
  title,
  symmetry: 'O',
  material: { name: 'Birch plywood', thickness: 3, kerf: 0.2 },
  families: [{ id: 'faces', axis: 4, offset: half }],
  motifs: [{ id: 'plate', family: 'faces', outline: [[-half, -half], [half, -half], [half, half], [-half, half]] }],
});

export interface BriefOptions {
  allowedGroups?: string[];
  requiredFamilies?: object[];
  allowedFamilies?: object[];
  deadline?: string;
  latePolicy?: 'accept' | 'accept-marked-late' | 'refuse';
  maxSheets?: number;
  publish?: boolean;
  rubric?: object[];
  title?: string;
}

/** Creates (and by default publishes) a brief in the demo studio as the instructor. */
export async function makeBrief(t: TestApp, instructor: string, o: BriefOptions = {}): Promise<Record<string, any>> {
  const res = await request(t.app)
    .post(`/api/studios/${DEMO_STUDIO_ID}/briefs`)
    .set('Cookie', instructor)
    .send({
      title: o.title ?? 'Plate boxes',
      body: 'Boxes of square plates.',
      constraints: {
        allowedGroups: o.allowedGroups ?? ['O'],
        requiredFamilies: o.requiredFamilies ?? [],
        allowedFamilies: o.allowedFamilies ?? [],
        materialId: PLYWOOD_ID,
        sheet: [600, 400],
        maxSheets: o.maxSheets ?? 4,
        angleToleranceDeg: 0.5,
      },
      deadline: o.deadline ?? new Date(t.clock.now().getTime() + 10 * 86_400_000).toISOString(),
      latePolicy: o.latePolicy ?? 'accept-marked-late',
      rubric: o.rubric ?? [],
    });
  expect(res.status, res.text).toBe(201);
  if (o.publish === false) return res.body;
  const pub = await request(t.app).post(`/api/briefs/${res.body.id}/publish`).set('Cookie', instructor);
  expect(pub.status, pub.text).toBe(200);
  return pub.body;
}

/** Waits until the audit pool has nothing in flight, then reads the revision. */
export async function settled(t: TestApp, cookie: string, revisionId: number): Promise<Record<string, any>> {
  await t.ctx.audits.idle();
  const res = await request(t.app).get(`/api/revisions/${revisionId}`).set('Cookie', cookie);
  expect(res.status, res.text).toBe(200);
  return res.body;
}
