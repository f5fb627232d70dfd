/**
 * The worker-thread pool that runs audits (piscina). Threads start on the first audit, so an
 * app that never audits starts none. The worker entry is an `.mjs` file that registers tsx and
 * then imports the TypeScript task, which works both under `node --import tsx` and in vitest.
 */
import { Piscina } from 'piscina';
import type { BriefAuditInput, BriefAuditResult } from './brief-rules.js';

export interface AuditPool {
  /** Threads that run at once; the runner hands over no more audits than this at a time. */
  readonly threads: number;
  run(input: BriefAuditInput, signal: AbortSignal): Promise<BriefAuditResult>;
  close(): Promise<void>;
}

/** Two cores on the reference machine: one or two threads leave room for the web server. */
export const DEFAULT_AUDIT_THREADS = 2;

export function createAuditPool(threads = DEFAULT_AUDIT_THREADS): AuditPool {
  let pool: Piscina | null = null;
  let closed = false;
  const get = (): Piscina =>
    (pool ??= new Piscina({
      filename: new URL('./worker-entry.mjs', import.meta.url).href,
      minThreads: 1,
      maxThreads: Math.max(1, threads),
      idleTimeout: 60_000,
    }));
  return {
    threads: Math.max(1, threads),
    async run(input, signal) {
      if (closed) throw new Error('the audit pool is closed');
      return (await get().run(input, { signal })) as BriefAuditResult;
    },
    async close() {
      closed = true;
      if (pool) await pool.destroy();
      pool = null;
    },
  };
}
