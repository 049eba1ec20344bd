import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import semver from 'semver';
import { describe, expect, it } from 'vitest';

/**
 * The installed production packages (package-lock.json, entries not marked dev) checked against
 * the high and critical advisories of dependency-advisories.json — what a hand review of the
 * OSV / GitHub Advisory records found while `npm audit` could not reach its endpoint from the
 * build machine (tests/unit/dependency-advisories.md). It keeps a fixed version from sliding back, e.g. an
 * override being dropped; it is no substitute for `npm audit` where that runs.
 */
interface Advisory {
  package: string;
  id: string;
  severity: 'high' | 'critical';
  affected: string;
  source: string;
}

interface Installed {
  name: string;
  version: string;
  path: string;
}

const ROOT = join(import.meta.dirname, '..', '..');
const { advisories } = JSON.parse(readFileSync(join(import.meta.dirname, 'dependency-advisories.json'), 'utf8')) as { advisories: Advisory[] };

/** Every production package version in the lockfile (lockfileVersion 2 or 3 "packages" map). */
function installedProductionPackages(): Installed[] {
  const lock = JSON.parse(readFileSync(join(ROOT, 'package-lock.json'), 'utf8')) as { packages: Record<string, { version?: string; dev?: boolean }> };
  return Object.entries(lock.packages)
    .filter(([path, entry]) => path.includes('node_modules/') && !entry.dev && entry.version)
    .map(([path, entry]) => ({ name: path.slice(path.lastIndexOf('node_modules/') + 'node_modules/'.length), version: entry.version!, path }));
}

/** The installed packages that fall inside an advisory's affected range, described one per line. */
function affectedBy(installed: Installed[], list: Advisory[]): string[] {
  return installed.flatMap((p) =>
    list
      .filter((a) => a.package === p.name && semver.satisfies(p.version, a.affected, { includePrerelease: true }))
      .map((a) => `${p.path}@${p.version}: ${a.id} (${a.severity}, affected ${a.affected}; ${a.source})`),
  );
}

describe('production dependencies against known advisories', () => {
  it('every advisory entry is complete and its range is a valid semver range', () => {
    expect(advisories.length).toBeGreaterThan(0);
    for (const a of advisories) {
      expect(semver.validRange(a.affected), `${a.id}: ${a.affected}`).not.toBeNull();
      expect(['high', 'critical']).toContain(a.severity);
      expect(a.source).toMatch(/^https:\/\//);
    }
  });

  it('flags a version inside a range (the nodemailer 10.3.1 that mailparser pins without our override)', () => {
    const flagged = affectedBy([{ name: 'nodemailer', version: '10.3.1', path: 'node_modules/mailparser/node_modules/nodemailer' }], advisories);
    expect(flagged.join('\n')).toContain('GHSA-3q53-mvfw-q9v8');
    expect(affectedBy([{ name: 'nodemailer', version: '10.4.1', path: 'node_modules/nodemailer' }], advisories)).toEqual([]);
  });

  it('no installed production package is inside a listed high or critical range', () => {
    const installed = installedProductionPackages();
    expect(installed.length).toBeGreaterThan(100);
    expect(installed.some((p) => p.name === 'nodemailer')).toBe(true);
    expect(affectedBy(installed, advisories)).toEqual([]);
  });
});
