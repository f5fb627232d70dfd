/**
 * The better-sqlite3 handle under the TypeORM data source, for writes that must be one
 * synchronous transaction (no other request's statements can interleave with them), and the
 * datetime text TypeORM stores, so raw rows read back as the same Dates.
 */
import type Database from 'better-sqlite3';
import type { DataSource } from 'typeorm';

export function rawDb(ds: DataSource): Database.Database {
  return (ds.driver as unknown as { databaseConnection: Database.Database }).databaseConnection;
}

/** `2026-03-02 09:00:00.000`, UTC: the form TypeORM writes datetime columns in on SQLite. */
export function sqlDate(d: Date): string {
  return d.toISOString().replace('T', ' ').replace('Z', '');
}

/** The Date of a datetime column read raw. */
export function fromSqlDate(s: string | null): Date | null {
  return s === null ? null : new Date(s.replace(' ', 'T') + 'Z');
}

/**
 * Waits until no transaction is open on the shared connection (another request's TypeORM
 * transaction awaits between its statements), so a synchronous transaction started right after
 * is a transaction of its own and never a savepoint inside someone else's.
 */
export async function whenNoTransaction(db: Database.Database): Promise<void> {
  for (let waited = 0; db.inTransaction; waited += 2) {
    if (waited > 10_000) throw new Error('the database stayed inside another transaction for 10 s');
    await new Promise((resolve) => setTimeout(resolve, 2));
  }
}
