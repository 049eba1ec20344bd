import { describe, expect, it } from 'vitest';
import { LagbookMigrationSource, migrationsDirectory } from './migration-source.ts';

describe('migration source', () => {
  it('lists the migrations in order, named without their extension so .ts and .js runs agree', async () => {
    const source = new LagbookMigrationSource(migrationsDirectory());
    const files = await source.getMigrations();
    expect(files.length).toBeGreaterThan(0);
    expect([...files].sort()).toEqual(files);
    for (const f of files) expect(f).toMatch(/^\d{14}_[a-z0-9-]+\.(ts|js)$/);
    expect(source.getMigrationName('20261202000100_create-labs.ts')).toBe('20261202000100_create-labs');
    expect(source.getMigrationName('20261202000100_create-labs.js')).toBe('20261202000100_create-labs');
  });

  it('every migration exports up and down', async () => {
    const source = new LagbookMigrationSource(migrationsDirectory());
    for (const f of await source.getMigrations()) {
      const m = await source.getMigration(f);
      expect(typeof m.up, f).toBe('function');
      expect(typeof m.down, f).toBe('function');
    }
  });
});
