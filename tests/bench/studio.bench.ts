// Benchmark of the studio workflow's HTTP side (issue 4 targets):
// - list endpoints at p95 under 50 ms with 200 submissions on one brief: the instructor's
//   submissions table and the studio's brief list, driven by autocannon on loopback;
// - one upload-and-audit of a design of 500+ pieces end to end under 2 s: POST the revision,
//   then poll its audit until it is done (as the client does), timed on the caller's clock.
//
// Run: npx tsx --tsconfig tsconfig.server.json tests/bench/studio.bench.ts [--json]
// The real app (createApp with the context the API tests build: migrations on a fresh SQLite
// file, the demo seed, the audit worker pool, the SMTP sink) is served on 127.0.0.1 on a free
// port. Everything is bounded: a fixed number of requests per endpoint, a deadline for each
// wait, and a watchdog that ends the process if the whole run takes longer than 4 minutes.
// Figures depend on the machine (2 shared cores here); they are measured, never asserted in tests.
import 'reflect-metadata';
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { DEMO_STUDIO_ID, startTestApp, type TestApp } from '../api/helpers.js';

const json = process.argv.includes('--json');
const log = (...args: unknown[]): void => {
  if (!json) console.log(...args);
};

const SUBMISSIONS = 200;
const UPLOAD_CONCURRENCY = 8;
const LIST_REQUESTS = 2000;
/** One caller at a time (the latency a person sees) and ten at once (a studio's crit day). */
const LIST_CONNECTIONS = [1, 10] as const;
const UPLOAD_RUNS = 3;
const TARGET_LIST_P95_MS = 50;
const TARGET_UPLOAD_AUDIT_MS = 2000;
const WATCHDOG_MS = 4 * 60_000;

const DESIGNS = join(import.meta.dirname, '../../server/seed/designs');

// autocannon ships no type declarations; this is the part of its API used here.
interface AutocannonOptions {
  url: string;
  connections: number;
  amount: number;
  timeout: number;
  headers: Record<string, string>;
}
interface AutocannonResult {
  requests: { total: number };
  non2xx: number;
  errors: number;
  timeouts: number;
}
interface AutocannonInstance {
  on(event: 'response', fn: (client: unknown, statusCode: number, resBytes: number, responseTimeMs: number) => void): void;
  then: Promise<AutocannonResult>['then'];
}
const autocannon = createRequire(import.meta.url)('autocannon') as (opts: AutocannonOptions) => AutocannonInstance;

const watchdog = setTimeout(() => {
  console.error(`studio bench: still running after ${WATCHDOG_MS / 1000} s; stopping`);
  process.exit(3);
}, WATCHDOG_MS);
watchdog.unref();

function readDesign(name: string): Record<string, unknown> {
  return JSON.parse(readFileSync(join(DESIGNS, `${name}.json`), 'utf8')) as Record<string, unknown>;
}

type Ring = [number, number][];
interface DesignDoc {
  families: { id: string; axis: number; offset: number }[];
  motifs: { id: string; family: string; outline: Ring; holes?: Ring[] }[];
  [key: string]: unknown;
}

/**
 * Seven keel lanterns nested inside each other, each the demo lantern scaled by 1.25 from the
 * last (offsets and outlines scale together, so each keeps its 90° joints): 7 × 80 = 560 pieces
 * and 840 joints, with two families per lantern. The lanterns do not touch each other, so the
 * audit ends with findings (7 components, more sheets than allowed) — the cost is the same.
 */
function nestedLanterns(count = 7, ratio = 1.25): DesignDoc {
  const base = readDesign('i-keel-lantern') as unknown as DesignDoc;
  const families: DesignDoc['families'] = [];
  const motifs: DesignDoc['motifs'] = [];
  const r2 = (x: number): number => Math.round(x * 100) / 100;
  for (let k = 1; k <= count; k++) {
    const s = ratio ** (k - 1);
    const scale = (ring: Ring): Ring => ring.map(([x, y]) => [r2(x * s), r2(y * s)]);
    for (const f of base.families) families.push({ ...f, id: `${f.id}-${k}`, offset: r2(f.offset * s) });
    for (const m of base.motifs) {
      motifs.push({ id: `${m.id}-${k}`, family: `${m.family}-${k}`, outline: scale(m.outline), ...(m.holes ? { holes: m.holes.map(scale) } : {}) });
    }
  }
  return { ...base, title: 'Nested keel lanterns', families, motifs };
}

