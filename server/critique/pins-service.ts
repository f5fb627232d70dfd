/**
 * Pins on a submission's model and their threads.
 *
 * - A pin is placed on the submission's latest revision by an instructor or an assigned critic;
 *   its anchor must name a piece of that revision and a point on it (within PIN_ON_PIECE_TOL).
 *   Pins are numbered per submission from 1; the first comment is the pin's body.
 * - Each revision a pin is shown on has an anchor row. When a new revision is created,
 *   {@link carryPinsOver} carries every pin shown on the previous revision with `carryPin`:
 *   carried pins get an anchor on the new revision; the others are marked outdated with the
 *   reason and stay on the previous one.
 * - `version` of a revision's list is a hash of everything in it, so a poller sees any change.
 * Writes spanning rows are one synchronous transaction; e-mails go out after it commits.
 */
import { createHash } from 'node:crypto';
import type { DataSource } from 'typeorm';
import type { CameraView, CreatePinBody, Pin as PinDto, PinComment as PinCommentDto, RevisionPins, UpdatePinBody } from '../../shared/api/critique.js';
import { createPinBodySchema } from '../../shared/api/critique.js';
import { carryPin, PIN_ON_PIECE_TOL, type PinAnchor } from '../../shared/engine/pins.js';
import { locateInPolygon } from '../../shared/engine/polygons.js';
import type { AppContext } from '../context.js';
import { fromSqlDate, rawDb, sqlDate, whenNoTransaction } from '../db/raw.js';
import { ConflictError, NotFoundError, UnprocessableError } from '../http/errors.js';
import { assertCan } from '../policy/enforce.js';
import { can, type Actor, type Resource } from '../policy/policy.js';
import { critiqueMails, type ThumbnailSource } from './mails.js';
import { peopleOf } from './people.js';
import { piecesOfRevision } from './pieces.js';

interface PinRow {
  id: number;
  submission_id: number;
  number: number;
  placed_on_revision_id: number;
  placed_number: number;
  scope: PinDto['scope'];
  category: PinDto['category'];
  state: PinDto['state'];
  camera: string;
  author_id: number | null;
  resolved_by_id: number | null;
  outdated_reason: string | null;
  created_at: string;
  updated_at: string;
  revision_id: number;
  /** Number of the revision this row shows the pin on. */
  shown_number: number;
  piece: string;
  x: number;
  y: number;
  side: 1 | -1;
  /** Number of the last revision the pin is anchored on. */
  last_number: number;
}

const PIN_SELECT = `
  SELECT p.id, p.submission_id, p.number, p.placed_on_revision_id, pr.number AS placed_number, p.scope, p.category, p.state, p.camera,
         p.author_id, p.resolved_by_id, p.outdated_reason, p.created_at, p.updated_at,
         a.revision_id, ar.number AS shown_number, a.piece, a.x, a.y, a.side,
         (SELECT MAX(r2.number) FROM pin_anchors a2 JOIN revisions r2 ON r2.id = a2.revision_id WHERE a2.pin_id = p.id) AS last_number
    FROM pin_anchors a JOIN pins p ON p.id = a.pin_id JOIN revisions pr ON pr.id = p.placed_on_revision_id
    JOIN revisions ar ON ar.id = a.revision_id`;

interface RevisionFacts {
  id: number;
  number: number;
  submission_id: number;
  studio_id: number;
  latest_id: number;
  latest_number: number;
}

const iso = (s: string): string => fromSqlDate(s)!.toISOString();

/** Revision facts: its number, submission, studio and the submission's latest revision. */
function revisionFacts(db: ReturnType<typeof rawDb>, revisionId: number): RevisionFacts {
  const r = db
    .prepare(
      `SELECT r.id, r.number, r.submission_id, b.studio_id, l.id AS latest_id, l.number AS latest_number
         FROM revisions r JOIN submissions s ON s.id = r.submission_id JOIN briefs b ON b.id = s.brief_id
         JOIN revisions l ON l.submission_id = r.submission_id AND l.number = (SELECT MAX(number) FROM revisions WHERE submission_id = r.submission_id)
        WHERE r.id = ?`,
    )
    .get(revisionId) as RevisionFacts | undefined;
  if (!r) throw new NotFoundError('There is no revision with this id.');
  return r;
}

