/**
 * The audit runner's bookkeeping with a stand-in pool whose answers the test releases by hand:
 * a re-queued audit discards the result of the run it replaced, and a pool that throws leaves a
 * failed audit with a sentence for the participant (the error itself goes to the log).
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { BriefAuditInput, BriefAuditResult } from '../../server/audits/brief-rules.js';
import { auditAgainstBrief } from '../../server/audits/brief-rules.js';
import type { AuditPool } from '../../server/audits/pool.js';
import { createAuditRunner } from '../../server/audits/runner.js';
import { rawDb } from '../../server/db/raw.js';
import { notifier } from '../../server/notifications/service.js';
import { PUBLIC_URL, startTestApp, type TestApp } from './helpers.js';
import { cubePlates, makeBrief } from './support-workflow.js';

interface Pending {
  input: BriefAuditInput;
  resolve: (r: BriefAuditResult) => void;
  reject: (e: unknown) => void;
}

function handPool(threads = 2): AuditPool & { pending: Pending[] } {
  const pending: Pending[] = [];
  return {
    threads,
    pending,
    run: (input) => new Promise<BriefAuditResult>((resolve, reject) => pending.push({ input, resolve, reject })),
    close: async () => undefined,
  };
}

let t: TestApp;
let revisionId: number;
let others: number[];
const logged: unknown[] = [];

beforeAll(async () => {
  t = await startTestApp();
  const instructor = await t.cookieFor('instructor@example.org');
  const participant = await t.cookieFor('participant@example.org');
  const b = await makeBrief(t, instructor);
  const res = await request(t.app).post(`/api/briefs/${b.id}/revisions`).set('Cookie', participant).send({ design: cubePlates() });
  revisionId = res.body.id;
  others = [];
  for (const half of [40, 45]) others.push((await request(t.app).post(`/api/briefs/${b.id}/revisions`).set('Cookie', participant).send({ design: cubePlates(half) })).body.id);
  await t.ctx.audits.idle();
});
afterAll(async () => {
  await t.close();
});

const row = () => rawDb(t.ds).prepare('SELECT state, figures, error, attempts FROM audits WHERE revision_id = ?').get(revisionId) as { state: string; figures: string | null; error: string | null; attempts: number };
const tick = () => new Promise((r) => setTimeout(r, 5));

function runnerWith(pool: AuditPool) {
  return createAuditRunner({ dataSource: t.ds, pool, clock: t.clock, notifier: notifier({ dataSource: t.ds, mail: t.ctx.mail, clock: t.clock }), publicUrl: PUBLIC_URL, logError: (e) => logged.push(e) });
}

describe('audit runner', () => {
  it('when an audit is queued again while it runs, the older run\u2019s result is discarded', async () => {
    const pool = handPool();
    const runner = runnerWith(pool);
    runner.requeueRevisions([revisionId]);
    await tick();
    expect(row().state).toBe('running');
    runner.requeueRevisions([revisionId]); // e.g. the brief's constraints changed meanwhile
    await tick();
    expect(pool.pending).toHaveLength(2);
    const real = auditAgainstBrief(pool.pending[1].input);
    if (!real.ok) throw new Error(real.error);
    // The first run answers last-but-one with figures that must not land.
    pool.pending[0].resolve({ ...real, figures: { ...real.figures, pieces: 999 } });
    await tick();
    expect(row().state).toBe('running');
    pool.pending[1].resolve(real);
    await runner.idle();
    expect(row().state).toBe('done');
    expect(JSON.parse(row().figures!).pieces).toBe(6);
  });

  it('hands the pool no more audits than it has threads; the rest wait as queued', async () => {
    const pool = handPool(1);
    const runner = runnerWith(pool);
    const ids = [revisionId, ...others];
    expect(runner.requeueRevisions(ids)).toBe(3);
    await tick();
    const states = () => ids.map((id) => (rawDb(t.ds).prepare('SELECT state FROM audits WHERE revision_id = ?').get(id) as { state: string }).state);
    expect(pool.pending).toHaveLength(1);
    expect(states()).toEqual(['running', 'queued', 'queued']);
    for (let i = 0; i < 3; i++) {
      const r = auditAgainstBrief(pool.pending[i].input);
      if (!r.ok) throw new Error(r.error);
      pool.pending[i].resolve(r);
      await tick();
      expect(pool.pending).toHaveLength(Math.min(3, i + 2));
    }
    await runner.idle();
    expect(states()).toEqual(['done', 'done', 'done']);
  });

  it('when the pool throws, the audit is failed with a sentence and the error is logged', async () => {
    const pool = handPool();
    const runner = runnerWith(pool);
    const attempts = row().attempts;
    runner.requeueRevisions([revisionId]);
    await tick();
    pool.pending[0].reject(new Error('worker exited with code 1'));
    await runner.idle();
    expect(row()).toMatchObject({ state: 'failed', attempts: attempts + 1, error: expect.stringMatching(/problem on the server\. Retry it/) });
    expect(String(logged.at(-1))).toMatch(/worker exited/);
  });
});
