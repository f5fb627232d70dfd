/**
 * `server/index.ts` as a real process: migrate, seed, mail sink, listen, print, shut down.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync, statSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';

const root = join(import.meta.dirname, '..', '..');
const dir = mkdtempSync(join(tmpdir(), 'planewright-process-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = createServer().listen(0, '127.0.0.1', () => {
      const port = (s.address() as { port: number }).port;
      s.close(() => resolve(port));
    });
  });
}

function start(env: Record<string, string>): { child: ChildProcess; output: () => string; exit: Promise<number | null> } {
  // One node process with tsx's loader (what `tsx` runs underneath), so the signal reaches the
  // server itself: the tsx wrapper relays with a 30 ms deadline and SIGKILLs a child that is slow
  // to answer on a busy machine, which would test tsx rather than our shutdown.
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: root,
    env: { ...process.env, TSX_TSCONFIG_PATH: 'tsconfig.server.json', NODE_ENV: 'development', HOST: '127.0.0.1', SMTP_URL: '', SESSION_SECRET: '', DATABASE_PATH: join(dir, 'db.sqlite'), ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  child.stdout!.on('data', (d) => (out += d));
  child.stderr!.on('data', (d) => (out += d));
  const exit = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
  return { child, output: () => out, exit };
}

async function waitForHealth(url: string, output: () => string): Promise<void> {
  const deadline = Date.now() + 45_000;
  while (Date.now() < deadline) {
    try {
      if ((await fetch(`${url}/api/health`)).ok) return;
    } catch {
      /* not yet */
    }
    await new Promise((r) => setTimeout(r, 150));
  }
  throw new Error(`no health answer:\n${output()}`);
}

describe('server process', () => {
  it('starts on an empty database, seeds the demo, prints URL and accounts, and stops cleanly on SIGTERM', async () => {
    const port = await freePort();
    const p = start({ PORT: String(port) });
    try {
      await waitForHealth(`http://127.0.0.1:${port}`, p.output);
      const login = await fetch(`http://127.0.0.1:${port}/api/auth/login`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ email: 'admin@example.org', password: 'planewright-demo' }),
      });
      expect(login.status).toBe(200);
      const out = p.output();
      expect(out).toContain(`Planewright is running at http://127.0.0.1:${port}`);
      expect(out).toContain('demo data added');
      for (const email of ['admin@example.org', 'instructor@example.org', 'critic@example.org', 'participant@example.org', 'technician@example.org']) {
        expect(out).toContain(email);
      }
      expect(statSync(join(dir, 'session-secret')).mode & 0o777).toBe(0o600);
    } finally {
      p.child.kill('SIGTERM');
    }
    expect(await p.exit).toBe(0);
    expect(p.output()).toContain('SIGTERM: shutting down');
  });

  it('does not seed again on a database that has data', async () => {
    const port = await freePort();
    const p = start({ PORT: String(port) });
    try {
      await waitForHealth(`http://127.0.0.1:${port}`, p.output);
      expect(p.output()).not.toContain('demo data added');
    } finally {
      p.child.kill('SIGINT');
    }
    expect(await p.exit).toBe(0);
    expect(p.output()).toContain('SIGINT: shutting down');
  });

  it('refuses to start in production without SESSION_SECRET and says why', async () => {
    const p = start({ NODE_ENV: 'production', PORT: String(await freePort()), DATABASE_PATH: join(dir, 'prod.sqlite') });
    expect(await p.exit).toBe(1);
    expect(p.output()).toContain('SESSION_SECRET: required when NODE_ENV=production');
  });
});
