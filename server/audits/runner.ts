/**
 * Runs audits: each queued audit row is taken to running, audited in the worker pool against
 * its brief, and stored as done (report and figures) or failed (a sentence the participant can
 * act on). An audit that takes longer than `timeoutMs` is stopped (the worker is terminated) and
 * fails. Re-queuing an audit that is running (a brief's constraints changed) starts a new
 * generation: the old run's result is discarded because the row's `queued_at` no longer matches.
 * When a revision's first audit finishes, its participant gets the "revision received" e-mail.
 *
 * The runner keeps its own queue and hands the pool no more audits than it has threads, so an
 * audit is `running` only while a thread works on it and the time limit measures the audit, not
 * the wait behind a burst of uploads.
 */
import type { DataSource } from 'typeorm';
import { briefConstraintsSchema } from '../../shared/api/briefs.js';
import { fromSqlDate, rawDb, sqlDate } from '../db/raw.js';
import type { Clock } from '../lib/clock.js';
import { simpleHtml } from '../mail/mail-service.js';
import { settingsLine, type Notifier } from '../notifications/service.js';
import type { BriefAuditResult } from './brief-rules.js';
import type { AuditPool } from './pool.js';

export const DEFAULT_AUDIT_TIMEOUT_MS = 20_000;

export interface AuditRunnerDeps {
  dataSource: DataSource;
  pool: AuditPool;
  clock: Clock;
  notifier: Notifier;
  publicUrl: string;
  timeoutMs?: number;
  logError?: (e: unknown) => void;
}

export interface AuditRunner {
  /** Starts the audits of these rows (which must be queued). */
  enqueue(auditIds: readonly number[]): void;
  /** Puts the audits of these revisions back to queued (a fresh generation) and starts them. */
  requeueRevisions(revisionIds: readonly number[]): number;
  /** Re-queues audits a crash left queued or running; returns how many. */
  resumeStale(): number;
  /** Resolves when nothing is in flight (tests, shutdown). */
  idle(): Promise<void>;
  close(): Promise<void>;
  timeoutMs: number;
}

interface Job {
  auditId: number;
  queuedAt: string;
}

interface AuditInputRow {
  audit_id: number;
  queued_at: string;
  state: string;
  revision_id: number;
  number: number;
  design: string;
  constraints: string;
  brief_id: number;
  brief_title: string;
  m_name: string;
  m_thickness: number;
  m_kerf: number;
  participant_id: number;
  participant_email: string;
  participant_name: string;
}