function percentile(sorted: readonly number[], p: number): number {
  if (sorted.length === 0) return NaN;
  const k = Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1));
  return sorted[k];
}

const round = (x: number, d = 1): number => Math.round(x * 10 ** d) / 10 ** d;

interface Http {
  base: string;
  call<T>(method: string, path: string, cookie: string, body?: unknown): Promise<{ status: number; body: T }>;
}

function http(base: string): Http {
  return {
    base,
    async call<T>(method: string, path: string, cookie: string, body?: unknown) {
      const res = await fetch(base + path, {
        method,
        headers: { cookie, ...(body !== undefined ? { 'content-type': 'application/json' } : {}) },
        body: body !== undefined ? JSON.stringify(body) : undefined,
        signal: AbortSignal.timeout(30_000),
      });
      const text = await res.text();
      let parsed: unknown = text;
      try {
        parsed = text ? JSON.parse(text) : null;
      } catch {
        /* not JSON */
      }
      return { status: res.status, body: parsed as T };
    },
  };
}

async function expectStatus<T>(what: string, p: Promise<{ status: number; body: T }>, ok: number[] = [200, 201]): Promise<T> {
  const r = await p;
  if (!ok.includes(r.status)) throw new Error(`${what}: answered ${r.status} ${JSON.stringify(r.body).slice(0, 500)}`);
  return r.body;
}

async function runPool<T>(items: readonly T[], concurrency: number, fn: (item: T, i: number) => Promise<void>): Promise<void> {
  let next = 0;
  const worker = async (): Promise<void> => {
    while (next < items.length) {
      const i = next++;
      await fn(items[i], i);
    }
  };
  await Promise.all(Array.from({ length: Math.min(concurrency, items.length) }, worker));
}

interface AuditDto {
  state: 'queued' | 'running' | 'done' | 'failed';
  error: string | null;
  queuedAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  report: { pieces: number; ok: boolean; summary: { joints: number }; findings: { code: string }[] } | null;
}

async function waitForAudit(h: Http, cookie: string, revisionId: number, deadlineMs: number, pollMs = 10): Promise<AuditDto> {
  const deadline = performance.now() + deadlineMs;
  for (;;) {
    const a = await expectStatus<AuditDto>('GET audit', h.call('GET', `/api/revisions/${revisionId}/audit`, cookie));
    if (a.state === 'done' || a.state === 'failed') return a;
    if (performance.now() > deadline) throw new Error(`audit of revision ${revisionId} still ${a.state} after ${deadlineMs} ms`);
    await new Promise((r) => setTimeout(r, pollMs));
  }
}

interface ListStats {
  connections: number;
  p50: number;
  p95: number;
  p99: number;
  requests: number;
  bad: number;
}

async function measureList(url: string, cookie: string, connections: number): Promise<ListStats> {
  const times: number[] = [];
  const instance = autocannon({ url, connections, amount: LIST_REQUESTS, timeout: 10, headers: { cookie } });
  instance.on('response', (_client, _status, _bytes, ms) => times.push(ms));
  const result = await instance;
  times.sort((a, b) => a - b);
  return {
    connections,
    p50: round(percentile(times, 50)),
    p95: round(percentile(times, 95)),
    p99: round(percentile(times, 99)),
    requests: result.requests.total,
    bad: result.non2xx + result.errors + result.timeouts,
  };
}

