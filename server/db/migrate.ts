import type { Db } from './create-db.ts';
import { LagbookMigrationSource, migrationsDirectory } from './migration-source.ts';

/** Applies every pending migration; returns the names applied in this run. */
export async function migrateToLatest(db: Db): Promise<string[]> {
  const [, applied] = await db.migrate.latest({
    migrationSource: new LagbookMigrationSource(migrationsDirectory()),
    tableName: 'knex_migrations',
  });
  return applied as string[];
}

/** Rolls every migration back (tests use it to prove each `down` works). */
export async function rollbackAll(db: Db): Promise<void> {
  await db.migrate.rollback({ migrationSource: new LagbookMigrationSource(migrationsDirectory()), tableName: 'knex_migrations' }, true);
}
