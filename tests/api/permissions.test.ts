/**
 * Every API route × every kind of caller → the expected status. The table must name exactly the
 * routes the app declares: a new route without an entry (or an entry for a route that is gone)
 * fails the first test. Bodies are valid, so a status reflects permission, not validation.
 */
import type { Express } from 'express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { listRoutes } from '../../server/app.js';
import { readFileSync } from 'node:fs';
import { Brief, Invitation, MailMessage, Material } from '../../server/db/entities/index.js';
import { rawDb, sqlDate } from '../../server/db/raw.js';
import { hashToken, newToken } from '../../server/lib/tokens.js';
import { piecesOfRevision } from '../../server/critique/pieces.js';
import { locateInPolygon } from '../../shared/engine/polygons.js';
import { DEMO_PASSWORD, DEMO_STUDIO_ID, startTestApp, type TestApp } from './helpers.js';

const CALLERS = ['anonymous', 'admin', 'technician', 'instructor', 'critic', 'participant', 'outsider'] as const;
type Caller = (typeof CALLERS)[number];
const EMAIL: Record<Exclude<Caller, 'anonymous'>, string> = {
  admin: 'admin@example.org',
  technician: 'technician@example.org',
  instructor: 'instructor@example.org',
  critic: 'critic@example.org',
  participant: 'participant@example.org',
  outsider: 'outsider@example.org',
};

interface Call {
  path: string;
  body?: object;
}
interface Entry {
  /** Builds the concrete request; called once per caller, so each call gets fresh fixtures. */
  call: (t: TestApp, caller: Caller) => Promise<Call> | Call;
  expect: Record<Caller, number>;
  /** The request changes the caller's session (sign-in, sign-out): use a fresh one. */
  freshSession?: boolean;
}

const all = (status: number): Record<Caller, number> => Object.fromEntries(CALLERS.map((c) => [c, status])) as Record<Caller, number>;
const signedIn = (status: number): Record<Caller, number> => ({ ...all(status), anonymous: 401 });
const only = (allowed: Caller[], status: number): Record<Caller, number> =>
  Object.fromEntries(CALLERS.map((c) => [c, c === 'anonymous' ? 401 : allowed.includes(c) ? status : 403])) as Record<Caller, number>;
const members = (status: number) => only(['admin', 'instructor', 'critic', 'participant'], status);
const instructors = (status: number) => only(['admin', 'instructor'], status);
const admins = (status: number) => only(['admin'], status);

let seq = 0;
const unique = (s: string) => `${s}-${++seq}`;

async function freshMember(t: TestApp): Promise<number> {
  const email = `${unique('member')}@example.org`;
  return (await t.addUser(email, 'Fresh Member', { studioId: DEMO_STUDIO_ID, role: 'participant' })).id;
}

async function freshInvitation(t: TestApp): Promise<{ id: number; token: string }> {
  const token = newToken();
  const now = t.clock.now();
  const inv = await t.ds.getRepository(Invitation).save({
    studioId: DEMO_STUDIO_ID,
    email: `${unique('invitee')}@example.org`,
    role: 'participant' as const,
    tokenHash: hashToken(token),
    invitedById: null,
    createdAt: now,
    expiresAt: new Date(now.getTime() + 86_400_000),
    acceptedAt: null,
    acceptedById: null,
    revokedAt: null,
  });
  return { id: inv.id, token };
}

const DESIGN = JSON.parse(readFileSync(new URL('../../server/seed/designs/o-facet-lamp.json', import.meta.url), 'utf8')) as object;
const PLYWOOD_ID = 1;
/** Seeded: brief 1 (icosahedral, published), submission 1 (participant@, critic@ assigned). */
const PUBLISHED_BRIEF = 1;
const SUBMISSION = 1;
const constraints = {
  allowedGroups: ['O'],
  requiredFamilies: [{ axis: 3, offsetMin: 40, offsetMax: 320 }],
  allowedFamilies: [{ axis: 2, offsetMin: 10, offsetMax: 80 }],
  materialId: PLYWOOD_ID,
  sheet: [600, 400],
  maxSheets: 2,
  angleToleranceDeg: 0.5,
};

