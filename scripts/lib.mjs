// Helpers for the project's own commands. Node built-ins only: these run before `npm ci`.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join, dirname } from 'node:path';
import { fileURLToPath } from 'node:url';

export const root = join(dirname(fileURLToPath(import.meta.url)), '..');
export const bin = (name) => join(root, 'node_modules', '.bin', name);

export function log(message) {
  process.stdout.write(`\x1b[2m[planewright]\x1b[0m ${message}\n`);
}

/** Runs a command to completion with inherited output; exits the process when it fails. */
export function run(command, args, options = {}) {
  const result = spawnSync(command, args, { cwd: root, stdio: 'inherit', ...options });
  if (result.error) throw result.error;
  return result.status ?? 1;
}

export function runOrExit(command, args, options = {}) {
  const status = run(command, args, options);
  if (status !== 0) {
    log(`\`${[command, ...args].join(' ')}\` failed (exit ${status})`);
    process.exit(status);
  }
}

/**
 * Installs dependencies from the lock file when node_modules is missing or older than the
 * lock file, so `npm start` and `npm test` work alone on a fresh clone.
 */
export function ensureInstalled() {
  const marker = join(root, 'node_modules', '.package-lock.json');
  const lock = join(root, 'package-lock.json');
  const fresh = existsSync(marker) && existsSync(bin('tsx')) && statSync(marker).mtimeMs >= statSync(lock).mtimeMs - 1000;
  if (fresh) return;
  log('installing dependencies (npm ci; the first time takes a few minutes while better-sqlite3 compiles)…');
  runOrExit('npm', ['ci', '--no-audit', '--no-fund']);
}

function newestMtime(path) {
  if (!existsSync(path)) return 0;
  const s = statSync(path);
  if (!s.isDirectory()) return s.mtimeMs;
  let newest = s.mtimeMs;
  for (const entry of readdirSync(path)) newest = Math.max(newest, newestMtime(join(path, entry)));
  return newest;
}

/** Builds the client when dist/client is missing or older than any of its sources. */
export function ensureClientBuilt({ force = false } = {}) {
  const built = join(root, 'dist', 'client', 'index.html');
  const sources = ['src', 'shared', 'public', 'index.html', 'vite.config.ts', 'tailwind.config.ts', 'package-lock.json'];
  const newestSource = Math.max(...sources.map((s) => newestMtime(join(root, s))));
  if (!force && existsSync(built) && statSync(built).mtimeMs >= newestSource) return;
  log('building the client (vite build)…');
  runOrExit(bin('vite'), ['build', '--logLevel', 'warn']);
}

/** Starts a long-running child that shares the terminal and is stopped with this process. */
export function startChild(command, args, options = {}) {
  const child = spawn(command, args, { cwd: root, stdio: 'inherit', ...options });
  const stop = (signal) => {
    if (!child.killed) child.kill(signal);
  };
  process.on('SIGINT', () => stop('SIGINT'));
  process.on('SIGTERM', () => stop('SIGTERM'));
  return child;
}
