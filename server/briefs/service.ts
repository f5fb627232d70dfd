import type { DataSource } from 'typeorm';
import {
  briefConstraintsSchema,
  type AuditState,
  type Brief as BriefDto,
  type BriefChange as BriefChangeDto,
  type BriefConstraints,
  type CreateBriefBody,
  type SubmissionRow,
  type SubmissionsQuery,
  type UpdateBriefBody,
  createBriefBodySchema,
  updateBriefBodySchema,
  rubricCriterionSchema,
} from '../../shared/api/briefs.js';
import type { AuditFigures } from '../../shared/api/revisions.js';
import { canonicalNormal, getGroup } from '../../shared/engine/groups.js';
import type { AppContext } from '../context.js';
import { Brief, BriefChange, Material, Membership, Studio, User } from '../db/entities/index.js';
import { rawDb } from '../db/raw.js';
import { ConflictError, NotFoundError, UnprocessableError } from '../http/errors.js';
import { simpleHtml } from '../mail/mail-service.js';
import { notifier, settingsLine } from '../notifications/service.js';
import { can, type Actor } from '../policy/policy.js';
import { toCsv } from './csv.js';
import { templateFamiliesOf } from './template-design.js';

const iso = (d: Date | null) => (d ? d.toISOString() : null);

export function briefDto(b: Brief, material: Material | null, mySubmission: BriefDto['mySubmission']): BriefDto {
  const constraints = briefConstraintsSchema.parse(JSON.parse(b.constraints));
  return {
    id: b.id,
    studioId: b.studioId,
    title: b.title,
    body: b.body,
    constraints,
    material: material ? { id: material.id, name: material.name, thickness: material.thickness, kerf: material.kerf } : null,
    deadline: b.deadline.toISOString(),
    latePolicy: b.latePolicy,
    critiqueWindow: b.critiqueOpensAt && b.critiqueClosesAt ? { opensAt: b.critiqueOpensAt.toISOString(), closesAt: b.critiqueClosesAt.toISOString() } : null,
    rubric: rubricCriterionSchema.array().parse(JSON.parse(b.rubric)),
    state: b.state,
    galleryOpen: b.galleryOpen,
    createdAt: b.createdAt.toISOString(),
    updatedAt: b.updatedAt.toISOString(),
    publishedAt: iso(b.publishedAt),
    closedAt: iso(b.closedAt),
    mySubmission,
    templateFamilies: templateFamiliesOf(constraints).families.map((f) => ({ id: f.id, label: f.label })),
  };
}

/** Latest revision id of every submission of a brief. */
export function latestRevisionIds(ds: DataSource, briefId: number): number[] {
  return (
    rawDb(ds)
      .prepare(
        `SELECT r.id FROM revisions r JOIN submissions s ON s.id = r.submission_id
          WHERE s.brief_id = ? AND r.number = (SELECT MAX(number) FROM revisions WHERE submission_id = r.submission_id)`,
      )
      .all(briefId) as { id: number }[]
  ).map((r) => r.id);
}

const CONSTRAINT_LABELS: Record<keyof BriefConstraints, string> = {
  allowedGroups: 'allowed groups',
  requiredFamilies: 'required families',
  allowedFamilies: 'allowed families',
  materialId: 'material',
  sheet: 'sheet size',
  maxSheets: 'maximum sheets',
  angleToleranceDeg: 'angle tolerance',
  minJointLength: 'minimum joint length',
  pieceCount: 'piece count',
};

function fmtRules(rules: BriefConstraints['requiredFamilies']): string {
  if (rules.length === 0) return 'none';
  return rules
    .map((r) => `${r.group ? `${r.group} ` : ''}${r.axis !== undefined ? `${r.axis}-fold` : `normal (${r.normal!.join(', ')})`} at ${r.offsetMin}–${r.offsetMax} mm`)
    .join('; ');
}