async function freshBrief(t: TestApp, state: 'draft' | 'published'): Promise<number> {
  const now = t.clock.now();
  const b = await t.ds.getRepository(Brief).save({
    studioId: DEMO_STUDIO_ID,
    title: unique('Permission brief'),
    body: '',
    constraints: JSON.stringify({ ...constraints, requiredFamilies: constraints.requiredFamilies, allowedFamilies: constraints.allowedFamilies }),
    materialId: PLYWOOD_ID,
    deadline: new Date(now.getTime() + 30 * 86_400_000),
    latePolicy: 'accept' as const,
    critiqueOpensAt: null,
    critiqueClosesAt: null,
    rubric: '[]',
    state,
    galleryOpen: false,
    createdById: null,
    createdAt: now,
    updatedAt: now,
    publishedAt: state === 'published' ? now : null,
    closedAt: null,
  });
  return b.id;
}

async function freshMaterial(t: TestApp): Promise<number> {
  const now = t.clock.now();
  return (await t.ds.getRepository(Material).save({ name: unique('Test board'), thickness: 3, kerf: 0.2, cuttingSpeed: null, density: null, sheetSizes: '[]', prohibited: false, prohibitedReason: null, notes: '', createdAt: now, updatedAt: now })).id;
}

/** A revision of participant@ in the seeded submission whose audit failed (for retry). */
function failedRevision(t: TestApp): number {
  const db = rawDb(t.ds);
  const now = sqlDate(t.clock.now());
  const rev = db
    .prepare(`INSERT INTO revisions (submission_id, number, title, design, source, late, created_at) SELECT ?, MAX(number) + 1, 'x', ?, 'file', 0, ? FROM revisions WHERE submission_id = ?`)
    .run(SUBMISSION, JSON.stringify(DESIGN), now, SUBMISSION);
  db.prepare(`INSERT INTO audits (revision_id, state, error, attempts, queued_at) VALUES (?, 'failed', 'stand-in failure', 1, ?)`).run(rev.lastInsertRowid, now);
  return Number(rev.lastInsertRowid);
}

/** The seeded submission's latest revision (other entries add revisions to it). */
function latestRevision(t: TestApp): number {
  return (rawDb(t.ds).prepare('SELECT id FROM revisions WHERE submission_id = ? ORDER BY number DESC LIMIT 1').get(SUBMISSION) as { id: number }).id;
}

/** A valid pin body on a revision: its first piece and a point inside it. */
function pinOn(t: TestApp, revisionId: number): object {
  const built = piecesOfRevision(t.ds, revisionId);
  if (!built.ok) throw new Error(built.error);
  const piece = built.pieces[0];
  const xs = piece.polygon.outer.map((p) => p[0]);
  const ys = piece.polygon.outer.map((p) => p[1]);
  for (let i = 1; i < 20; i++) {
    for (let j = 1; j < 20; j++) {
      const point: [number, number] = [Math.min(...xs) + ((Math.max(...xs) - Math.min(...xs)) * i) / 20, Math.min(...ys) + ((Math.max(...ys) - Math.min(...ys)) * j) / 20];
      if (locateInPolygon(point, piece.polygon) === 'inside') {
        return { anchor: { piece: piece.id, point, side: 1 }, category: 'structure', camera: { position: [300, 300, 300], target: [0, 0, 0] }, body: 'Permission pin.' };
      }
    }
  }
  throw new Error(`no point inside ${piece.id}`);
}