export function createAuditRunner(deps: AuditRunnerDeps): AuditRunner {
  const db = rawDb(deps.dataSource);
  const log = deps.logError ?? ((e: unknown) => console.error(e));
  const inFlight = new Set<Promise<void>>();
  let closed = false;

  const load = db.prepare(`
    SELECT a.id AS audit_id, a.queued_at, a.state, r.id AS revision_id, r.number, r.design,
           b.constraints, b.id AS brief_id, b.title AS brief_title,
           m.name AS m_name, m.thickness AS m_thickness, m.kerf AS m_kerf,
           u.id AS participant_id, u.email AS participant_email, u.name AS participant_name
      FROM audits a JOIN revisions r ON r.id = a.revision_id JOIN submissions s ON s.id = r.submission_id
      JOIN briefs b ON b.id = s.brief_id JOIN materials m ON m.id = b.material_id JOIN users u ON u.id = s.participant_id
     WHERE a.id = ?`);
  const markRunning = db.prepare(`UPDATE audits SET state = 'running', started_at = ?, attempts = attempts + 1, finished_at = NULL, error = NULL WHERE id = ? AND queued_at = ? AND state = 'queued'`);
  const markDone = db.prepare(`UPDATE audits SET state = 'done', report = ?, figures = ?, errors = ?, warnings = ?, error = NULL, finished_at = ? WHERE id = ? AND queued_at = ? AND state = 'running'`);
  const markFailed = db.prepare(`UPDATE audits SET state = 'failed', report = NULL, figures = NULL, errors = NULL, warnings = NULL, error = ?, finished_at = ? WHERE id = ? AND queued_at = ? AND state = 'running'`);

  async function runJob(job: Job): Promise<void> {
    const row = load.get(job.auditId) as AuditInputRow | undefined;
    if (!row || row.queued_at !== job.queuedAt || row.state !== 'queued') return;
    if (markRunning.run(sqlDate(deps.clock.now()), job.auditId, job.queuedAt).changes === 0) return;

    let result: BriefAuditResult;
    const controller = new AbortController();
    const timer = setTimeout(() => controller.abort(), runner.timeoutMs);
    try {
      const constraints = briefConstraintsSchema.parse(JSON.parse(row.constraints));
      const design: unknown = JSON.parse(row.design);
      result = await deps.pool.run({ design, constraints, material: { name: row.m_name, thickness: row.m_thickness, kerf: row.m_kerf } }, controller.signal);
    } catch (e) {
      // Shutting down: the pool stopped the run; the row stays running and is resumed at start.
      if (closed) return;
      if (controller.signal.aborted) {
        result = { ok: false, error: `The audit took longer than ${Math.round(runner.timeoutMs / 1000)} s and was stopped. A design this large may need fewer motifs or simpler outlines; you can retry the audit.` };
      } else {
        log(e);
        result = { ok: false, error: 'The audit could not run because of a problem on the server. Retry it; if it fails again, tell your instructor.' };
      }
    } finally {
      clearTimeout(timer);
    }
    if (closed) return;
    const now = sqlDate(deps.clock.now());
    const stored = result.ok
      ? markDone.run(JSON.stringify(result.report), JSON.stringify(result.figures), result.figures.errors, result.figures.warnings, now, job.auditId, job.queuedAt)
      : markFailed.run(result.error, now, job.auditId, job.queuedAt);
    if (stored.changes === 0) return;
    await notifyReceived(row, result);
  }

  async function notifyReceived(row: AuditInputRow, result: BriefAuditResult): Promise<void> {
    const link = `${deps.publicUrl}/revisions/${row.revision_id}`;
    const summary = result.ok
      ? `The audit found ${result.figures.errors} error${result.figures.errors === 1 ? '' : 's'} and ${result.figures.warnings} warning${result.figures.warnings === 1 ? '' : 's'}: ${result.figures.pieces} pieces, ${result.figures.joints} joints, ${result.figures.components} connected group${result.figures.components === 1 ? '' : 's'}${result.figures.sheets !== null ? `, ${result.figures.sheets} sheet${result.figures.sheets === 1 ? '' : 's'}` : ''}.`
      : `The audit failed: ${result.error}`;
    const lines = [
      `Hello ${row.participant_name},`,
      `Revision ${row.number} of your submission to "${row.brief_title}" was received.`,
      summary,
    ];
    const footer = settingsLine(deps.publicUrl);
    await deps.notifier.sendOnce('revision-received', row.participant_id, row.revision_id, {
      to: row.participant_email,
      subject: `Revision ${row.number} received: ${row.brief_title}${result.ok ? (result.figures.ok ? ' (passes)' : ' (has errors)') : ' (audit failed)'}`,
      text: `${lines.join('\n\n')}\n\nRead the audit: ${link}\n\n${footer}\n\n— Planewright\n`,
      html: simpleHtml([...lines, footer], { href: link, label: 'Read the audit' }),
    });
  }

  const waiting: Job[] = [];
  let active = 0;

  function pump(): void {
    while (!closed && active < Math.max(1, deps.pool.threads) && waiting.length > 0) {
      const job = waiting.shift()!;
      active++;
      const p = runJob(job)
        .catch((e: unknown) => log(e))
        .finally(() => {
          active--;
          inFlight.delete(p);
          pump();
        });
      inFlight.add(p);
    }
  }

  function track(job: Job): void {
    waiting.push(job);
    pump();
  }

  const runner: AuditRunner = {
    timeoutMs: deps.timeoutMs ?? DEFAULT_AUDIT_TIMEOUT_MS,
    enqueue(auditIds) {
      if (closed || auditIds.length === 0) return;
      const rows = db
        .prepare(`SELECT id, queued_at FROM audits WHERE state = 'queued' AND id IN (${auditIds.map(() => '?').join(',')})`)
        .all(...auditIds) as { id: number; queued_at: string }[];
      for (const r of rows) track({ auditId: r.id, queuedAt: r.queued_at });
    },
    requeueRevisions(revisionIds) {
      if (revisionIds.length === 0) return 0;
      const now = deps.clock.now().getTime();
      const ids: number[] = [];
      const current = db.prepare(`SELECT id, queued_at FROM audits WHERE revision_id = ?`);
      const requeue = db.prepare(`UPDATE audits SET state = 'queued', queued_at = ?, started_at = NULL, finished_at = NULL, error = NULL WHERE id = ?`);
      db.transaction(() => {
        for (const rid of revisionIds) {
          const r = current.get(rid) as { id: number; queued_at: string } | undefined;
          if (!r) continue;
          // Always later than the previous generation, even when the clock stands still.
          const next = Math.max(now, fromSqlDate(r.queued_at)!.getTime() + 1);
          requeue.run(sqlDate(new Date(next)), r.id);
          ids.push(r.id);
        }
      })();
      runner.enqueue(ids);
      return ids.length;
    },
    resumeStale() {
      const stale = db.prepare(`SELECT revision_id FROM audits WHERE state IN ('queued', 'running')`).all() as { revision_id: number }[];
      return runner.requeueRevisions(stale.map((s) => s.revision_id));
    },
    async idle() {
      while (inFlight.size > 0 || (waiting.length > 0 && !closed)) await Promise.allSettled([...inFlight]);
    },
    async close() {
      closed = true;
      waiting.length = 0;
      await deps.pool.close().catch((e: unknown) => log(e));
      await Promise.allSettled([...inFlight]);
    },
  };
  return runner;
}