export function briefsService(ctx: AppContext) {
  const ds = ctx.dataSource;
  const briefs = ds.getRepository(Brief);
  const materials = ds.getRepository(Material);
  const notify = notifier(ctx);

  async function mustFind(id: number): Promise<Brief> {
    const b = await briefs.findOneBy({ id });
    if (!b) throw new NotFoundError('There is no brief with this id.');
    return b;
  }

  function mySubmission(actor: Actor, briefId: number): BriefDto['mySubmission'] {
    const row = rawDb(ds)
      .prepare(
        `SELECT s.id, r.number, a.state FROM submissions s
           LEFT JOIN revisions r ON r.submission_id = s.id AND r.number = (SELECT MAX(number) FROM revisions WHERE submission_id = s.id)
           LEFT JOIN audits a ON a.revision_id = r.id
          WHERE s.brief_id = ? AND s.participant_id = ?`,
      )
      .get(briefId, actor.id) as { id: number; number: number | null; state: AuditState | null } | undefined;
    return row ? { id: row.id, latestRevision: row.number, auditState: row.state } : null;
  }

  async function dto(actor: Actor, b: Brief): Promise<BriefDto> {
    return briefDto(b, await materials.findOneBy({ id: b.materialId }), mySubmission(actor, b.id));
  }

  /** Checks what zod cannot: the material exists and is allowed; rule axes exist in their groups. */
  async function checkConstraints(c: BriefConstraints): Promise<Material> {
    const m = await materials.findOneBy({ id: c.materialId });
    if (!m) throw new UnprocessableError('Choose a material from the catalogue.', { 'body.constraints.materialId': 'There is no material with this id in the catalogue' });
    if (m.prohibited) {
      const why = `${m.name} is prohibited on the lasers: ${m.prohibitedReason ?? 'see the catalogue'}`;
      throw new UnprocessableError(`${why}. Choose another material.`, { 'body.constraints.materialId': why });
    }
    for (const g of c.allowedGroups) {
      try {
        getGroup(g);
      } catch (e) {
        throw new UnprocessableError(`Check the allowed groups: ${(e as Error).message}`, { 'body.constraints.allowedGroups': (e as Error).message });
      }
    }
    for (const list of ['requiredFamilies', 'allowedFamilies'] as const) {
      c[list].forEach((rule, i) => {
        if (rule.axis === undefined) return;
        const groups = rule.group ? [rule.group] : c.allowedGroups;
        const problems = groups.flatMap((g) => {
          try {
            canonicalNormal(getGroup(g), rule.axis!);
            return [];
          } catch (e) {
            return [(e as Error).message];
          }
        });
        if (problems.length === groups.length) {
          const field = `body.constraints.${list}.${i}.axis`;
          throw new UnprocessableError(`Check ${field}: ${problems[0]}`, { [field]: problems[0] });
        }
      });
    }
    return m;
  }

  function describeChanges(before: BriefDto, after: BriefDto, beforeMaterial: string, afterMaterial: string): string[] {
    const out: string[] = [];
    if (before.title !== after.title) out.push(`Title: "${before.title}" → "${after.title}".`);
    if (before.body !== after.body) out.push('The brief text was edited.');
    const keys = Object.keys(CONSTRAINT_LABELS) as (keyof BriefConstraints)[];
    for (const k of keys) {
      const a = before.constraints[k];
      const b = after.constraints[k];
      if (JSON.stringify(a) === JSON.stringify(b)) continue;
      const fmt = (v: unknown, material: string): string => {
        if (v === undefined) return 'not set';
        switch (k) {
          case 'allowedGroups':
            return (v as string[]).join(', ');
          case 'requiredFamilies':
          case 'allowedFamilies':
            return fmtRules(v as BriefConstraints['requiredFamilies']);
          case 'materialId':
            return material;
          case 'sheet':
            return `${(v as number[])[0]} × ${(v as number[])[1]} mm`;
          case 'angleToleranceDeg':
            return `${v as number}°`;
          case 'minJointLength':
            return `${v as number} mm`;
          case 'pieceCount':
            return `${(v as { min: number }).min}–${(v as { max: number }).max}`;
          default:
            return String(v);
        }
      };
      const label = CONSTRAINT_LABELS[k];
      out.push(`${label[0].toUpperCase()}${label.slice(1)}: ${fmt(a, beforeMaterial)} → ${fmt(b, afterMaterial)}.`);
    }
    if (before.deadline !== after.deadline) out.push(`Deadline: ${before.deadline} → ${after.deadline}.`);
    if (before.latePolicy !== after.latePolicy) out.push(`Late policy: ${before.latePolicy} → ${after.latePolicy}.`);
    if (JSON.stringify(before.critiqueWindow) !== JSON.stringify(after.critiqueWindow)) out.push('The critique window changed.');
    if (JSON.stringify(before.rubric) !== JSON.stringify(after.rubric)) out.push('The rubric changed.');
    if (before.galleryOpen !== after.galleryOpen) out.push(after.galleryOpen ? 'The gallery was opened to participants.' : 'The gallery was closed.');
    return out;
  }

  async function authorName(actor: Actor): Promise<string> {
    return (await ds.getRepository(User).findOneBy({ id: actor.id }))?.name ?? actor.email;
  }

  async function sendPublished(b: Brief): Promise<void> {
    const studio = await ds.getRepository(Studio).findOneBy({ id: b.studioId });
    const people = await ds.getRepository(Membership).find({ where: [{ studioId: b.studioId, role: 'participant' }, { studioId: b.studioId, role: 'critic' }], relations: { user: true } });
    const link = `${ctx.config.publicUrl}/briefs/${b.id}`;
    for (const m of people) {
      const lines = [
        `Hello ${m.user.name},`,
        `The brief "${b.title}" was published in ${studio?.name ?? 'your studio'}.`,
        `Deadline: ${b.deadline.toUTCString()}.`,
      ];
      await notify.sendOnce('brief-published', m.userId, b.id, {
        to: m.user.email,
        subject: `New brief: ${b.title}`,
        text: `${lines.join('\n\n')}\n\nRead the brief: ${link}\n\n${settingsLine(ctx.config.publicUrl)}\n\n— Planewright\n`,
        html: simpleHtml([...lines, settingsLine(ctx.config.publicUrl)], { href: link, label: 'Read the brief' }),
      });
    }
  }

  return {
    async list(actor: Actor, studioId: number): Promise<BriefDto[]> {
      const all = await briefs.find({ where: { studioId }, order: { deadline: 'ASC', id: 'ASC' } });
      const visible = all.filter((b) => can(actor, 'brief.view', { studioId, briefState: b.state }));
      return Promise.all(visible.map((b) => dto(actor, b)));
    },

    async get(actor: Actor, briefId: number): Promise<BriefDto> {
      return dto(actor, await mustFind(briefId));
    },

    async create(actor: Actor, studioId: number, body: CreateBriefBody): Promise<BriefDto> {
      const b = createBriefBodySchema.parse(body);
      await checkConstraints(b.constraints);
      const now = ctx.clock.now();
      const saved = await briefs.save(
        briefs.create({
          studioId,
          title: b.title,
          body: b.body,
          constraints: JSON.stringify(b.constraints),
          materialId: b.constraints.materialId,
          deadline: new Date(b.deadline),
          latePolicy: b.latePolicy,
          critiqueOpensAt: b.critiqueWindow ? new Date(b.critiqueWindow.opensAt) : null,
          critiqueClosesAt: b.critiqueWindow ? new Date(b.critiqueWindow.closesAt) : null,
          rubric: JSON.stringify(b.rubric),
          state: 'draft',
          galleryOpen: false,
          createdById: actor.id,
          createdAt: now,
          updatedAt: now,
          publishedAt: null,
          closedAt: null,
        }),
      );
      return dto(actor, saved);
    },

    async update(actor: Actor, briefId: number, body: UpdateBriefBody): Promise<BriefDto> {
      const patch = updateBriefBodySchema.parse(body);
      const current = await mustFind(briefId);
      if (current.state === 'closed' && Object.keys(patch).some((k) => k !== 'galleryOpen')) {
        throw new ConflictError('This brief is closed; only its gallery can still be opened or closed.', 'brief_closed');
      }
      const before = await dto(actor, current);
      let material = await materials.findOneBy({ id: current.materialId });
      if (patch.constraints) material = await checkConstraints(patch.constraints);
      const next: Partial<Brief> = { updatedAt: ctx.clock.now() };
      if (patch.title !== undefined) next.title = patch.title;
      if (patch.body !== undefined) next.body = patch.body;
      if (patch.constraints) {
        next.constraints = JSON.stringify(patch.constraints);
        next.materialId = patch.constraints.materialId;
      }
      if (patch.deadline !== undefined) next.deadline = new Date(patch.deadline);
      if (patch.latePolicy !== undefined) next.latePolicy = patch.latePolicy;
      if (patch.critiqueWindow !== undefined) {
        next.critiqueOpensAt = patch.critiqueWindow ? new Date(patch.critiqueWindow.opensAt) : null;
        next.critiqueClosesAt = patch.critiqueWindow ? new Date(patch.critiqueWindow.closesAt) : null;
      }
      if (patch.rubric !== undefined) next.rubric = JSON.stringify(patch.rubric);
      if (patch.galleryOpen !== undefined) next.galleryOpen = patch.galleryOpen;
      await briefs.update({ id: briefId }, next);
      const updated = await mustFind(briefId);
      const after = await dto(actor, updated);

      if (current.state !== 'draft') {
        const beforeMaterial = before.material?.name ?? `material ${before.constraints.materialId}`;
        const details = describeChanges(before, after, beforeMaterial, material?.name ?? '');
        if (details.length > 0) {
          const constraintsChanged = JSON.stringify(before.constraints) !== JSON.stringify(after.constraints);
          const reaudited = constraintsChanged ? ctx.audits.requeueRevisions(latestRevisionIds(ds, briefId)) : 0;
          const summary = constraintsChanged
            ? `Changed the constraints${reaudited ? `; ${reaudited} latest revision${reaudited === 1 ? ' is' : 's are'} audited again` : ''}.`
            : details.length === 1
              ? details[0]
              : `Changed ${details.length} things.`;
          await ds.getRepository(BriefChange).insert({
            briefId,
            userId: actor.id,
            userName: await authorName(actor),
            at: ctx.clock.now(),
            summary,
            details: JSON.stringify(details),
            reaudited,
          });
        }
      }
      return after;
    },

    async publish(actor: Actor, briefId: number): Promise<BriefDto> {
      const b = await mustFind(briefId);
      if (b.state !== 'draft') throw new ConflictError(`This brief is already ${b.state}.`, 'brief_not_draft');
      const m = await materials.findOneBy({ id: b.materialId });
      if (!m || m.prohibited) {
        throw new UnprocessableError('The brief\u2019s material is no longer allowed; choose another before publishing.', { 'body.constraints.materialId': 'This material is prohibited' });
      }
      const now = ctx.clock.now();
      await briefs.update({ id: briefId }, { state: 'published', publishedAt: now, updatedAt: now });
      const published = await mustFind(briefId);
      await sendPublished(published);
      return dto(actor, published);
    },

    async close(actor: Actor, briefId: number): Promise<BriefDto> {
      const b = await mustFind(briefId);
      if (b.state !== 'published') throw new ConflictError(b.state === 'draft' ? 'Publish the brief before closing it.' : 'This brief is already closed.', 'brief_not_published');
      const now = ctx.clock.now();
      await briefs.update({ id: briefId }, { state: 'closed', closedAt: now, updatedAt: now });
      return dto(actor, await mustFind(briefId));
    },

    async changes(briefId: number): Promise<BriefChangeDto[]> {
      await mustFind(briefId);
      const rows = await ds.getRepository(BriefChange).find({ where: { briefId }, order: { at: 'DESC', id: 'DESC' } });
      return rows.map((c) => ({
        id: c.id,
        briefId: c.briefId,
        at: c.at.toISOString(),
        by: { id: c.userId, name: c.userName },
        summary: c.summary,
        details: JSON.parse(c.details) as string[],
        reaudited: c.reaudited,
      }));
    },

    /** The submissions of a brief the caller may see, as table rows, filtered. */
    async submissions(actor: Actor, briefId: number, query: SubmissionsQuery): Promise<SubmissionRow[]> {
      const brief = await mustFind(briefId);
      const db = rawDb(ds);
      const rows = db
        .prepare(
          `SELECT s.id AS submission_id, u.id AS user_id, u.name, u.email,
                  (SELECT COUNT(*) FROM revisions WHERE submission_id = s.id) AS revisions,
                  r.id AS revision_id, r.number, r.created_at, r.late, a.state, a.errors, a.warnings, a.figures,
                  (SELECT released_at FROM feedback WHERE submission_id = s.id) AS released_at,
                  (EXISTS (SELECT 1 FROM pins WHERE submission_id = s.id) OR EXISTS (SELECT 1 FROM score_sheets WHERE submission_id = s.id)) AS critiqued
             FROM submissions s JOIN users u ON u.id = s.participant_id
             LEFT JOIN revisions r ON r.submission_id = s.id AND r.number = (SELECT MAX(number) FROM revisions WHERE submission_id = s.id)
             LEFT JOIN audits a ON a.revision_id = r.id
            WHERE s.brief_id = ?
            ORDER BY u.name, s.id`,
        )
        .all(briefId) as {
        submission_id: number;
        user_id: number;
        name: string;
        email: string;
        revisions: number;
        revision_id: number | null;
        number: number | null;
        created_at: string | null;
        late: number | null;
        state: AuditState | null;
        errors: number | null;
        warnings: number | null;
        figures: string | null;
        released_at: string | null;
        critiqued: number;
      }[];
      const critics = db
        .prepare(
          `SELECT ca.submission_id, u.id, u.name FROM critic_assignments ca JOIN users u ON u.id = ca.critic_id
             JOIN submissions s ON s.id = ca.submission_id WHERE s.brief_id = ? ORDER BY u.name`,
        )
        .all(briefId) as { submission_id: number; id: number; name: string }[];
      const out: SubmissionRow[] = [];
      for (const r of rows) {
        const mine = critics.filter((c) => c.submission_id === r.submission_id);
        const resource = { studioId: brief.studioId, briefState: brief.state, galleryOpen: brief.galleryOpen, ownerId: r.user_id, criticIds: mine.map((c) => c.id) };
        if (!can(actor, 'submission.view', resource)) continue;
        const figures = r.figures ? (JSON.parse(r.figures) as AuditFigures) : null;
        const row: SubmissionRow = {
          submissionId: r.submission_id,
          participant: { id: r.user_id, name: r.name, email: r.email },
          revisions: r.revisions,
          latestRevision: r.revision_id !== null ? { id: r.revision_id, number: r.number!, createdAt: new Date(r.created_at!.replace(' ', 'T') + 'Z').toISOString() } : null,
          auditState: r.state,
          errors: r.errors,
          warnings: r.warnings,
          pieces: figures?.pieces ?? null,
          components: figures?.components ?? null,
          sheets: figures?.sheets ?? null,
          late: r.late === 1,
          critiqueState: r.released_at !== null ? 'released' : r.critiqued ? 'in-progress' : 'not-started',
          critics: mine.map((c) => ({ id: c.id, name: c.name })),
        };
        if (query.state && row.auditState !== query.state) continue;
        if (query.hasErrors !== undefined && ((row.errors ?? 0) > 0) !== (query.hasErrors === 'true')) continue;
        if (query.late !== undefined && row.late !== (query.late === 'true')) continue;
        out.push(row);
      }
      return out;
    },

    /**
     * The marks and audit figures of every submission as CSV: per rubric criterion the
     * instructor's own score (an instructor's or admin's sheet), else the mean of the critics'
     * scores, blank when nobody scored it; then the final mark and whether it was released.
     */
    async exportCsv(actor: Actor, briefId: number): Promise<{ filename: string; csv: string }> {
      const b = await this.get(actor, briefId);
      const rows = await this.submissions(actor, briefId, {});
      const db = rawDb(ds);
      const sheets = db
        .prepare(
          `SELECT ss.submission_id, ss.scores, COALESCE(m.role, CASE WHEN u.global_role = 'admin' THEN 'admin' END) AS role
             FROM score_sheets ss JOIN submissions s ON s.id = ss.submission_id JOIN users u ON u.id = ss.scorer_id
             LEFT JOIN memberships m ON m.user_id = ss.scorer_id AND m.studio_id = ?
            WHERE s.brief_id = ?`,
        )
        .all(b.studioId, briefId) as { submission_id: number; scores: string; role: string | null }[];
      const marks = new Map(
        (db.prepare('SELECT f.submission_id, f.final_mark, f.released_at FROM feedback f JOIN submissions s ON s.id = f.submission_id WHERE s.brief_id = ?').all(briefId) as {
          submission_id: number;
          final_mark: number | null;
          released_at: string | null;
        }[]).map((f) => [f.submission_id, f]),
      );
      const mean = (xs: number[]): number | null => (xs.length === 0 ? null : Math.round((xs.reduce((a, x) => a + x, 0) / xs.length) * 100) / 100);
      const criterionCell = (submissionId: number, criterion: string): number | null => {
        const of = (roles: string[]) =>
          sheets
            .filter((sh) => sh.submission_id === submissionId && sh.role !== null && roles.includes(sh.role))
            .flatMap((sh) => (JSON.parse(sh.scores) as { criterion: string; score: number }[]).filter((x) => x.criterion === criterion).map((x) => x.score));
        const own = of(['instructor', 'admin']);
        return own.length > 0 ? mean(own) : mean(of(['critic']));
      };
      const header = [
        'Participant',
        'E-mail',
        'Revisions',
        'Latest revision',
        'Submitted at',
        'Late',
        'Audit state',
        'Errors',
        'Warnings',
        'Pieces',
        'Connected groups',
        'Sheets',
        'Critique state',
        ...b.rubric.map((c) => `${c.criterion} (weight ${c.weight})`),
        'Final mark',
        'Feedback released',
      ];
      const body = rows.map((r) => [
        r.participant.name,
        r.participant.email,
        r.revisions,
        r.latestRevision?.number ?? null,
        r.latestRevision?.createdAt ?? null,
        r.late ? 'yes' : 'no',
        r.auditState,
        r.errors,
        r.warnings,
        r.pieces,
        r.components,
        r.sheets,
        r.critiqueState,
        ...b.rubric.map((c) => criterionCell(r.submissionId, c.id)),
        marks.get(r.submissionId)?.final_mark ?? null,
        marks.get(r.submissionId)?.released_at ? 'yes' : 'no',
      ]);
      const filename = `${b.title.replace(/[^A-Za-z0-9_-]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'brief'}-submissions.csv`;
      return { filename, csv: toCsv(header, body) };
    },

    reauditAll(briefId: number): number {
      return ctx.audits.requeueRevisions(latestRevisionIds(ds, briefId));
    },
  };
}