/** A pin by the instructor on the seeded submission's latest revision. */
function freshPin(t: TestApp): number {
  const db = rawDb(t.ds);
  const now = sqlDate(t.clock.now());
  const rev = latestRevision(t);
  const author = (db.prepare(`SELECT id FROM users WHERE email = 'instructor@example.org'`).get() as { id: number }).id;
  const pin = db
    .prepare(
      `INSERT INTO pins (submission_id, number, placed_on_revision_id, scope, category, state, camera, author_id, created_at, updated_at)
       SELECT ?, COALESCE(MAX(number), 0) + 1, ?, 'piece', 'form', 'open', '{"position":[1,1,1],"target":[0,0,0]}', ?, ?, ? FROM pins WHERE submission_id = ?`,
    )
    .run(SUBMISSION, rev, author, now, now, SUBMISSION);
  const id = Number(pin.lastInsertRowid);
  db.prepare(`INSERT INTO pin_anchors (pin_id, revision_id, piece, x, y, side) VALUES (?, ?, 'panel-01', 0, 0, 1)`).run(id, rev);
  db.prepare(`INSERT INTO pin_comments (pin_id, author_id, body, created_at) VALUES (?, ?, 'Fresh pin.', ?)`).run(id, author, now);
  return id;
}

/** A scheduled pin-up of the seeded brief with the seeded submission in it. */
function freshPinup(t: TestApp): number {
  const db = rawDb(t.ds);
  const now = sqlDate(t.clock.now());
  const p = db
    .prepare(`INSERT INTO pinups (brief_id, title, starts_at, duration_minutes, room, state, created_by_id, created_at, updated_at) VALUES (?, ?, ?, 90, '', 'scheduled', NULL, ?, ?)`)
    .run(PUBLISHED_BRIEF, unique('Pin-up'), now, now, now);
  db.prepare('INSERT INTO pinup_entries (pinup_id, submission_id, position) VALUES (?, ?, 1)').run(p.lastInsertRowid, SUBMISSION);
  return Number(p.lastInsertRowid);
}

/** Gives the seeded submission a final mark so it can be released. */
function markedSubmission(t: TestApp): number {
  rawDb(t.ds)
    .prepare(`INSERT INTO feedback (submission_id, final_mark, summary, released_at, updated_at) VALUES (?, 70, '', NULL, ?) ON CONFLICT (submission_id) DO UPDATE SET final_mark = 70`)
    .run(SUBMISSION, sqlDate(t.clock.now()));
  return SUBMISSION;
}

/** Set in beforeAll: a revision uploaded by participant@ to the seeded brief, and its design file. */
let uploaded: { revisionId: number; fileId: number };

