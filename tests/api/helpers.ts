/**
 * A real app on a fresh SQLite file: migrations run, the demo seeded (one bcrypt hash per test
 * file), the in-process SMTP sink listening, nodemailer talking to it. Nothing is mocked.
 */
import { createHmac, randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import type { Express } from 'express';
import request from 'supertest';
import type { DataSource } from 'typeorm';
import { createApp } from '../../server/app.js';
import { createAuditPool } from '../../server/audits/pool.js';
import { createAuditRunner } from '../../server/audits/runner.js';
import type { AppContext } from '../../server/context.js';
import { openDatabase } from '../../server/db/data-source.js';
import { MailMessage, Membership, Session, User } from '../../server/db/entities/index.js';
import { hashPassword } from '../../server/lib/password.js';
import { createMailService, type MailService } from '../../server/mail/mail-service.js';
import { startMailSink, type MailSink } from '../../server/mail/sink.js';
import { notifier } from '../../server/notifications/service.js';
import { DEMO_PASSWORD, seedDemo } from '../../server/seed/demo.js';

export { DEMO_PASSWORD };

let demoHash: Promise<string> | null = null;
/** The cost-12 hash of the demo password, computed once per test file. */
export const demoPasswordHash = (): Promise<string> => (demoHash ??= hashPassword(DEMO_PASSWORD));

export class TestClock {
  constructor(public t = Date.parse('2026-03-02T09:00:00Z')) {}
  now = (): Date => new Date(this.t);
  advance(ms: number): void {
    this.t += ms;
  }
}

export interface TestAppOptions {
  seed?: boolean;
  loginRateLimit?: number;
  /** Reuse an existing database file (e.g. to "restart" the app). */
  databasePath?: string;
  sessionSecret?: string;
  mail?: MailService;
  logError?: (e: unknown) => void;
  clientDir?: string | null;
  /** Worker threads of the audit pool (started on the first audit; default 1). */
  auditThreads?: number;
}

export interface TestApp {
  app: Express;
  ds: DataSource;
  sink: MailSink;
  clock: TestClock;
  ctx: AppContext;
  databasePath: string;
  dir: string;
  /** Signs in through POST /api/auth/login (one bcrypt compare) and returns the session cookie. */
  signIn(email: string, password?: string): Promise<string>;
  /**
   * A session cookie for the account without running bcrypt: writes the session row the way
   * express-session + passport would and signs the id with the app's secret. For tests about
   * something other than signing in.
   */
  cookieFor(email: string): Promise<string>;
  outbox(): Promise<MailMessage[]>;
  /** A user (demo password) with an optional membership of `studioId`. */
  addUser(email: string, name: string, membership?: { studioId: number; role: Membership['role'] }): Promise<User>;
  close(): Promise<void>;
}

export const TEST_SECRET = 'test-secret-that-is-long-enough-for-sessions-0123456789';
export const PUBLIC_URL = 'http://planewright.test';

export async function startTestApp(options: TestAppOptions = {}): Promise<TestApp> {
  const dir = mkdtempSync(join(tmpdir(), 'planewright-api-'));
  const databasePath = options.databasePath ?? join(dir, 'test.sqlite');
  const ds = await openDatabase(databasePath);
  const clock = new TestClock();
  if (options.seed !== false && options.databasePath === undefined) {
    await seedDemo(ds, { clock, passwordHash: await demoPasswordHash() });
  }
  const sink = await startMailSink(ds, clock);
  const mail = options.mail ?? createMailService(sink.url, 'Planewright <planewright@example.org>', { local: true });
  const pool = createAuditPool(options.auditThreads ?? 1);
  const audits = createAuditRunner({ dataSource: ds, pool, clock, notifier: notifier({ dataSource: ds, mail, clock, logError: options.logError }), publicUrl: PUBLIC_URL, logError: options.logError });
  const ctx: AppContext = {
    audits,
    blobDir: join(dirname(databasePath), 'blobs'),
    config: {
      sessionSecret: options.sessionSecret ?? TEST_SECRET,
      publicUrl: PUBLIC_URL,
      loginRateLimit: options.loginRateLimit ?? 1000,
      trustProxy: undefined,
      nodeEnv: 'test',
    },
    dataSource: ds,
    mail,
    clock,
    clientDir: options.clientDir ?? null,
    logError: options.logError,
  };
  const app = createApp(ctx);
  return {
    app,
    ds,
    sink,
    clock,
    ctx,
    databasePath,
    dir,
    async cookieFor(email) {
      const user = await ds.getRepository(User).findOneBy({ email });
      if (!user) throw new Error(`no account ${email}`);
      const sid = randomBytes(24).toString('base64url');
      const maxAge = 14 * 24 * 60 * 60 * 1000;
      const json = JSON.stringify({
        cookie: { originalMaxAge: maxAge, expires: new Date(Date.now() + maxAge).toISOString(), secure: false, httpOnly: true, path: '/', sameSite: 'lax' },
        passport: { user: user.id },
      });
      await ds.getRepository(Session).insert({ id: sid, json, expiredAt: Date.now() + maxAge });
      const signature = createHmac('sha256', ctx.config.sessionSecret).update(sid).digest('base64').replace(/=+$/, '');
      return `planewright.sid=${encodeURIComponent(`s:${sid}.${signature}`)}`;
    },
    async signIn(email, password = DEMO_PASSWORD) {
      const res = await request(app).post('/api/auth/login').send({ email, password });
      if (res.status !== 200) throw new Error(`sign-in as ${email} answered ${res.status}: ${JSON.stringify(res.body)}`);
      return sessionCookie(res);
    },
    outbox: () => ds.getRepository(MailMessage).find({ order: { id: 'ASC' } }),
    async addUser(email, name, membership) {
      const users = ds.getRepository(User);
      const u = await users.save(users.create({ email, name, passwordHash: await demoPasswordHash(), globalRole: null, createdAt: clock.now(), lastLoginAt: null }));
      if (membership) await ds.getRepository(Membership).insert({ userId: u.id, studioId: membership.studioId, role: membership.role, createdAt: clock.now() });
      return u;
    },
    async close() {
      await audits.close();
      mail.close();
      await sink.close();
      if (ds.isInitialized) await ds.destroy();
      if (options.databasePath === undefined) rmSync(dir, { recursive: true, force: true });
    },
  };
}

/** The `planewright.sid=…` pair from a response's Set-Cookie. */
export function sessionCookie(res: request.Response): string {
  const raw = res.headers['set-cookie'] as unknown as string[] | string | undefined;
  const list = Array.isArray(raw) ? raw : raw ? [raw] : [];
  const c = list.find((x) => x.startsWith('planewright.sid='));
  if (!c) throw new Error('no session cookie in the response');
  return c.split(';')[0];
}

/** The link in a message's text that starts with `prefix`. */
export function linkIn(text: string, prefix: string): string {
  const m = text.match(new RegExp(`${prefix.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}\\S+`));
  if (!m) throw new Error(`no link starting ${prefix} in:\n${text}`);
  return m[0];
}

export const DEMO_STUDIO_ID = 1;