async function main(): Promise<void> {
  const t0 = performance.now();
  const app: TestApp = await startTestApp();
  // The API tests' clock stands still; here audits and uploads carry real times, as in production.
  app.clock.now = () => new Date();
  let server: Server | null = null;
  try {
    server = await new Promise<Server>((ok, fail) => {
      const s = app.app.listen(0, '127.0.0.1', (err?: Error) => (err ? fail(err) : ok(s)));
    });
    const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    const h = http(base);
    const admin = await app.cookieFor('admin@example.org');
    const instructor = await app.cookieFor('instructor@example.org');

    // A catalogue material and a published brief with the icosahedral demo limits.
    const material = await expectStatus<{ id: number }>(
      'POST /api/materials',
      h.call('POST', '/api/materials', admin, { name: 'Bench birch plywood 3 mm', thickness: 3, kerf: 0.2, sheetSizes: [[600, 400]] }),
    );
    const brief = await expectStatus<{ id: number }>(
      'POST brief',
      h.call('POST', `/api/studios/${DEMO_STUDIO_ID}/briefs`, instructor, {
        title: 'Bench lantern brief',
        body: 'Icosahedral lamp in 3 mm birch plywood: families on the 2-fold and 3-fold axes.',
        constraints: {
          allowedGroups: ['I'],
          allowedFamilies: [
            { axis: 2, offsetMin: 0, offsetMax: 1000 },
            { axis: 3, offsetMin: 0, offsetMax: 1000 },
          ],
          materialId: material.id,
          sheet: [600, 400],
          maxSheets: 3,
          angleToleranceDeg: 0.5,
          minJointLength: 6,
        },
        deadline: new Date(Date.now() + 30 * 24 * 3600_000).toISOString(),
      }),
    );
    await expectStatus('publish', h.call('POST', `/api/briefs/${brief.id}/publish`, instructor));

    // 200 participants, one submission each, cycling through the demo designs.
    const names = ['i-keel-lantern', 'i-half-keels', 'i-closed-shell'];
    const designs = names.map(readDesign);
    const cookies: string[] = [];
    for (let i = 0; i < SUBMISSIONS; i++) {
      const email = `bench-participant-${String(i + 1).padStart(3, '0')}@example.org`;
      await app.addUser(email, `Bench Participant ${i + 1}`, { studioId: DEMO_STUDIO_ID, role: 'participant' });
      cookies.push(await app.cookieFor(email));
    }
    const seedStart = performance.now();
    const revisionIds: number[] = new Array<number>(SUBMISSIONS);
    await runPool(cookies, UPLOAD_CONCURRENCY, async (cookie, i) => {
      const rev = await expectStatus<{ id: number }>(
        `upload ${i + 1}`,
        h.call('POST', `/api/briefs/${brief.id}/revisions`, cookie, { design: designs[i % designs.length] }),
      );
      revisionIds[i] = rev.id;
    });
    // Every seeded audit finishes before the lists are measured (they compete for the cores).
    // Audits that failed in the burst are counted and reported, then retried two at a time.
    const failed: { index: number; id: number; error: string | null }[] = [];
    await runPool(revisionIds, 4, async (id, i) => {
      const a = await waitForAudit(h, cookies[i], id, 180_000, 100);
      if (a.state !== 'done') failed.push({ index: i, id, error: a.error });
    });
    if (failed.length > 0) {
      log(`${failed.length} of ${SUBMISSIONS} seeded audits failed in the upload burst, e.g. revision ${failed[0].id}: ${failed[0].error}`);
      await runPool(failed, 2, async (f) => {
        await expectStatus(`retry ${f.id}`, h.call('POST', `/api/revisions/${f.id}/retry`, cookies[f.index]));
        const a = await waitForAudit(h, cookies[f.index], f.id, 60_000, 50);
        if (a.state !== 'done') throw new Error(`the retried audit of revision ${f.id} failed again: ${a.error}`);
      });
    }
    const seedMs = performance.now() - seedStart;
    log(`seeded ${SUBMISSIONS} submissions with audits in ${round(seedMs / 1000)} s`);

    const rows = await expectStatus<unknown[]>('submissions table', h.call('GET', `/api/briefs/${brief.id}/submissions`, instructor));
    if (rows.length !== SUBMISSIONS) throw new Error(`the submissions table has ${rows.length} rows, expected ${SUBMISSIONS}`);

    const lists: Record<string, string> = {
      submissions: `${base}/api/briefs/${brief.id}/submissions`,
      briefs: `${base}/api/studios/${DEMO_STUDIO_ID}/briefs`,
    };
    const listStats: Record<string, ListStats> = {};
    for (const [name, url] of Object.entries(lists)) {
      for (const c of LIST_CONNECTIONS) listStats[c === 1 ? name : `${name}@${c}`] = await measureList(url, instructor, c);
    }

    // Upload-and-audit of a 560-piece design, end to end, by a participant who has not submitted.
    const big = nestedLanterns();
    const uploads: { ms: number; pieces: number; joints: number; serverAuditMs: number; findings: string[] }[] = [];
    for (let run = 0; run < UPLOAD_RUNS; run++) {
      const email = `bench-large-${run + 1}@example.org`;
      await app.addUser(email, `Bench Large ${run + 1}`, { studioId: DEMO_STUDIO_ID, role: 'participant' });
      const cookie = await app.cookieFor(email);
      const start = performance.now();
      const rev = await expectStatus<{ id: number }>('large upload', h.call('POST', `/api/briefs/${brief.id}/revisions`, cookie, { design: big }));
      const audit = await waitForAudit(h, cookie, rev.id, 60_000);
      const ms = performance.now() - start;
      if (audit.state !== 'done' || !audit.report) throw new Error(`the large audit failed: ${audit.error}`);
      uploads.push({
        ms: round(ms),
        pieces: audit.report.pieces,
        joints: audit.report.summary.joints,
        serverAuditMs: Date.parse(audit.finishedAt ?? '') - Date.parse(audit.startedAt ?? ''),
        findings: [...new Set(audit.report.findings.map((f) => f.code))].sort(),
      });
    }
    const uploadMs = [...uploads.map((u) => u.ms)].sort((a, b) => a - b);
    const median = uploadMs[Math.floor(uploadMs.length / 2)];

    const at = (connections: number) =>
      Object.fromEntries(Object.entries(listStats).filter(([, v]) => v.connections === connections).map(([k, v]) => [k.replace(/@\d+$/, ''), v.p95]));
    const listOk = (connections: number) => Object.values(listStats).filter((v) => v.connections === connections).every((v) => v.p95 < TARGET_LIST_P95_MS && v.bad === 0);
    const summary = {
      // The target is read as the latency one caller sees; ten callers at once are shown beside it.
      listP95Ms: at(1),
      listP95MsAt10Connections: at(10),
      uploadAuditMs: median,
      pieces: uploads[0].pieces,
      targets: { listP95Ms: TARGET_LIST_P95_MS, uploadAuditMs: TARGET_UPLOAD_AUDIT_MS },
      met: { lists: listOk(1), listsAt10Connections: listOk(10), uploadAudit: median < TARGET_UPLOAD_AUDIT_MS },
      detail: {
        submissions: SUBMISSIONS,
        seededAuditsFailedInBurst: failed.length,
        firstBurstFailure: failed[0]?.error ?? null,
        lists: listStats,
        uploads,
        seedSeconds: round(seedMs / 1000),
        totalSeconds: round((performance.now() - t0) / 1000),
      },
    };
    if (json) {
      console.log(JSON.stringify(summary, null, 2));
    } else {
      log('');
      log(`list endpoints, ${SUBMISSIONS} submissions on the brief, ${LIST_REQUESTS} requests each`);
      log('endpoint            callers   p50 ms   p95 ms   p99 ms   non-2xx/errors   p95 < 50 ms');
      for (const [name, s] of Object.entries(listStats)) {
        const met = s.p95 < TARGET_LIST_P95_MS && s.bad === 0 ? 'met' : 'NOT MET';
        log(`${name.replace(/@\d+$/, '').padEnd(20)}${String(s.connections).padStart(7)}${String(s.p50).padStart(9)}${String(s.p95).padStart(9)}${String(s.p99).padStart(9)}${String(s.bad).padStart(17)}   ${met}`);
      }
      log('');
      log(`upload-and-audit of ${summary.pieces} pieces (${uploads[0].joints} joints), POST to audit done:`);
      for (const u of uploads) log(`  ${String(u.ms).padStart(8)} ms end to end, ${u.serverAuditMs} ms in the worker; findings: ${u.findings.join(', ') || 'none'}`);
      log(`  median ${median} ms   target < ${TARGET_UPLOAD_AUDIT_MS} ms ${summary.met.uploadAudit ? 'met' : 'NOT MET'}`);
      if (failed.length > 0) log(`note: ${failed.length} of the ${SUBMISSIONS} seeded audits failed during the upload burst and were retried`);
      log(`whole run ${summary.detail.totalSeconds} s (seeding ${summary.detail.seedSeconds} s)`);
    }
  } finally {
    if (server) {
      server.closeAllConnections();
      await new Promise<void>((r) => server!.close(() => r()));
    }
    await app.close();
  }
}

main().then(
  () => process.exit(0),
  (e: unknown) => {
    console.error(`studio bench failed: ${e instanceof Error ? e.message : String(e)}`);
    process.exit(1);
  },
);