export interface PinsServiceOptions {
  thumbnail?: ThumbnailSource;
}

export function pinsService(ctx: AppContext, options: PinsServiceOptions = {}) {
  const ds: DataSource = ctx.dataSource;
  const db = rawDb(ds);
  const mails = critiqueMails(ctx, options.thumbnail);

  function dtos(rows: PinRow[], studioId: number): PinDto[] {
    if (rows.length === 0) return [];
    const people = peopleOf(db, studioId);
    const ids = rows.map((r) => r.id);
    const comments = db
      .prepare(`SELECT id, pin_id, author_id, body, created_at FROM pin_comments WHERE pin_id IN (${ids.map(() => '?').join(',')}) ORDER BY id`)
      .all(...ids) as { id: number; pin_id: number; author_id: number | null; body: string; created_at: string }[];
    const byPin = new Map<number, PinCommentDto[]>();
    for (const c of comments) {
      const list = byPin.get(c.pin_id) ?? [];
      list.push({ id: c.id, author: { ...people.person(c.author_id), role: people.role(c.author_id) }, body: c.body, createdAt: iso(c.created_at) });
      byPin.set(c.pin_id, list);
    }
    return rows.map((r) => {
      // Outdated where it stayed behind; on the earlier revisions it did carry over from, it is not.
      const outdated = r.outdated_reason !== null && r.shown_number === r.last_number;
      return {
        id: r.id,
        number: r.number,
        submissionId: r.submission_id,
        placedOnRevision: { id: r.placed_on_revision_id, number: r.placed_number },
        revisionId: r.revision_id,
        anchor: { piece: r.piece, point: [r.x, r.y], side: r.side === -1 ? -1 : 1 },
        scope: r.scope,
        category: r.category,
        state: r.state,
        camera: JSON.parse(r.camera) as CameraView,
        author: people.person(r.author_id),
        createdAt: iso(r.created_at),
        updatedAt: iso(r.updated_at),
        resolvedBy: r.resolved_by_id !== null ? people.person(r.resolved_by_id) : null,
        outdated,
        outdatedReason: outdated ? r.outdated_reason : null,
        comments: byPin.get(r.id) ?? [],
      };
    });
  }

  /** The pin as shown on its last anchored revision. */
  function pinNow(pinId: number): PinDto {
    const row = db
      .prepare(`${PIN_SELECT} WHERE p.id = ? ORDER BY ar.number DESC LIMIT 1`)
      .get(pinId) as PinRow | undefined;
    if (!row) throw new NotFoundError('There is no pin with this id.');
    const studio = db.prepare('SELECT b.studio_id FROM submissions s JOIN briefs b ON b.id = s.brief_id WHERE s.id = ?').get(row.submission_id) as { studio_id: number };
    return dtos([row], studio.studio_id)[0];
  }

  function bump(pinId: number, now: string): void {
    db.prepare('UPDATE pins SET updated_at = ? WHERE id = ?').run(now, pinId);
  }

  return {
    pinNow,

    /** The pins shown on a revision, oldest first, with the outdated ones left on earlier revisions. */
    list(actor: Actor, revisionId: number, resource: Resource): RevisionPins {
      const rev = revisionFacts(db, revisionId);
      const rows = db.prepare(`${PIN_SELECT} WHERE a.revision_id = ? ORDER BY p.number`).all(revisionId) as PinRow[];
      const pins = dtos(rows, rev.studio_id);
      const outdatedEarlier = (
        db
          .prepare(
            `SELECT r.id AS revision_id, r.number, COUNT(*) AS n FROM pins p
               JOIN pin_anchors a ON a.pin_id = p.id JOIN revisions r ON r.id = a.revision_id
              WHERE p.submission_id = ? AND p.outdated_reason IS NOT NULL
                AND r.number = (SELECT MAX(r2.number) FROM pin_anchors a2 JOIN revisions r2 ON r2.id = a2.revision_id WHERE a2.pin_id = p.id)
                AND r.number < ?
              GROUP BY r.id, r.number ORDER BY r.number`,
          )
          .all(rev.submission_id, rev.number) as { revision_id: number; number: number; n: number }[]
      ).map((r) => ({ revisionId: r.revision_id, revisionNumber: r.number, count: r.n }));
      const canPin = rev.latest_id === rev.id && can(actor, 'pin.create', resource);
      const version = createHash('sha1').update(JSON.stringify({ pins, outdatedEarlier, canPin })).digest('hex').slice(0, 16);
      return { revisionId, pins, outdatedEarlier, canPin, version };
    },

    /** Places a pin on the latest revision (validated against its pieces); mails the participant. */
    async create(actor: Actor, revisionId: number, input: CreatePinBody): Promise<PinDto> {
      const body = createPinBodySchema.parse(input);
      const rev = revisionFacts(db, revisionId);
      if (rev.latest_id !== rev.id) {
        throw new ConflictError(
          `Revision ${rev.number} is no longer the latest: revision ${rev.latest_number} is newer. Place the pin on revision ${rev.latest_number}.`,
          'revision_not_latest',
        );
      }
      const built = piecesOfRevision(ds, revisionId);
      const pieces = built.ok ? built.pieces : [];
      const piece = pieces.find((p) => p.id === body.anchor.piece);
      if (!piece) {
        const why = built.ok ? `revision ${rev.number} has no piece ${body.anchor.piece}` : `revision ${rev.number} has no pieces (${built.error})`;
        throw new UnprocessableError(`Check body.anchor.piece: ${why}.`, { 'body.anchor.piece': why });
      }
      if (locateInPolygon(body.anchor.point, piece.polygon, PIN_ON_PIECE_TOL) === 'outside') {
        const why = `the point (${body.anchor.point.map((v) => +v.toFixed(2)).join(', ')}) is not on piece ${piece.id}`;
        throw new UnprocessableError(`Check body.anchor.point: ${why}.`, { 'body.anchor.point': why });
      }
      const now = sqlDate(ctx.clock.now());
      await whenNoTransaction(db);
      const pinId = db.transaction(() => {
        // Checked again inside the transaction: a revision uploaded meanwhile has already carried
        // the previous revision's pins over, and this one would be left behind.
        const latest = revisionFacts(db, revisionId);
        if (latest.latest_id !== revisionId) {
          throw new ConflictError(`Revision ${latest.number} is no longer the latest: revision ${latest.latest_number} is newer. Place the pin on revision ${latest.latest_number}.`, 'revision_not_latest');
        }
        const ins = db
          .prepare(
            `INSERT INTO pins (submission_id, number, placed_on_revision_id, scope, category, state, camera, author_id, resolved_by_id, outdated_reason, created_at, updated_at)
             SELECT ?, COALESCE(MAX(number), 0) + 1, ?, ?, ?, 'open', ?, ?, NULL, NULL, ?, ? FROM pins WHERE submission_id = ?`,
          )
          .run(rev.submission_id, revisionId, body.scope, body.category, JSON.stringify(body.camera), actor.id, now, now, rev.submission_id);
        const id = Number(ins.lastInsertRowid);
        db.prepare('INSERT INTO pin_anchors (pin_id, revision_id, piece, x, y, side) VALUES (?, ?, ?, ?, ?, ?)').run(id, revisionId, piece.id, body.anchor.point[0], body.anchor.point[1], body.anchor.side);
        db.prepare('INSERT INTO pin_comments (pin_id, author_id, body, created_at) VALUES (?, ?, ?, ?)').run(id, actor.id, body.body, now);
        return id;
      })();
      await mails.pinCreated(pinId, body.body);
      return pinNow(pinId);
    },

    /** A reply in the thread; mails the others in it. */
    async reply(actor: Actor, pinId: number, text: string): Promise<PinCommentDto> {
      const now = sqlDate(ctx.clock.now());
      await whenNoTransaction(db);
      const commentId = db.transaction(() => {
        const c = db.prepare('INSERT INTO pin_comments (pin_id, author_id, body, created_at) VALUES (?, ?, ?, ?)').run(pinId, actor.id, text, now);
        bump(pinId, now);
        return Number(c.lastInsertRowid);
      })();
      await mails.pinReply(pinId, commentId, actor.id, text);
      const pin = pinNow(pinId);
      return pin.comments.find((c) => c.id === commentId)!;
    },

    /** Resolve or reopen (records who resolved), or change the category (author or instructor). */
    async update(actor: Actor, pinId: number, patch: UpdatePinBody, resource: Resource): Promise<PinDto> {
      if (patch.category !== undefined) assertCan(actor, 'pin.categorize', resource);
      const now = sqlDate(ctx.clock.now());
      await whenNoTransaction(db);
      db.transaction(() => {
        const cur = db.prepare('SELECT state, category FROM pins WHERE id = ?').get(pinId) as { state: string; category: string } | undefined;
        if (!cur) throw new NotFoundError('There is no pin with this id.');
        let changed = false;
        if (patch.state !== undefined && patch.state !== cur.state) {
          db.prepare('UPDATE pins SET state = ?, resolved_by_id = ? WHERE id = ?').run(patch.state, patch.state === 'resolved' ? actor.id : null, pinId);
          changed = true;
        }
        if (patch.category !== undefined && patch.category !== cur.category) {
          db.prepare('UPDATE pins SET category = ? WHERE id = ?').run(patch.category, pinId);
          changed = true;
        }
        if (changed) bump(pinId, now);
      })();
      return pinNow(pinId);
    },
  };
}

