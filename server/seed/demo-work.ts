/**
 * The demo's studio work: the material catalogue, two published lamp briefs (icosahedral and
 * octahedral) and participants' revisions from the designs in `designs/` (see its README), each
 * audited here, synchronously with the engine, so the demo opens with results.
 */
import { existsSync, readFileSync } from 'node:fs';
import type { EntityManager } from 'typeorm';
import { briefConstraintsSchema, type BriefConstraints, type CreateBriefBody } from '../../shared/api/briefs.js';
import { auditAgainstBrief } from '../audits/brief-rules.js';
import { Audit, Brief, CriticAssignment, Revision, Submission } from '../db/entities/index.js';
import { seedCatalogue } from './bootstrap.js';

const DAY = 24 * 60 * 60 * 1000;
const PLYWOOD = 'Birch plywood 3 mm';

const RUBRIC: CreateBriefBody['rubric'] = [
  {
    id: 'structure',
    criterion: 'Structure and joints',
    weight: 3,
    levels: [
      { score: 1, label: 'Loose', descriptor: 'Parts do not hold each other; the audit shows loose groups or joints that are not square.' },
      { score: 2, label: 'Holds', descriptor: 'One connected structure with square joints, a few short or fragile ones.' },
      { score: 3, label: 'Sound', descriptor: 'Every joint square and long enough; the piece assembles in a clear order.' },
    ],
  },
  {
    id: 'light',
    criterion: 'Light and form',
    weight: 2,
    levels: [
      { score: 1, label: 'Unresolved', descriptor: 'The symmetry reads, but light and openings are an afterthought.' },
      { score: 2, label: 'Considered', descriptor: 'Openings and shadows follow from the chosen families.' },
      { score: 3, label: 'Striking', descriptor: 'The families, openings and shadows make one idea.' },
    ],
  },
  {
    id: 'economy',
    criterion: 'Material economy',
    weight: 1,
    levels: [
      { score: 1, label: 'Wasteful', descriptor: 'More sheets than the brief allows, or large offcuts.' },
      { score: 2, label: 'Fair', descriptor: 'Within the sheet limit.' },
      { score: 3, label: 'Lean', descriptor: 'Within the limit with room to spare; parts nest well.' },
    ],
  },
];

interface DemoBrief {
  key: 'icosahedral' | 'octahedral';
  title: string;
  body: string;
  constraints: Omit<BriefConstraints, 'materialId'>;
  deadlineInDays: number;
}

const BRIEFS: DemoBrief[] = [
  {
    key: 'icosahedral',
    title: 'Icosahedral lantern',
    body: [
      'Design a hanging lantern under the icosahedral group **I**, cut from 3 mm birch plywood on the hall\u2019s 600 × 400 mm bed.',
      '',
      '- Use the planes square to the **3-fold** axes for the shell (required) and, if you like, the planes square to the **2-fold** axes for keels, webs or ribs.',
      '- Every joint must be square (the laser cuts square to the sheet), and the whole lantern must hold together as one piece.',
      '- At most three sheets.',
      '',
      'Hanging pieces: follow local codes for fixings and loads, and the hall\u2019s own safety rules.',
    ].join('\n'),
    constraints: {
      allowedGroups: ['I'],
      requiredFamilies: [{ axis: 3, offsetMin: 60, offsetMax: 160 }],
      allowedFamilies: [{ axis: 2, offsetMin: 10, offsetMax: 80 }],
      sheet: [600, 400],
      maxSheets: 3,
      angleToleranceDeg: 0.5,
      minJointLength: 6,
      pieceCount: { min: 20, max: 200 },
    },
    deadlineInDays: 12,
  },
  {
    key: 'octahedral',
    title: 'Octahedral table lamp',
    body: [
      'A table lamp under the octahedral group **O** in 3 mm birch plywood: facets on the planes square to the **3-fold** axes, held by parts on the **2-fold** (or 4-fold) planes.',
      '',
      'Two sheets of 600 × 400 mm at most. Keep the light hole large enough for a 40 mm bulb holder.',
    ].join('\n'),
    constraints: {
      allowedGroups: ['O'],
      requiredFamilies: [{ axis: 3, offsetMin: 40, offsetMax: 320 }],
      allowedFamilies: [
        { axis: 2, offsetMin: 10, offsetMax: 80 },
        { axis: 4, offsetMin: 10, offsetMax: 320 },
      ],
      sheet: [600, 400],
      maxSheets: 2,
      angleToleranceDeg: 0.5,
      minJointLength: 6,
      pieceCount: { min: 8, max: 120 },
    },
    deadlineInDays: 26,
  },
];

