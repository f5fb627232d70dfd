import { pipeline } from 'node:stream/promises';
import type { Request, Response } from 'express';
import type { DataSource } from 'typeorm';
import type { AuditState } from '../../shared/api/briefs.js';
import type { Audit as AuditDto, AuditFigures, HistoryEntry, RevisionDetail, RevisionSummary, Submission as SubmissionDto } from '../../shared/api/revisions.js';
import { withBriefMaterial } from '../audits/brief-rules.js';
import type { AppContext } from '../context.js';
import { carryPinsOver } from '../critique/pins-service.js';
import { Brief, Material, Membership } from '../db/entities/index.js';
import { fromSqlDate, rawDb, sqlDate, whenNoTransaction } from '../db/raw.js';
import { BadRequestError, ConflictError, NotFoundError, UnprocessableError } from '../http/errors.js';
import type { Actor } from '../policy/policy.js';
import { createBlobStore, type BlobStore } from '../storage/blob-store.js';
import { designFromFile, designFromForm, designFromJson, type BuiltDesign, type UploadedFile } from './build-design.js';
import { MAX_PHOTO_PIXELS, PhotoTooLargeError, processPhoto } from './photos.js';
import { KIND_NAMES, UnsupportedFileError, readMultipart, sniff } from './upload.js';

interface RevisionRow {
  id: number;
  submission_id: number;
  number: number;
  title: string;
  design: string;
  source: 'file' | 'form';
  late: number;
  created_at: string;
  brief_id: number;
  studio_id: number;
  participant_id: number;
  participant_name: string;
  a_id: number;
  a_state: AuditState;
  a_attempts: number;
  a_error: string | null;
  a_queued_at: string;
  a_started_at: string | null;
  a_finished_at: string | null;
  a_report: string | null;
  a_figures: string | null;
}

const REVISION_SELECT = `
  SELECT r.id, r.submission_id, r.number, r.title, r.design, r.source, r.late, r.created_at,
         s.brief_id, b.studio_id, s.participant_id, u.name AS participant_name,
         a.id AS a_id, a.state AS a_state, a.attempts AS a_attempts, a.error AS a_error, a.queued_at AS a_queued_at,
         a.started_at AS a_started_at, a.finished_at AS a_finished_at, a.report AS a_report, a.figures AS a_figures
    FROM revisions r JOIN submissions s ON s.id = r.submission_id JOIN briefs b ON b.id = s.brief_id
    JOIN users u ON u.id = s.participant_id JOIN audits a ON a.revision_id = r.id`;

const isoOf = (s: string | null) => (s === null ? null : fromSqlDate(s)!.toISOString());

function summaryOf(r: RevisionRow): RevisionSummary {
  return {
    id: r.id,
    number: r.number,
    source: r.source,
    title: r.title,
    late: r.late === 1,
    createdAt: isoOf(r.created_at)!,
    auditState: r.a_state,
    figures: r.a_state === 'done' && r.a_figures ? (JSON.parse(r.a_figures) as AuditFigures) : null,
  };
}

function auditOf(r: RevisionRow): AuditDto {
  return {
    id: r.a_id,
    state: r.a_state,
    attempts: r.a_attempts,
    error: r.a_state === 'failed' ? r.a_error : null,
    queuedAt: isoOf(r.a_queued_at)!,
    startedAt: isoOf(r.a_started_at),
    finishedAt: isoOf(r.a_finished_at),
    report: r.a_state === 'done' && r.a_report ? (JSON.parse(r.a_report) as AuditDto['report']) : null,
  };
}

interface PreparedFile {
  role: 'design' | 'outline' | 'drawing' | 'photo' | 'thumbnail';
  originalName: string;
  mediaType: string;
  data: Buffer;
}

