/**
 * Starts the real app for browser tests the way `npm start` does — `server/index.ts` under tsx,
 * serving the built client from dist/client — on a free port with a fresh SQLite file, and opens
 * Debian's Chromium through playwright-core.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { afterAll, beforeAll } from 'vitest';

export const DEMO_PASSWORD = 'planewright-demo';
export const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
const root = fileURLToPath(new URL('../../../', import.meta.url));

export interface RunningApp {
  url: string;
  dir: string;
  stop(): Promise<void>;
}

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.once('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address() as { port: number };
      srv.close(() => resolve(port));
    });
  });
}

/** Starts the server on a fresh database and waits until /api/health answers. */
export async function startApp(env: Record<string, string> = {}): Promise<RunningApp> {
  if (!existsSync(join(root, 'dist', 'client', 'index.html'))) {
    throw new Error('dist/client is missing: run `npm run build` (npm test does it first)');
  }
  const dir = mkdtempSync(join(tmpdir(), 'planewright-browser-'));
  const port = await freePort();
  const url = `http://127.0.0.1:${port}`;
  // Exactly what `npm start` runs (scripts/start.mjs): node with tsx's loader.
  const child: ChildProcess = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: root,
    env: {
      ...process.env,
      TSX_TSCONFIG_PATH: 'tsconfig.server.json',
      NODE_ENV: 'test',
      PORT: String(port),
      HOST: '127.0.0.1',
      DATABASE_PATH: join(dir, 'planewright.sqlite'),
      PUBLIC_URL: url,
      SMTP_URL: '',
      ...env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout!.on('data', (d) => (output += d));
  child.stderr!.on('data', (d) => (output += d));
  const deadline = Date.now() + 60_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`server exited with ${child.exitCode}:\n${output}`);
    try {
      const res = await fetch(`${url}/api/health`);
      if (res.ok) break;
    } catch {
      /* not listening yet */
    }
    if (Date.now() > deadline) {
      child.kill('SIGKILL');
      throw new Error(`server did not answer /api/health within 60 s:\n${output}`);
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  return {
    url,
    dir,
    async stop() {
      if (child.exitCode === null) {
        const exited = new Promise((r) => child.once('exit', r));
        child.kill('SIGTERM');
        await Promise.race([exited, new Promise((r) => setTimeout(r, 5000))]);
        if (child.exitCode === null) child.kill('SIGKILL');
      }
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

export interface Browser {
  context: BrowserContext;
  close(): Promise<void>;
}

/** A fresh Chromium profile (flags from STACK.md; --user-data-dir is passed by playwright). */
export async function openBrowser(): Promise<Browser> {
  const profile = mkdtempSync(join(tmpdir(), 'planewright-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM,
    headless: true,
    viewport: { width: 1280, height: 860 },
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
  return {
    context,
    async close() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

/**
 * Collects console errors, page errors, failed requests and error responses so a test can assert
 * the page ran cleanly. The signed-out probe of `/api/auth/me` (401 by contract) is expected and
 * left out; the browser's own "Failed to load resource" console line duplicates the response entry.
 */
export function watchPage(page: Page): { problems: string[] } {
  const problems: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error' && !m.text().startsWith('Failed to load resource')) problems.push(`console: ${m.text()}`);
  });
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
  page.on('requestfailed', (r) => {
    // ERR_ABORTED is the browser cancelling a request because the page navigated away.
    const reason = r.failure()?.errorText ?? '';
    if (reason !== 'net::ERR_ABORTED') problems.push(`request failed: ${r.url()} ${reason}`);
  });
  page.on('response', (r) => {
    const path = new URL(r.url()).pathname;
    if (r.status() >= 400 && !(r.status() === 401 && path === '/api/auth/me')) problems.push(`HTTP ${r.status()}: ${path}`);
  });
  return { problems };
}

/**
 * Starts the app and a browser before a test file's tests and stops both after them; read
 * `session.app` and `session.browser` inside the tests.
 */
export function useAppAndBrowser(env: Record<string, string> = {}): { readonly app: RunningApp; readonly browser: Browser } {
  const session = {} as { app: RunningApp; browser: Browser };
  beforeAll(async () => {
    session.app = await startApp(env);
    session.browser = await openBrowser();
  });
  afterAll(async () => {
    await session.browser?.close();
    await session.app?.stop();
  });
  return session;
}
