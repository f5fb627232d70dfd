/**
 * Pin-ups: critique sessions of a brief that walk through submissions in a running order.
 * Instructors create, edit, start, finish and delete them; members who may see the brief see
 * them, each entry filtered by the submission rule (a critic: the assigned ones; a participant:
 * their own, or all once the gallery is open). State moves: scheduled → running → finished, and
 * back to scheduled from either; anything else is 409.
 */
import type { CreatePinupBody, Pinup as PinupDto, PinupEntry as PinupEntryDto, PinupState, UpdatePinupBody } from '../../shared/api/critique.js';
import { createPinupBodySchema } from '../../shared/api/critique.js';
import type { AppContext } from '../context.js';
import { fromSqlDate, rawDb, sqlDate, whenNoTransaction } from '../db/raw.js';
import { ConflictError, NotFoundError, UnprocessableError } from '../http/errors.js';
import { can, type Actor } from '../policy/policy.js';
import { peopleOf } from './people.js';

interface PinupRow {
  id: number;
  brief_id: number;
  brief_title: string;
  studio_id: number;
  brief_state: 'draft' | 'published' | 'closed';
  gallery_open: number;
  title: string;
  starts_at: string;
  duration_minutes: number;
  room: string;
  state: PinupState;
  created_by_id: number | null;
}

const PINUP_SELECT = `
  SELECT p.id, p.brief_id, b.title AS brief_title, b.studio_id, b.state AS brief_state, b.gallery_open, p.title, p.starts_at,
         p.duration_minutes, p.room, p.state, p.created_by_id
    FROM pinups p JOIN briefs b ON b.id = p.brief_id`;

/** Allowed state moves (from → to). */
export const PINUP_MOVES: Readonly<Record<PinupState, readonly PinupState[]>> = {
  scheduled: ['running'],
  running: ['finished', 'scheduled'],
  finished: ['scheduled'],
};

