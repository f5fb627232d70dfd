/**
 * The demo's studio work: the material catalogue, two published lamp briefs (icosahedral and
 * octahedral) and participants' revisions from the designs in `designs/` (see its README), each
 * audited here, synchronously with the engine, so the demo opens with results. The critique has
 * begun on participant@'s lantern: three pins with short threads (the first carried from
 * revision 1 to 2), the critic's rubric scores (not released) and one scheduled pin-up.
 */
import { existsSync, readFileSync } from 'node:fs';
import type { EntityManager } from 'typeorm';
import { briefConstraintsSchema, type BriefConstraints, type CreateBriefBody } from '../../shared/api/briefs.js';
import type { CameraView, CriterionScore, PinCategory, PinScope } from '../../shared/api/critique.js';
import type { Piece } from '../../shared/engine/model.js';
import { carryPin, pinWorldPosition, type PinAnchor as EngineAnchor } from '../../shared/engine/pins.js';
import { locateInPolygon } from '../../shared/engine/polygons.js';
import { auditAgainstBrief } from '../audits/brief-rules.js';
import { piecesOfDesign } from '../critique/pieces.js';
import { Audit, Brief, CriticAssignment, Pin, PinAnchor, PinComment, Pinup, PinupEntry, Revision, ScoreSheet, Submission } from '../db/entities/index.js';
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

/** A point well inside a piece: of a 20 × 20 grid over its box, the inside point nearest the box centre. */
function insidePoint(piece: Piece): [number, number] {
  const xs = piece.polygon.outer.map((p) => p[0]);
  const ys = piece.polygon.outer.map((p) => p[1]);
  const [x0, x1, y0, y1] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
  const c: [number, number] = [(x0 + x1) / 2, (y0 + y1) / 2];
  let best: [number, number] | null = null;
  for (let i = 1; i < 20; i++) {
    for (let j = 1; j < 20; j++) {
      const p: [number, number] = [x0 + ((x1 - x0) * i) / 20, y0 + ((y1 - y0) * j) / 20];
      if (locateInPolygon(p, piece.polygon, 0) !== 'inside') continue;
      if (!best || Math.hypot(p[0] - c[0], p[1] - c[1]) < Math.hypot(best[0] - c[0], best[1] - c[1])) best = p;
    }
  }
  return best ?? [piece.polygon.outer[0][0], piece.polygon.outer[0][1]];
}

/** Looking at the pinned point square-on from 450 mm off the face it sits on. */
function cameraAt(piece: Piece, anchor: EngineAnchor, thickness: number): CameraView {
  const w = pinWorldPosition(piece.frame, anchor, thickness);
  const n = piece.frame.normal;
  const d = 450 * anchor.side;
  return { position: [w[0] + n[0] * d, w[1] + n[1] * d, w[2] + n[2] * d], target: [w[0], w[1], w[2]] };
}

interface DemoPin {
  /** Index of the revision it is placed on (0 = first). */
  on: number;
  motif: string;
  /** Which piece of the motif (0 = first). */
  nth: number;
  scope: PinScope;
  category: PinCategory;
  author: 'critic' | 'instructor';
  resolvedBy?: 'participant';
  /** Each comment's time: hours after the pin was placed. */
  thread: { by: 'critic' | 'instructor' | 'participant'; hours: number; body: string }[];
}

/** The demo's critique of participant@'s lantern: a short thread on each pin (invented). */
const DEMO_PINS: DemoPin[] = [
  {
    on: 0,
    motif: 'panel',
    nth: 0,
    scope: 'orbit',
    category: 'structure',
    author: 'critic',
    resolvedBy: 'participant',
    thread: [
      { by: 'critic', hours: 0, body: 'Each half keel reaches only one panel, so this panel and its three keels hold only each other: the lantern falls into **20 loose groups**. Could every keel reach both panels of its edge?' },
      { by: 'participant', hours: 50, body: 'Revision 2 brings the whole keels back: each one now holds two panels and the audit shows one connected group.' },
      { by: 'critic', hours: 54, body: 'Much better, thank you.' },
    ],
  },
  {
    on: 1,
    motif: 'keel',
    nth: 0,
    scope: 'piece',
    category: 'fabrication',
    author: 'critic',
    thread: [
      { by: 'critic', hours: 0, body: 'These keels are small (about 41 × 13 mm). In 3 mm plywood a tenon this short can split along the grain when you press it home.' },
      { by: 'participant', hours: 5, body: 'I will nest them with the grain along the long side and cut a few spares. Is that enough, or should the keels grow?' },
    ],
  },
  {
    on: 1,
    motif: 'panel',
    nth: 4,
    scope: 'piece',
    category: 'form',
    author: 'instructor',
    thread: [{ by: 'instructor', hours: 0, body: 'Think about where the bulb sits: the 28 mm hole in this panel throws only a small spot. A larger opening on the lower panels would light the table.' }],
  },
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
      const revisionsOf: { id: number; at: Date }[] = [];
      for (const [i, d] of docs.entries()) {
        const at = new Date(now.getTime() - (5 - 2 * i) * DAY);
        const title = (d.doc as { title?: string }).title ?? d.name;
        const rev = await m.getRepository(Revision).save({ submissionId: sub.id, number: i + 1, title, design: JSON.stringify(d.doc), source: 'file' as const, late: false, createdAt: at });
        revisionsOf.push({ id: rev.id, at });
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
      if (demo.key === 'icosahedral' && plan.email === 'participant@example.org' && criticId !== undefined && instructorId !== null) {
        await seedCritique(m, {
          submissionId: sub.id,
          revisions: revisionsOf.map((r, i) => ({ ...r, doc: docs[i].doc })),
          people: { critic: criticId, instructor: instructorId, participant: participantId },
          material: { name: ply.name, thickness: ply.thickness, kerf: ply.kerf },
          now,
        });
      }
    }
    if (demo.key === 'icosahedral') {
      // One pin-up planned for the start of the critique window, every submission in name order.
      const subs = (await m.query(
        'SELECT s.id FROM submissions s JOIN users u ON u.id = s.participant_id WHERE s.brief_id = ? ORDER BY u.name, s.id',
        [brief.id],
      )) as { id: number }[];
      const pinup = await m.getRepository(Pinup).save({
        briefId: brief.id,
        title: 'Lantern crit at the long bench',
        startsAt: new Date(now.getTime() + (demo.deadlineInDays + 2) * DAY),
        durationMinutes: 120,
        room: 'Long bench, Quillmarsh Fabrication Hall',
        state: 'scheduled' as const,
        createdById: instructorId,
        createdAt: now,
        updatedAt: now,
      });
      for (const [i, sub] of subs.entries()) await m.getRepository(PinupEntry).insert({ pinupId: pinup.id, submissionId: sub.id, position: i + 1 });
    }
  }
}

