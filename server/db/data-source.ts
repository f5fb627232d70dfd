/**
 * The TypeORM data source: one SQLite file through better-sqlite3, WAL, foreign keys on,
 * schema only through the committed migrations (never `synchronize`).
 */
import 'reflect-metadata';
import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import { DataSource } from 'typeorm';
import { ENTITIES } from './entities/index.js';
import { MIGRATIONS } from './migrations/index.js';

export function createDataSource(databasePath: string): DataSource {
  if (databasePath !== ':memory:') mkdirSync(dirname(databasePath), { recursive: true });
  return new DataSource({
    type: 'better-sqlite3',
    database: databasePath,
    enableWAL: true,
    entities: ENTITIES,
    migrations: MIGRATIONS,
    migrationsTableName: 'migrations',
    synchronize: false,
    logging: ['error'],
    prepareDatabase: (db: { pragma(s: string): unknown }) => {
      // The driver turns foreign keys on itself; say so here too, so the rule is visible.
      db.pragma('foreign_keys = ON');
      db.pragma('busy_timeout = 5000');
    },
  });
}

/** Opens the data source and applies pending migrations. */
export async function openDatabase(databasePath: string): Promise<DataSource> {
  const ds = createDataSource(databasePath);
  await ds.initialize();
  await ds.runMigrations({ transaction: 'each' });
  return ds;
}