const TABLE: Record<string, Entry> = {
  'GET /api/health': { call: () => ({ path: '/api/health' }), expect: all(200) },
  'POST /api/auth/login': {
    call: () => ({ path: '/api/auth/login', body: { email: 'participant@example.org', password: DEMO_PASSWORD } }),
    expect: all(200),
    freshSession: true,
  },
  'POST /api/auth/logout': { call: () => ({ path: '/api/auth/logout' }), expect: all(204), freshSession: true },
  'GET /api/auth/me': { call: () => ({ path: '/api/auth/me' }), expect: signedIn(200) },
  'POST /api/auth/password-reset': { call: () => ({ path: '/api/auth/password-reset', body: { email: 'no-account@example.org' } }), expect: all(202) },
  'POST /api/auth/password-reset/confirm': {
    call: () => ({ path: '/api/auth/password-reset/confirm', body: { token: newToken(), password: 'a-long-new-password' } }),
    expect: all(410),
  },
  'GET /api/studios': { call: () => ({ path: '/api/studios' }), expect: signedIn(200) },
  'POST /api/studios': { call: () => ({ path: '/api/studios', body: { name: unique('Permission Studio') } }), expect: admins(201) },
  'GET /api/studios/:studioId': { call: () => ({ path: `/api/studios/${DEMO_STUDIO_ID}` }), expect: members(200) },
  'GET /api/studios/:studioId/members': { call: () => ({ path: `/api/studios/${DEMO_STUDIO_ID}/members` }), expect: members(200) },
  'PATCH /api/studios/:studioId/members/:userId': {
    call: async (t) => ({ path: `/api/studios/${DEMO_STUDIO_ID}/members/${await freshMember(t)}`, body: { role: 'critic' } }),
    expect: instructors(200),
  },
  'DELETE /api/studios/:studioId/members/:userId': {
    call: async (t) => ({ path: `/api/studios/${DEMO_STUDIO_ID}/members/${await freshMember(t)}` }),
    expect: instructors(204),
  },
  'GET /api/studios/:studioId/invitations': { call: () => ({ path: `/api/studios/${DEMO_STUDIO_ID}/invitations` }), expect: instructors(200) },
  'POST /api/studios/:studioId/invitations': {
    call: () => ({ path: `/api/studios/${DEMO_STUDIO_ID}/invitations`, body: { email: `${unique('invited')}@example.org`, role: 'participant' } }),
    expect: instructors(201),
  },
  'DELETE /api/studios/:studioId/invitations/:invitationId': {
    call: async (t) => ({ path: `/api/studios/${DEMO_STUDIO_ID}/invitations/${(await freshInvitation(t)).id}` }),
    expect: instructors(204),
  },
  'GET /api/invitations/:token': { call: async (t) => ({ path: `/api/invitations/${(await freshInvitation(t)).token}` }), expect: all(200) },
  // A newcomer's invitation: anyone signed in as another account is refused.
  'POST /api/invitations/:token/accept': {
    call: async (t) => ({ path: `/api/invitations/${(await freshInvitation(t)).token}/accept`, body: { name: 'New Person', password: 'new-person-password' } }),
    expect: { ...all(403), anonymous: 201 },
  },
  'GET /api/admin/users': { call: () => ({ path: '/api/admin/users' }), expect: admins(200) },
  'PATCH /api/admin/users/:userId': {
    call: async (t) => ({ path: `/api/admin/users/${await freshMember(t)}`, body: { globalRole: 'technician' } }),
    expect: admins(200),
  },
  'GET /api/admin/outbox': { call: () => ({ path: '/api/admin/outbox' }), expect: admins(200) },
  'GET /api/admin/outbox/:messageId': {
    call: async (t) => {
      const m = await t.ds.getRepository(MailMessage).save({ from: 'a@example.org', to: 'b@example.org', subject: 's', text: 't', html: null, rawSize: 1, receivedAt: t.clock.now() });
      return { path: `/api/admin/outbox/${m.id}` };
    },
    expect: admins(200),
  },
  'GET /api/materials': { call: () => ({ path: '/api/materials' }), expect: signedIn(200) },
  'POST /api/materials': { call: () => ({ path: '/api/materials', body: { name: unique('Poplar plywood'), thickness: 4, kerf: 0.2 } }), expect: admins(201) },
  'PATCH /api/materials/:materialId': { call: async (t) => ({ path: `/api/materials/${await freshMaterial(t)}`, body: { kerf: 0.18 } }), expect: admins(200) },
  'DELETE /api/materials/:materialId': { call: async (t) => ({ path: `/api/materials/${await freshMaterial(t)}` }), expect: admins(204) },
  'GET /api/studios/:studioId/briefs': { call: () => ({ path: `/api/studios/${DEMO_STUDIO_ID}/briefs` }), expect: members(200) },
  'POST /api/studios/:studioId/briefs': {
    call: () => ({ path: `/api/studios/${DEMO_STUDIO_ID}/briefs`, body: { title: unique('New brief'), constraints, deadline: '2026-06-01T17:00:00Z' } }),
    expect: instructors(201),
  },
  'GET /api/briefs/:briefId': { call: () => ({ path: `/api/briefs/${PUBLISHED_BRIEF}` }), expect: members(200) },
  'PATCH /api/briefs/:briefId': { call: async (t) => ({ path: `/api/briefs/${await freshBrief(t, 'draft')}`, body: { title: 'Renamed' } }), expect: instructors(200) },
  'POST /api/briefs/:briefId/publish': { call: async (t) => ({ path: `/api/briefs/${await freshBrief(t, 'draft')}/publish` }), expect: instructors(200) },
  'POST /api/briefs/:briefId/close': { call: async (t) => ({ path: `/api/briefs/${await freshBrief(t, 'published')}/close` }), expect: instructors(200) },
  'GET /api/briefs/:briefId/changes': { call: () => ({ path: `/api/briefs/${PUBLISHED_BRIEF}/changes` }), expect: members(200) },
  'GET /api/briefs/:briefId/templates/:familyId': { call: () => ({ path: `/api/briefs/${PUBLISHED_BRIEF}/templates/fold-3` }), expect: members(200) },
  'GET /api/briefs/:briefId/submissions': { call: () => ({ path: `/api/briefs/${PUBLISHED_BRIEF}/submissions` }), expect: members(200) },
  'GET /api/briefs/:briefId/export': { call: () => ({ path: `/api/briefs/${PUBLISHED_BRIEF}/export` }), expect: instructors(200) },
  'POST /api/briefs/:briefId/reaudit': { call: async (t) => ({ path: `/api/briefs/${await freshBrief(t, 'published')}/reaudit` }), expect: instructors(200) },
  'POST /api/briefs/:briefId/revisions': {
    call: async (t) => ({ path: `/api/briefs/${await freshBrief(t, 'published')}/revisions`, body: { design: DESIGN } }),
    expect: only(['admin', 'participant'], 201),
  },
  'GET /api/submissions/:submissionId': { call: () => ({ path: `/api/submissions/${SUBMISSION}` }), expect: members(200) },
  'GET /api/submissions/:submissionId/history': { call: () => ({ path: `/api/submissions/${SUBMISSION}/history` }), expect: members(200) },
  'PUT /api/submissions/:submissionId/critics': {
    call: async (t) => {
      const critic = (await t.ds.query(`SELECT id FROM users WHERE email = 'critic@example.org'`)) as { id: number }[];
      return { path: `/api/submissions/${SUBMISSION}/critics`, body: { userIds: [critic[0].id] } };
    },
    expect: instructors(200),
  },
  'GET /api/revisions/:revisionId': { call: () => ({ path: `/api/revisions/${uploaded.revisionId}` }), expect: members(200) },
  'GET /api/revisions/:revisionId/thumbnail': { call: () => ({ path: `/api/revisions/${uploaded.revisionId}/thumbnail` }), expect: members(200) },
  'GET /api/revisions/:revisionId/audit': { call: () => ({ path: `/api/revisions/${uploaded.revisionId}/audit` }), expect: members(200) },
  'POST /api/revisions/:revisionId/retry': {
    call: (t) => ({ path: `/api/revisions/${failedRevision(t)}/retry` }),
    expect: only(['admin', 'instructor', 'participant'], 200),
  },
  'GET /api/revisions/:revisionId/files/:fileId': { call: () => ({ path: `/api/revisions/${uploaded.revisionId}/files/${uploaded.fileId}` }), expect: members(200) },
  'GET /api/revisions/:revisionId/templates/:familyId': { call: () => ({ path: `/api/revisions/${uploaded.revisionId}/templates/facets` }), expect: members(200) },
  'GET /api/me/notifications': { call: () => ({ path: '/api/me/notifications' }), expect: signedIn(200) },
  'PUT /api/me/notifications': { call: () => ({ path: '/api/me/notifications', body: { 'deadline-reminder': true } }), expect: signedIn(200) },
  'GET /api/revisions/:revisionId/pins': { call: (t) => ({ path: `/api/revisions/${latestRevision(t)}/pins` }), expect: members(200) },
  'POST /api/revisions/:revisionId/pins': {
    call: (t) => {
      const rev = latestRevision(t);
      return { path: `/api/revisions/${rev}/pins`, body: pinOn(t, rev) };
    },
    expect: only(['admin', 'instructor', 'critic'], 201),
  },
  'POST /api/pins/:pinId/comments': { call: (t) => ({ path: `/api/pins/${freshPin(t)}/comments`, body: { body: 'A reply.' } }), expect: members(201) },
  'PATCH /api/pins/:pinId': { call: (t) => ({ path: `/api/pins/${freshPin(t)}`, body: { state: 'resolved' } }), expect: members(200) },
  'GET /api/briefs/:briefId/pinups': { call: () => ({ path: `/api/briefs/${PUBLISHED_BRIEF}/pinups` }), expect: members(200) },
  'POST /api/briefs/:briefId/pinups': {
    call: () => ({ path: `/api/briefs/${PUBLISHED_BRIEF}/pinups`, body: { title: unique('Crit'), startsAt: '2026-03-20T14:00:00Z' } }),
    expect: instructors(201),
  },
  'GET /api/pinups/:pinupId': { call: (t) => ({ path: `/api/pinups/${freshPinup(t)}` }), expect: members(200) },
  'PATCH /api/pinups/:pinupId': { call: (t) => ({ path: `/api/pinups/${freshPinup(t)}`, body: { room: 'Bench room 2' } }), expect: instructors(200) },
  'DELETE /api/pinups/:pinupId': { call: (t) => ({ path: `/api/pinups/${freshPinup(t)}` }), expect: instructors(204) },
  'GET /api/submissions/:submissionId/feedback': { call: () => ({ path: `/api/submissions/${SUBMISSION}/feedback` }), expect: members(200) },
  'PUT /api/submissions/:submissionId/scores': {
    call: () => ({ path: `/api/submissions/${SUBMISSION}/scores`, body: { scores: [{ criterion: 'structure', score: 2 }] } }),
    expect: only(['admin', 'instructor', 'critic'], 200),
  },
  'PUT /api/submissions/:submissionId/feedback': {
    call: () => ({ path: `/api/submissions/${SUBMISSION}/feedback`, body: { finalMark: 72, summary: 'Sound structure.' } }),
    expect: instructors(200),
  },
  'POST /api/submissions/:submissionId/feedback/release': { call: (t) => ({ path: `/api/submissions/${markedSubmission(t)}/feedback/release` }), expect: instructors(200) },
};