/**
 * Pins with short threads on a submission (the first carried to the later revision where its
 * piece still holds it) and the critic's rubric scores, not released.
 */
async function seedCritique(
  m: EntityManager,
  a: {
    submissionId: number;
    revisions: { id: number; at: Date; doc: unknown }[];
    people: { critic: number; instructor: number; participant: number };
    material: { name: string; thickness: number; kerf: number };
    now: Date;
  },
): Promise<void> {
  const pieces = a.revisions.map((r) => {
    const built = piecesOfDesign(r.doc, a.material);
    return built.ok ? built.pieces : [];
  });
  let number = 0;
  for (const [k, demo] of DEMO_PINS.entries()) {
    const on = Math.min(demo.on, a.revisions.length - 1);
    const ofMotif = pieces[on].filter((p) => p.motif === demo.motif);
    const piece = ofMotif[Math.min(demo.nth, ofMotif.length - 1)];
    if (!piece) continue;
    const anchor: EngineAnchor = { piece: piece.id, point: insidePoint(piece), side: 1 };
    const at = new Date(a.revisions[on].at.getTime() + (k + 1) * 3_600_000);
    const times = demo.thread.map((c) => new Date(at.getTime() + c.hours * 3_600_000));
    const last = times[times.length - 1];
    const pin = await m.getRepository(Pin).save({
      submissionId: a.submissionId,
      number: ++number,
      placedOnRevisionId: a.revisions[on].id,
      scope: demo.scope,
      category: demo.category,
      state: demo.resolvedBy ? ('resolved' as const) : ('open' as const),
      camera: JSON.stringify(cameraAt(piece, anchor, a.material.thickness)),
      authorId: a.people[demo.author],
      resolvedById: demo.resolvedBy ? a.people[demo.resolvedBy] : null,
      outdatedReason: null,
      createdAt: at,
      updatedAt: last,
    });
    await m.getRepository(PinAnchor).insert({ pinId: pin.id, revisionId: a.revisions[on].id, piece: anchor.piece, x: anchor.point[0], y: anchor.point[1], side: anchor.side });
    // Carried through the later revisions the way an upload carries it.
    let current = anchor;
    for (let r = on + 1; r < a.revisions.length; r++) {
      const carried = carryPin(pieces[r - 1], pieces[r], current);
      if (!carried.carried) {
        await m.getRepository(Pin).update({ id: pin.id }, { outdatedReason: carried.message });
        break;
      }
      current = carried.anchor;
      await m.getRepository(PinAnchor).insert({ pinId: pin.id, revisionId: a.revisions[r].id, piece: current.piece, x: current.point[0], y: current.point[1], side: current.side });
    }
    for (const [i, c] of demo.thread.entries()) await m.getRepository(PinComment).insert({ pinId: pin.id, authorId: a.people[c.by], body: c.body, createdAt: times[i] });
  }
  const scores: CriterionScore[] = [
    { criterion: 'structure', score: 3, comment: 'Every keel holds two panels and the audit finds one connected group; it should go together without a jig.' },
    { criterion: 'light', score: 2, comment: 'The openings follow the 3-fold planes, but the lower panels still keep most of the light in.' },
    { criterion: 'economy', score: 2, comment: 'Two sheets of the three allowed.' },
  ];
  await m.getRepository(ScoreSheet).insert({ submissionId: a.submissionId, scorerId: a.people.critic, scores: JSON.stringify(scores), updatedAt: new Date(a.now.getTime() - 3_600_000) });
}