export function revisionsService(ctx: AppContext) {
  const ds: DataSource = ctx.dataSource;
  const db = rawDb(ds);
  const store: BlobStore = createBlobStore(ctx.blobDir);

  function mustRevision(id: number): RevisionRow {
    const row = db.prepare(`${REVISION_SELECT} WHERE r.id = ?`).get(id) as RevisionRow | undefined;
    if (!row) throw new NotFoundError('There is no revision with this id.');
    return row;
  }

  function materialOf(briefId: number): { name: string; thickness: number; kerf: number } {
    return db.prepare('SELECT m.name, m.thickness, m.kerf FROM briefs b JOIN materials m ON m.id = b.material_id WHERE b.id = ?').get(briefId) as {
      name: string;
      thickness: number;
      kerf: number;
    };
  }

  function filesOf(revisionId: number) {
    return (
      db
        .prepare(
          `SELECT f.id, f.role, f.original_name, b.media_type, b.size, b.sha256 FROM revision_files f JOIN blobs b ON b.sha256 = f.blob_sha256 WHERE f.revision_id = ? ORDER BY f.id`,
        )
        .all(revisionId) as { id: number; role: PreparedFile['role']; original_name: string; media_type: string; size: number; sha256: string }[]
    ).map((f) => ({
      id: f.id,
      role: f.role,
      originalName: f.original_name,
      mediaType: f.media_type,
      size: f.size,
      sha256: f.sha256,
      url: `/api/revisions/${revisionId}/files/${f.id}`,
    }));
  }

  function detail(id: number): RevisionDetail {
    const r = mustRevision(id);
    const stored = JSON.parse(r.design) as unknown;
    const design = withBriefMaterial(stored, materialOf(r.brief_id)).doc;
    const families = (((design as { families?: { id: string }[] }).families) ?? []).map((f) => ({ id: f.id, label: `Family "${f.id}"` }));
    return {
      ...summaryOf(r),
      submissionId: r.submission_id,
      briefId: r.brief_id,
      studioId: r.studio_id,
      participant: { id: r.participant_id, name: r.participant_name },
      design,
      files: filesOf(id),
      audit: auditOf(r),
      templateFamilies: families,
    };
  }

  /** Writes the files, then every row in one synchronous transaction; undoes new files if it fails. */
  async function store_(args: {
    briefId: number;
    participantId: number;
    built: BuiltDesign;
    late: boolean;
    files: PreparedFile[];
  }): Promise<{ revisionId: number; auditId: number }> {
    const written: { sha256: string; size: number; created: boolean; file: PreparedFile }[] = [];
    try {
      for (const f of args.files) written.push({ ...(await store.put(f.data)), file: f });
    } catch (e) {
      await Promise.all(written.filter((w) => w.created).map((w) => store.remove(w.sha256)));
      throw e;
    }
    const now = sqlDate(ctx.clock.now());
    try {
      await whenNoTransaction(db);
      return db.transaction(() => {
        db.prepare('INSERT OR IGNORE INTO submissions (brief_id, participant_id, created_at) VALUES (?, ?, ?)').run(args.briefId, args.participantId, now);
        const sub = db.prepare('SELECT id FROM submissions WHERE brief_id = ? AND participant_id = ?').get(args.briefId, args.participantId) as { id: number };
        const rev = db
          .prepare(
            `INSERT INTO revisions (submission_id, number, title, design, source, late, created_at)
             SELECT ?, COALESCE(MAX(number), 0) + 1, ?, ?, ?, ?, ? FROM revisions WHERE submission_id = ?`,
          )
          .run(sub.id, args.built.title.slice(0, 200), JSON.stringify(args.built.doc), args.built.source, args.late ? 1 : 0, now, sub.id);
        const revisionId = Number(rev.lastInsertRowid);
        const blob = db.prepare('INSERT OR IGNORE INTO blobs (sha256, size, media_type, created_at) VALUES (?, ?, ?, ?)');
        const file = db.prepare('INSERT INTO revision_files (revision_id, blob_sha256, role, original_name) VALUES (?, ?, ?, ?)');
        for (const w of written) {
          blob.run(w.sha256, w.size, w.file.mediaType, now);
          file.run(revisionId, w.sha256, w.file.role, w.file.originalName.slice(0, 255));
        }
        const audit = db.prepare(`INSERT INTO audits (revision_id, state, attempts, queued_at) VALUES (?, 'queued', 0, ?)`).run(revisionId, now);
        return { revisionId, auditId: Number(audit.lastInsertRowid) };
      })();
    } catch (e) {
      const orphan = db.prepare('SELECT 1 FROM blobs WHERE sha256 = ?');
      await Promise.all(written.filter((w) => w.created && !orphan.get(w.sha256)).map((w) => store.remove(w.sha256)));
      throw e;
    }
  }

  async function photosOf(files: readonly UploadedFile[]): Promise<PreparedFile[]> {
    const out: PreparedFile[] = [];
    for (const f of files) {
      const kind = sniff(f.buffer);
      if (kind !== 'jpeg' && kind !== 'png') {
        throw new UnsupportedFileError(`${f.originalname} is ${KIND_NAMES[kind]}; photos must be JPEG or PNG images.`, { [`files.${f.fieldname}`]: `expected a JPEG or PNG image, got ${KIND_NAMES[kind]}` });
      }
      let p;
      try {
        p = await processPhoto(f.buffer, kind);
      } catch (e) {
        if (e instanceof PhotoTooLargeError) {
          throw new UnprocessableError(`${f.originalname} is ${e.message}; photos may have at most ${MAX_PHOTO_PIXELS / 1e6} million pixels.`, { [`files.${f.fieldname}`]: `more than ${MAX_PHOTO_PIXELS / 1e6} million pixels` });
        }
        throw new UnprocessableError(`${f.originalname} could not be read as an image; it may be damaged.`, { [`files.${f.fieldname}`]: 'the image could not be decoded' });
      }
      const base = f.originalname.replace(/\.[^.]*$/, '');
      const ext = kind === 'jpeg' ? 'jpg' : 'png';
      out.push({ role: 'photo', originalName: `${base}.${ext}`, mediaType: p.mediaType, data: p.image });
      out.push({ role: 'thumbnail', originalName: `${base}-thumbnail.${ext}`, mediaType: p.mediaType, data: p.thumbnail });
    }
    return out;
  }

  return {
    detail,

    async create(actor: Actor, briefId: number, req: Request, res: Response): Promise<RevisionDetail> {
      const brief = await ds.getRepository(Brief).findOneByOrFail({ id: briefId });
      if (brief.state === 'closed') throw new UnprocessableError('This brief is closed; it no longer takes revisions.', { brief: 'closed' });
      const now = ctx.clock.now();
      const afterDeadline = now.getTime() > brief.deadline.getTime();
      if (afterDeadline && brief.latePolicy === 'refuse') {
        throw new UnprocessableError(`The deadline (${brief.deadline.toISOString()}) has passed and this brief does not accept late revisions.`, { 'brief.deadline': 'passed; late revisions are refused' });
      }
      const material = await ds.getRepository(Material).findOneByOrFail({ id: brief.materialId });

      let built: BuiltDesign;
      let photos: PreparedFile[] = [];
      if (req.is('multipart/form-data')) {
        await readMultipart(req, res);
        const files = (req.files as Express.Multer.File[] | undefined) ?? [];
        const fields = (req.body ?? {}) as Record<string, unknown>;
        const designFile = files.find((f) => f.fieldname === 'design');
        const photoFiles = files.filter((f) => f.fieldname === 'photos');
        if (designFile) {
          const extra = files.filter((f) => f !== designFile && f.fieldname !== 'photos');
          if (extra.length) throw new BadRequestError(`Send either a design document or outlines, not both (${extra[0].fieldname}).`, { [`files.${extra[0].fieldname}`]: 'not expected with a design document' });
          built = designFromFile(designFile);
        } else {
          const outlines = files.filter((f) => f.fieldname !== 'photos');
          if (fields.group === undefined && outlines.length === 0) {
            throw new BadRequestError('Attach a design document (field design) or fill in the form (group, families, motifs).', { 'files.design': 'missing' });
          }
          built = designFromForm(fields, outlines, material, brief.title);
          const named = new Set(((JSON.parse(String(fields.motifs ?? '[]')) as { file: string }[]) ?? []).map((m) => m.file));
          const stray = outlines.find((f) => !named.has(f.fieldname));
          if (stray) throw new BadRequestError(`The file field ${stray.fieldname} belongs to no motif.`, { [`files.${stray.fieldname}`]: 'not named by any motif' });
        }
        // Photos last: decoding is the costly part, and a design that is refused needs none.
        photos = await photosOf(photoFiles);
      } else {
        built = designFromJson((req.body as { design?: unknown } | undefined)?.design);
      }

      const { revisionId, auditId } = await store_({
        briefId,
        participantId: actor.id,
        built,
        late: afterDeadline && brief.latePolicy === 'accept-marked-late',
        files: [...built.files, ...photos],
      });
      ctx.audits.enqueue([auditId]);
      // Right after the commit: the previous revision's pins move to this one where their piece
      // still exists, or stay behind marked outdated. A failure here never loses the upload.
      try {
        await carryPinsOver(ds, revisionId);
      } catch (e) {
        (ctx.logError ?? console.error)(e);
      }
      return detail(revisionId);
    },

    audit(revisionId: number): AuditDto {
      return auditOf(mustRevision(revisionId));
    },

    retry(revisionId: number): AuditDto {
      const r = mustRevision(revisionId);
      if (r.a_state !== 'failed') throw new ConflictError(`Only a failed audit can be retried; this one is ${r.a_state}.`, 'audit_not_failed');
      ctx.audits.requeueRevisions([revisionId]);
      return auditOf(mustRevision(revisionId));
    },

    template(revisionId: number): { doc: unknown; baseName: string } {
      const r = mustRevision(revisionId);
      return { doc: withBriefMaterial(JSON.parse(r.design), materialOf(r.brief_id)).doc, baseName: `revision-${r.number}` };
    },

    async sendFile(revisionId: number, fileId: number, res: Response): Promise<void> {
      mustRevision(revisionId);
      const f = filesOf(revisionId).find((x) => x.id === fileId);
      if (!f) throw new NotFoundError('This revision has no file with this id.');
      if (!store.has(f.sha256)) throw new NotFoundError('The stored file is missing from the file store.');
      const inline = f.role === 'photo' || f.role === 'thumbnail';
      res.setHeader('Content-Type', f.mediaType);
      res.setHeader('Content-Length', String(f.size));
      res.setHeader('X-Content-Type-Options', 'nosniff');
      res.setHeader('Cache-Control', 'private, max-age=31536000, immutable');
      res.setHeader('Content-Disposition', `${inline ? 'inline' : 'attachment'}; filename="${f.originalName.replace(/[^A-Za-z0-9_.-]+/g, '-')}"`);
      res.flushHeaders();
      await pipeline(store.open(f.sha256), res);
    },

    submission(submissionId: number): SubmissionDto {
      const s = db
        .prepare('SELECT s.id, s.brief_id, b.studio_id, s.participant_id, u.name, s.created_at FROM submissions s JOIN briefs b ON b.id = s.brief_id JOIN users u ON u.id = s.participant_id WHERE s.id = ?')
        .get(submissionId) as { id: number; brief_id: number; studio_id: number; participant_id: number; name: string; created_at: string } | undefined;
      if (!s) throw new NotFoundError('There is no submission with this id.');
      const revisions = (db.prepare(`${REVISION_SELECT} WHERE r.submission_id = ? ORDER BY r.number`).all(submissionId) as RevisionRow[]).map(summaryOf);
      const critics = db
        .prepare('SELECT u.id, u.name FROM critic_assignments ca JOIN users u ON u.id = ca.critic_id WHERE ca.submission_id = ? ORDER BY u.name')
        .all(submissionId) as { id: number; name: string }[];
      return { id: s.id, briefId: s.brief_id, studioId: s.studio_id, participant: { id: s.participant_id, name: s.name }, createdAt: isoOf(s.created_at)!, revisions, critics };
    },

    history(submissionId: number): HistoryEntry[] {
      this.submission(submissionId);
      const rows = db.prepare(`${REVISION_SELECT} WHERE r.submission_id = ? ORDER BY r.number`).all(submissionId) as RevisionRow[];
      const out: HistoryEntry[] = [];
      let prev: { figures: AuditFigures; codes: Set<string> } | null = null;
      for (const r of rows) {
        const figures = r.a_state === 'done' && r.a_figures ? (JSON.parse(r.a_figures) as AuditFigures) : null;
        const codes = new Set<string>(
          r.a_state === 'done' && r.a_report
            ? (JSON.parse(r.a_report) as { findings: { code: string; severity: string }[] }).findings.filter((f) => f.severity !== 'info').map((f) => f.code)
            : [],
        );
        const changes: HistoryEntry['changes'] = [];
        let newCodes: string[] = [];
        let fixedCodes: string[] = [];
        if (figures && prev) {
          const lowerBetter = ['errors', 'warnings', 'components', 'sheets'] as const;
          for (const k of lowerBetter) {
            const a = prev.figures[k];
            const b = figures[k];
            if (a !== b) changes.push({ figure: k, from: a, to: b, better: a !== null && b !== null ? b < a : false });
          }
          if (prev.figures.joints !== figures.joints) changes.push({ figure: 'joints', from: prev.figures.joints, to: figures.joints, better: figures.joints > prev.figures.joints });
          if (prev.figures.pieces !== figures.pieces) changes.push({ figure: 'pieces', from: prev.figures.pieces, to: figures.pieces, better: false });
          newCodes = [...codes].filter((c) => !prev!.codes.has(c)).sort();
          fixedCodes = [...prev.codes].filter((c) => !codes.has(c)).sort();
        }
        out.push({ revisionId: r.id, number: r.number, createdAt: isoOf(r.created_at)!, auditState: r.a_state, figures, newCodes, fixedCodes, changes });
        if (figures) prev = { figures, codes };
      }
      return out;
    },

    async assignCritics(submissionId: number, userIds: readonly number[]): Promise<SubmissionDto> {
      const sub = this.submission(submissionId);
      const critics = await ds.getRepository(Membership).find({ where: { studioId: sub.studioId, role: 'critic' } });
      const allowed = new Set(critics.map((c) => c.userId));
      userIds.forEach((id, i) => {
        if (!allowed.has(id)) throw new UnprocessableError('Only critics of this studio can be assigned.', { [`body.userIds.${i}`]: `user ${id} is not a critic of this studio` });
      });
      const now = sqlDate(ctx.clock.now());
      await whenNoTransaction(db);
      db.transaction(() => {
        db.prepare('DELETE FROM critic_assignments WHERE submission_id = ?').run(submissionId);
        const ins = db.prepare('INSERT OR IGNORE INTO critic_assignments (submission_id, critic_id, assigned_at) VALUES (?, ?, ?)');
        for (const id of new Set(userIds)) ins.run(submissionId, id, now);
      })();
      return this.submission(submissionId);
    },
  };
}