/** Route layers Express actually holds (catches a route added without `defineRoutes`). */
function expressRouteCount(app: Express): number {
  let n = 0;
  const walk = (stack: { route?: { path: string; methods: Record<string, boolean> }; handle?: { stack?: unknown[] } }[]) => {
    for (const layer of stack) {
      if (layer.route) {
        if (layer.route.path !== '/{*splat}') n += Object.keys(layer.route.methods).filter((m) => m !== '_all').length;
      } else if (layer.handle?.stack) walk(layer.handle.stack as never);
    }
  };
  walk((app as unknown as { router: { stack: never } }).router.stack);
  return n;
}

let t: TestApp;
const cookies = new Map<Caller, string>();
beforeAll(async () => {
  t = await startTestApp();
  await t.addUser(EMAIL.outsider, 'Olu Outsider');
  for (const c of CALLERS) if (c !== 'anonymous') cookies.set(c, await t.cookieFor(EMAIL[c]));
  const res = await request(t.app).post(`/api/briefs/${PUBLISHED_BRIEF}/revisions`).set('Cookie', cookies.get('participant')!).send({ design: DESIGN });
  expect(res.status, res.text).toBe(201);
  uploaded = { revisionId: res.body.id, fileId: res.body.files[0].id };
});
afterAll(async () => {
  await t.close();
});

