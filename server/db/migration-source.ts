import { readdir } from 'node:fs/promises';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { basename, dirname, extname, join } from 'node:path';
import type { Knex } from 'knex';

/**
 * Migrations live in `migrations/` as `YYYYMMDDHHMMSS_kebab-name.ts`. Knex records each
 * migration by name; this source drops the extension, so a database migrated from the
 * TypeScript sources (dev, tests) and one migrated from the compiled `.js` build (production)
 * record the same names and can be migrated by either.
 */
export class LagbookMigrationSource implements Knex.MigrationSource<string> {
  constructor(private readonly directory: string) {}

  async getMigrations(): Promise<string[]> {
    const files = await readdir(this.directory);
    return files.filter((f) => /^\d{14}_[a-z0-9-]+\.(ts|js)$/.test(f) && !f.endsWith('.d.ts')).sort();
  }

  getMigrationName(file: string): string {
    return basename(file, extname(file));
  }

  async getMigration(file: string): Promise<Knex.Migration> {
    return import(pathToFileURL(join(this.directory, file)).href);
  }
}

/** The migrations folder next to this build of the server (source tree or dist/). */
export function migrationsDirectory(): string {
  return join(dirname(fileURLToPath(import.meta.url)), '..', '..', 'migrations');
}
