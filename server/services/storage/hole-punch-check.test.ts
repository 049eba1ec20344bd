import { execFileSync } from 'node:child_process';
import { tmpdir } from 'node:os';
import { describe, expect, it } from 'vitest';
import { checkHolePunching, logHolePunchFinding, probeHolePunching, type HolePunchFinding } from './hole-punch-check.ts';

/**
 * The start-up hole-punching check. The probe runs for real on the system's temp folder; what it
 * must find there comes from the filesystem type `stat -f` reports and what is common practice
 * about Linux filesystems (ext4 — reported as "ext2/ext3" —, XFS, Btrfs and tmpfs punch holes;
 * FAT does not). The decisions around the probe are checked with stand-in probes.
 */
const PUNCHING = new Set(['ext2/ext3', 'xfs', 'btrfs', 'tmpfs']);
const NOT_PUNCHING = new Set(['msdos', 'vfat']);

function collect() {
  const lines: Array<{ level: string; msg: string; fields?: Record<string, unknown> }> = [];
  const logger = {
    info: (msg: string, fields?: Record<string, unknown>) => void lines.push({ level: 'info', msg, fields }),
    warn: (msg: string, fields?: Record<string, unknown>) => void lines.push({ level: 'warn', msg, fields }),
    error: (msg: string, fields?: Record<string, unknown>) => void lines.push({ level: 'error', msg, fields }),
  };
  return { lines, logger };
}

describe('hole punching check', () => {
  it('the probe finds what the temp folder filesystem is known to do', async () => {
    const fsType = execFileSync('stat', ['-f', '-c', '%T', tmpdir()], { encoding: 'utf8' }).trim();
    const result = await probeHolePunching(tmpdir());
    if (PUNCHING.has(fsType)) expect(result.punched, `${fsType}: ${result.reason}`).toBe(true);
    else if (NOT_PUNCHING.has(fsType)) expect(result.punched).toBe(false);
    else expect(typeof result.punched).toBe('boolean'); // a filesystem this test has no fact about
  });

  it('reports "not checked" for a database on another machine or a data directory not visible here', async () => {
    const probe = async () => ({ punched: true, reason: '' });
    expect(await checkHolePunching({ facts: { dataDir: tmpdir(), serverCanPunch: true }, databaseIsLocal: false, probe })).toEqual({
      kind: 'not-checked',
      reason: 'the database runs on another machine',
    });
    const hidden = await checkHolePunching({ facts: { dataDir: '/nonexistent/mariadb/data/', serverCanPunch: true }, databaseIsLocal: true, probe });
    expect(hidden.kind).toBe('not-checked');
  });

  it('a server built without hole punching, or a filesystem that keeps its blocks, gives one clear warning', async () => {
    const off = await checkHolePunching({ facts: { dataDir: tmpdir(), serverCanPunch: false }, databaseIsLocal: true });
    expect(off).toMatchObject({ kind: 'no-holes', reason: 'the database server reports Innodb_have_punch_hole = OFF' });
    const kept = await checkHolePunching({
      facts: { dataDir: tmpdir(), serverCanPunch: true },
      databaseIsLocal: true,
      probe: async () => ({ punched: false, reason: 'the file kept its blocks after the hole was punched' }),
    });
    expect(kept.kind).toBe('no-holes');
    const { lines, logger } = collect();
    logHolePunchFinding(logger, kept);
    expect(lines).toHaveLength(1);
    expect(lines[0].level).toBe('warn');
    expect(lines[0].msg).toContain('page compression saves no disk space on this filesystem');
  });

  it('a filesystem that punches holes is logged as information only', async () => {
    const found: HolePunchFinding = await checkHolePunching({
      facts: { dataDir: tmpdir(), serverCanPunch: true },
      databaseIsLocal: true,
      probe: async () => ({ punched: true, reason: '' }),
    });
    expect(found.kind).toBe('punches-holes');
    const { lines, logger } = collect();
    logHolePunchFinding(logger, found);
    expect(lines.map((l) => l.level)).toEqual(['info']);
  });
});
