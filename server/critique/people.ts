/**
 * Names and roles of the people in a studio's critique: a comment's author is shown with their
 * role in the studio (`instructor`, `critic`, `participant`) or `admin`. Accounts that are gone
 * show as a former member.
 */
import type Database from 'better-sqlite3';

export interface Person {
  id: number;
  name: string;
}

export const FORMER: Person = { id: 0, name: 'A former member' };

export function peopleOf(db: Database.Database, studioId: number) {
  const roles = new Map<number, string>(
    (db.prepare('SELECT user_id, role FROM memberships WHERE studio_id = ?').all(studioId) as { user_id: number; role: string }[]).map((r) => [r.user_id, r.role]),
  );
  const cache = new Map<number, { name: string; globalRole: string | null } | null>();
  const user = (id: number) => {
    if (!cache.has(id)) cache.set(id, (db.prepare('SELECT name, global_role AS globalRole FROM users WHERE id = ?').get(id) as { name: string; globalRole: string | null } | undefined) ?? null);
    return cache.get(id)!;
  };
  return {
    person(id: number | null): Person {
      if (id === null) return FORMER;
      const u = user(id);
      return u ? { id, name: u.name } : FORMER;
    },
    role(id: number | null): string {
      if (id === null) return '';
      const r = roles.get(id);
      if (r) return r;
      return user(id)?.globalRole === 'admin' ? 'admin' : '';
    },
  };
}