describe('permission table', () => {
  it('names every declared route, and only those', () => {
    const declared = listRoutes(t.app).map((r) => `${r.method} ${r.path}`).sort();
    expect(Object.keys(TABLE).sort()).toEqual(declared);
    expect(expressRouteCount(t.app)).toBe(declared.length);
  });

  for (const [key, entry] of Object.entries(TABLE)) {
    const [method, pattern] = key.split(' ');
    it(`${key}`, async () => {
      const got: Record<string, number> = {};
      for (const caller of CALLERS) {
        const { path, body } = await entry.call(t, caller);
        expect(path.includes(':'), `${key} left a placeholder in ${path}`).toBe(false);
        let cookie = caller === 'anonymous' ? undefined : cookies.get(caller);
        if (entry.freshSession && caller !== 'anonymous') cookie = await t.cookieFor(EMAIL[caller]);
        let req = request(t.app)[method.toLowerCase() as 'get' | 'post' | 'patch' | 'put' | 'delete'](path);
        if (cookie) req = req.set('Cookie', cookie);
        const res = body ? await req.send(body) : await req;
        got[caller] = res.status;
        if (res.status >= 400) expect(res.body?.error?.code, `${caller} ${key}: ${res.text}`).toBeTypeOf('string');
      }
      expect(got, `${method} ${pattern}`).toEqual(entry.expect);
    });
  }
});