export function pinupsService(ctx: AppContext) {
  const db = rawDb(ctx.dataSource);

  function mustPinup(id: number): PinupRow {
    const row = db.prepare(`${PINUP_SELECT} WHERE p.id = ?`).get(id) as PinupRow | undefined;
    if (!row) throw new NotFoundError('There is no pin-up with this id.');
    return row;
  }

  function entriesOf(actor: Actor, p: PinupRow): PinupEntryDto[] {
    const rows = db
      .prepare(
        `SELECT e.position, e.submission_id, s.participant_id, u.name,
                (SELECT id FROM revisions WHERE submission_id = s.id ORDER BY number DESC LIMIT 1) AS revision_id,
                (SELECT number FROM revisions WHERE submission_id = s.id ORDER BY number DESC LIMIT 1) AS revision_number
           FROM pinup_entries e JOIN submissions s ON s.id = e.submission_id JOIN users u ON u.id = s.participant_id
          WHERE e.pinup_id = ? ORDER BY e.position`,
      )
      .all(p.id) as { position: number; submission_id: number; participant_id: number; name: string; revision_id: number | null; revision_number: number | null }[];
    const out: PinupEntryDto[] = [];
    for (const r of rows) {
      const critics = db
        .prepare('SELECT u.id, u.name FROM critic_assignments ca JOIN users u ON u.id = ca.critic_id WHERE ca.submission_id = ? ORDER BY u.name')
        .all(r.submission_id) as { id: number; name: string }[];
      const resource = { studioId: p.studio_id, briefState: p.brief_state, galleryOpen: p.gallery_open === 1, ownerId: r.participant_id, criticIds: critics.map((c) => c.id) };
      if (!can(actor, 'submission.view', resource)) continue;
      const counts =
        r.revision_id === null
          ? { open: 0, resolved: 0 }
          : (db
              .prepare(
                `SELECT COALESCE(SUM(p.state = 'open'), 0) AS open, COALESCE(SUM(p.state = 'resolved'), 0) AS resolved
                   FROM pin_anchors a JOIN pins p ON p.id = a.pin_id WHERE a.revision_id = ?`,
              )
              .get(r.revision_id) as { open: number; resolved: number });
      out.push({
        position: r.position,
        submissionId: r.submission_id,
        participant: { id: r.participant_id, name: r.name },
        latestRevision: r.revision_id !== null ? { id: r.revision_id, number: r.revision_number! } : null,
        critics,
        openPins: counts.open,
        resolvedPins: counts.resolved,
      });
    }
    return out;
  }

  function dto(actor: Actor, p: PinupRow): PinupDto {
    return {
      id: p.id,
      briefId: p.brief_id,
      briefTitle: p.brief_title,
      studioId: p.studio_id,
      title: p.title,
      startsAt: fromSqlDate(p.starts_at)!.toISOString(),
      durationMinutes: p.duration_minutes,
      room: p.room,
      state: p.state,
      createdBy: peopleOf(db, p.studio_id).person(p.created_by_id),
      entries: entriesOf(actor, p),
    };
  }

  /** Checks every id is a submission of the brief (422 naming the first that is not). */
  function checkSubmissions(briefId: number, ids: readonly number[]): void {
    const mine = new Set((db.prepare('SELECT id FROM submissions WHERE brief_id = ?').all(briefId) as { id: number }[]).map((r) => r.id));
    ids.forEach((id, i) => {
      if (!mine.has(id)) throw new UnprocessableError(`Check body.submissionIds.${i}: submission ${id} is not a submission of this brief.`, { [`body.submissionIds.${i}`]: `submission ${id} is not a submission of this brief` });
    });
  }

  /** Every submission of the brief with a revision, in the participants' name order. */
  function defaultOrder(briefId: number): number[] {
    return (
      db
        .prepare('SELECT s.id FROM submissions s JOIN users u ON u.id = s.participant_id WHERE s.brief_id = ? AND EXISTS (SELECT 1 FROM revisions WHERE submission_id = s.id) ORDER BY u.name, s.id')
        .all(briefId) as { id: number }[]
    ).map((r) => r.id);
  }

  function writeEntries(pinupId: number, ids: readonly number[]): void {
    db.prepare('DELETE FROM pinup_entries WHERE pinup_id = ?').run(pinupId);
    const ins = db.prepare('INSERT INTO pinup_entries (pinup_id, submission_id, position) VALUES (?, ?, ?)');
    ids.forEach((id, i) => ins.run(pinupId, id, i + 1));
  }

  return {
    list(actor: Actor, briefId: number): PinupDto[] {
      const rows = db.prepare(`${PINUP_SELECT} WHERE p.brief_id = ? ORDER BY p.starts_at, p.id`).all(briefId) as PinupRow[];
      return rows.map((r) => dto(actor, r));
    },

    get(actor: Actor, pinupId: number): PinupDto {
      return dto(actor, mustPinup(pinupId));
    },

    async create(actor: Actor, briefId: number, input: CreatePinupBody): Promise<PinupDto> {
      const body = createPinupBodySchema.parse(input);
      const brief = db.prepare('SELECT state FROM briefs WHERE id = ?').get(briefId) as { state: string } | undefined;
      if (!brief) throw new NotFoundError('There is no brief with this id.');
      if (brief.state === 'draft') throw new ConflictError('This brief is a draft; publish it before planning a pin-up.', 'brief_draft');
      checkSubmissions(briefId, body.submissionIds);
      const ids = body.submissionIds.length > 0 ? body.submissionIds : defaultOrder(briefId);
      const now = sqlDate(ctx.clock.now());
      await whenNoTransaction(db);
      const id = db.transaction(() => {
        const r = db
          .prepare('INSERT INTO pinups (brief_id, title, starts_at, duration_minutes, room, state, created_by_id, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)')
          .run(briefId, body.title, sqlDate(new Date(body.startsAt)), body.durationMinutes, body.room, 'scheduled', actor.id, now, now);
        const pinupId = Number(r.lastInsertRowid);
        writeEntries(pinupId, ids);
        return pinupId;
      })();
      return dto(actor, mustPinup(id));
    },

    async update(actor: Actor, pinupId: number, patch: UpdatePinupBody): Promise<PinupDto> {
      const cur = mustPinup(pinupId);
      if (patch.state !== undefined && patch.state !== cur.state && !PINUP_MOVES[cur.state].includes(patch.state)) {
        throw new ConflictError(`A ${cur.state} pin-up cannot become ${patch.state}; it can become ${PINUP_MOVES[cur.state].join(' or ')}.`, 'pinup_state');
      }
      if (patch.submissionIds) checkSubmissions(cur.brief_id, patch.submissionIds);
      const now = sqlDate(ctx.clock.now());
      await whenNoTransaction(db);
      db.transaction(() => {
        const sets: string[] = [];
        const values: (string | number)[] = [];
        const set = (col: string, v: string | number) => {
          sets.push(`${col} = ?`);
          values.push(v);
        };
        if (patch.title !== undefined) set('title', patch.title);
        if (patch.startsAt !== undefined) set('starts_at', sqlDate(new Date(patch.startsAt)));
        if (patch.durationMinutes !== undefined) set('duration_minutes', patch.durationMinutes);
        if (patch.room !== undefined) set('room', patch.room);
        if (patch.state !== undefined) set('state', patch.state);
        set('updated_at', now);
        db.prepare(`UPDATE pinups SET ${sets.join(', ')} WHERE id = ?`).run(...values, pinupId);
        if (patch.submissionIds) writeEntries(pinupId, patch.submissionIds.length > 0 ? patch.submissionIds : defaultOrder(cur.brief_id));
      })();
      return dto(actor, mustPinup(pinupId));
    },

    remove(pinupId: number): void {
      mustPinup(pinupId);
      db.prepare('DELETE FROM pinups WHERE id = ?').run(pinupId);
    },
  };
}