export type CarryOutcome = { pinId: number; carried: true; anchor: PinAnchor } | { pinId: number; carried: false; reason: string };

/**
 * Carries the pins shown on the previous revision of `newRevisionId`'s submission over to it
 * (one transaction). Returns what happened to each pin; nothing when there is no previous
 * revision or it has no live pins (the pieces are then never built).
 */
export async function carryPinsOver(ds: DataSource, newRevisionId: number): Promise<CarryOutcome[]> {
  const db = rawDb(ds);
  const rev = db.prepare('SELECT submission_id, number FROM revisions WHERE id = ?').get(newRevisionId) as { submission_id: number; number: number } | undefined;
  if (!rev) return [];
  const prev = db.prepare('SELECT id FROM revisions WHERE submission_id = ? AND number < ? ORDER BY number DESC LIMIT 1').get(rev.submission_id, rev.number) as { id: number } | undefined;
  if (!prev) return [];
  const live = db
    .prepare(
      `SELECT a.pin_id, a.piece, a.x, a.y, a.side FROM pin_anchors a JOIN pins p ON p.id = a.pin_id
        WHERE a.revision_id = ? AND p.outdated_reason IS NULL
          AND NOT EXISTS (SELECT 1 FROM pin_anchors b WHERE b.pin_id = a.pin_id AND b.revision_id = ?)
        ORDER BY p.number`,
    )
    .all(prev.id, newRevisionId) as { pin_id: number; piece: string; x: number; y: number; side: number }[];
  if (live.length === 0) return [];
  const from = piecesOfRevision(ds, prev.id);
  const to = piecesOfRevision(ds, newRevisionId);
  const outcomes: CarryOutcome[] = live.map((a) => {
    const anchor: PinAnchor = { piece: a.piece, point: [a.x, a.y], side: a.side === -1 ? -1 : 1 };
    if (!from.ok) return { pinId: a.pin_id, carried: false, reason: `The revision the pin was on could not be read again: ${from.error}` };
    if (!to.ok) return { pinId: a.pin_id, carried: false, reason: `The new revision could not be read: ${to.error}` };
    const r = carryPin(from.pieces, to.pieces, anchor);
    return r.carried ? { pinId: a.pin_id, carried: true, anchor: r.anchor } : { pinId: a.pin_id, carried: false, reason: r.message };
  });
  await whenNoTransaction(db);
  db.transaction(() => {
    const ins = db.prepare('INSERT OR IGNORE INTO pin_anchors (pin_id, revision_id, piece, x, y, side) VALUES (?, ?, ?, ?, ?, ?)');
    const out = db.prepare('UPDATE pins SET outdated_reason = ? WHERE id = ?');
    for (const o of outcomes) {
      if (o.carried) ins.run(o.pinId, newRevisionId, o.anchor.piece, o.anchor.point[0], o.anchor.point[1], o.anchor.side);
      else out.run(o.reason, o.pinId);
    }
  })();
  return outcomes;
}