/** Who uploads what (files in `designs/`, oldest first); see designs/README.md. */
const REVISIONS: { brief: DemoBrief['key']; email: string; files: string[]; critic?: boolean }[] = [
  { brief: 'icosahedral', email: 'participant@example.org', files: ['i-half-keels', 'i-keel-lantern'], critic: true },
  { brief: 'icosahedral', email: 'priya.nandakumar@example.org', files: ['i-closed-shell'] },
  { brief: 'octahedral', email: 'lars.brennholt@example.org', files: ['o-doubled-facets', 'o-facet-lamp'], critic: true },
  { brief: 'octahedral', email: 'mei.tanaka-rowe@example.org', files: ['o-grand-facets'] },
];

function designFile(name: string): unknown | null {
  const url = new URL(`./designs/${name}.json`, import.meta.url);
  if (!existsSync(url)) return null;
  return JSON.parse(readFileSync(url, 'utf8')) as unknown;
}

export async function seedStudioWork(m: EntityManager, args: { studioId: number; userIds: ReadonlyMap<string, number>; now: Date }): Promise<void> {
  const { now } = args;
  const saved = await seedCatalogue(m, now);
  const ply = saved.get(PLYWOOD)!;
  const instructorId = args.userIds.get('instructor@example.org') ?? null;
  const criticId = args.userIds.get('critic@example.org');

  for (const demo of BRIEFS) {
    const constraints = briefConstraintsSchema.parse({ ...demo.constraints, materialId: ply.id });
    const brief = await m.getRepository(Brief).save(
      m.getRepository(Brief).create({
        studioId: args.studioId,
        title: demo.title,
        body: demo.body,
        constraints: JSON.stringify(constraints),
        materialId: ply.id,
        deadline: new Date(now.getTime() + demo.deadlineInDays * DAY),
        latePolicy: 'accept-marked-late',
        critiqueOpensAt: new Date(now.getTime() + (demo.deadlineInDays + 2) * DAY),
        critiqueClosesAt: new Date(now.getTime() + (demo.deadlineInDays + 9) * DAY),
        rubric: JSON.stringify(RUBRIC),
        state: 'published',
        galleryOpen: false,
        createdById: instructorId,
        createdAt: new Date(now.getTime() - 7 * DAY),
        updatedAt: new Date(now.getTime() - 7 * DAY),
        publishedAt: new Date(now.getTime() - 7 * DAY),
        closedAt: null,
      }),
    );
    for (const plan of REVISIONS.filter((r) => r.brief === demo.key)) {
      const participantId = args.userIds.get(plan.email);
      const docs = plan.files.map((f) => ({ name: f, doc: designFile(f) })).filter((d) => d.doc !== null);
      if (participantId === undefined || docs.length === 0) continue;
      const sub = await m.getRepository(Submission).save({ briefId: brief.id, participantId, createdAt: new Date(now.getTime() - 5 * DAY) });
      for (const [i, d] of docs.entries()) {
        const at = new Date(now.getTime() - (5 - 2 * i) * DAY);
        const title = (d.doc as { title?: string }).title ?? d.name;
        const rev = await m.getRepository(Revision).save({ submissionId: sub.id, number: i + 1, title, design: JSON.stringify(d.doc), source: 'file' as const, late: false, createdAt: at });
        const result = auditAgainstBrief({ design: d.doc, constraints, material: { name: ply.name, thickness: ply.thickness, kerf: ply.kerf } });
        await m.getRepository(Audit).save({
          revisionId: rev.id,
          state: result.ok ? ('done' as const) : ('failed' as const),
          report: result.ok ? JSON.stringify(result.report) : null,
          figures: result.ok ? JSON.stringify(result.figures) : null,
          errors: result.ok ? result.figures.errors : null,
          warnings: result.ok ? result.figures.warnings : null,
          error: result.ok ? null : result.error,
          attempts: 1,
          queuedAt: at,
          startedAt: at,
          finishedAt: at,
        });
      }
      if (plan.critic && criticId !== undefined) await m.getRepository(CriticAssignment).insert({ submissionId: sub.id, criticId, assignedAt: now });
    }
  }
}
