import { TypeormStore } from 'connect-typeorm';
import type { DataSource } from 'typeorm';
import { Session } from '../db/entities/index.js';

/**
 * connect-typeorm's store on the sessions table. Its own `destroy` does not wait for the
 * delete, so a request right after sign-out could still see the session; this one waits.
 */
export function createSessionStore(ds: DataSource, logError: (e: unknown) => void): TypeormStore {
  const repo = ds.getRepository(Session);
  const store = new TypeormStore({
    cleanupLimit: 2,
    ttl: (_s, sess) => ttlOf(sess),
    // Without onError the store marks itself disconnected after one failed query and every later
    // request would be treated as signed out; log instead and let express-session answer 500.
    onError: (_s, e) => logError(e),
  }).connect(repo);
  store.destroy = (sid: string | string[], fn?: (err?: unknown) => void) => {
    const ids = Array.isArray(sid) ? sid : [sid];
    repo
      .delete(ids)
      .then(() => fn?.())
      .catch((e: unknown) => fn?.(e));
  };
  return store;
}

const DAY_S = 86_400;
function ttlOf(sess: unknown): number {
  const maxAge = (sess as { cookie?: { maxAge?: number } } | undefined)?.cookie?.maxAge;
  return typeof maxAge === 'number' ? Math.max(1, Math.floor(maxAge / 1000)) : DAY_S;
}
