import { execFile } from 'node:child_process';
import { closeSync, constants, fsyncSync, openSync, statSync, writeSync } from 'node:fs';
import { access, rm, stat } from 'node:fs/promises';
import { randomUUID } from 'node:crypto';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import type { LogWriter } from '../../log-writer.ts';

const run = promisify(execFile);

/** What the start-up check found about the database's data directory. */
export type HolePunchFinding =
  | { kind: 'punches-holes'; dataDir: string; filesystem: string }
  | { kind: 'no-holes'; dataDir: string; filesystem: string; reason: string }
  | { kind: 'not-checked'; reason: string };

/** What the database server says about itself (read through the app's connection). */
export interface DataDirFacts {
  dataDir: string;
  /** `Innodb_have_punch_hole`: the server was built able to punch holes. */
  serverCanPunch: boolean;
}

/** Bytes written by the probe, and the hole punched into it (both multiples of 4 KiB). */
const PROBE_BYTES = 1024 * 1024;
const HOLE = { offset: 64 * 1024, length: 512 * 1024 };

/**
 * Punches a hole into a fresh temp file in `dir` (removed after) with util-linux `fallocate --punch-hole` and
 * reports whether the file's allocated blocks went down (`stat` block counts), which is exactly
 * what InnoDB page compression relies on to save disk space: a compressed page is written in full
 * and the unused tail of it is punched out. Throws when `dir` is not writable or `fallocate` is
 * missing (the caller reports "not checked").
 */
export async function probeHolePunching(dir: string): Promise<{ punched: boolean; reason: string }> {
  // A plain file, never a folder: the server would list a folder in its data directory as a database.
  const file = join(dir, `.lagbook-hole-check-${randomUUID()}`);
  try {
    const fd = openSync(file, 'wx');
    try {
      const block = Buffer.alloc(64 * 1024, 0x5a);
      for (let written = 0; written < PROBE_BYTES; written += block.length) writeSync(fd, block);
      fsyncSync(fd);
    } finally {
      closeSync(fd);
    }
    const before = statSync(file).blocks;
    try {
      await run('fallocate', ['--punch-hole', '--keep-size', '--offset', String(HOLE.offset), '--length', String(HOLE.length), file]);
    } catch (err) {
      const e = err as { code?: string; stderr?: string };
      if (e.code === 'ENOENT') throw new Error('util-linux fallocate is not installed', { cause: err });
      return { punched: false, reason: (e.stderr ?? String(err)).trim() || 'fallocate --punch-hole failed' };
    }
    const after = statSync(file).blocks;
    // st_blocks counts 512-byte units; the hole is 1,024 of them
    const freed = (before - after) * 512;
    return freed >= HOLE.length / 2
      ? { punched: true, reason: `${freed} bytes freed` }
      : { punched: false, reason: 'the file kept its blocks after the hole was punched' };
  } finally {
    await rm(file, { force: true });
  }
}

/** The filesystem type of a path (`stat -f`), or 'unknown'. */
async function filesystemOf(path: string): Promise<string> {
  try {
    return (await run('stat', ['-f', '-c', '%T', path])).stdout.trim() || 'unknown';
  } catch {
    return 'unknown';
  }
}

/**
 * Where to probe: the data directory itself when the app may write there, else the system's
 * temp folder when it lies on the same filesystem (same device), else nowhere.
 */
async function probeFolder(dataDir: string): Promise<string | null> {
  try {
    await access(dataDir, constants.W_OK);
    return dataDir;
  } catch {
    try {
      const [data, tmp] = await Promise.all([stat(dataDir), stat(tmpdir())]);
      return data.dev === tmp.dev ? tmpdir() : null;
    } catch {
      return null;
    }
  }
}

/**
 * Checks at start that page compression can save disk space where the database keeps its files
 * (issue #20 item 2). Only possible when the database runs on this machine (a socket, 127.0.0.1 or
 * localhost) and its data directory is visible here; otherwise it reports "not checked".
 */
export async function checkHolePunching(deps: { facts: DataDirFacts; databaseIsLocal: boolean; probe?: typeof probeHolePunching }): Promise<HolePunchFinding> {
  const probe = deps.probe ?? probeHolePunching;
  const { dataDir, serverCanPunch } = deps.facts;
  if (!deps.databaseIsLocal) return { kind: 'not-checked', reason: 'the database runs on another machine' };
  try {
    await stat(dataDir);
  } catch {
    return { kind: 'not-checked', reason: `the data directory ${dataDir} is not visible from this process` };
  }
  const filesystem = await filesystemOf(dataDir);
  if (!serverCanPunch) return { kind: 'no-holes', dataDir, filesystem, reason: 'the database server reports Innodb_have_punch_hole = OFF' };
  const folder = deps.probe ? dataDir : await probeFolder(dataDir);
  if (folder === null) return { kind: 'not-checked', reason: `no folder on the data directory's filesystem is writable by this process (${dataDir})` };
  try {
    const result = await probe(folder);
    return result.punched ? { kind: 'punches-holes', dataDir, filesystem } : { kind: 'no-holes', dataDir, filesystem, reason: result.reason };
  } catch (err) {
    return { kind: 'not-checked', reason: (err as Error).message };
  }
}

/** One log line for the finding: info when holes are punched, a clear warning when not. */
export function logHolePunchFinding(logger: LogWriter, finding: HolePunchFinding): void {
  if (finding.kind === 'punches-holes') {
    logger.info('storage: the database filesystem punches holes; page compression saves disk space', {
      dataDir: finding.dataDir,
      filesystem: finding.filesystem,
    });
  } else if (finding.kind === 'no-holes') {
    logger.warn(
      'storage: page compression saves no disk space on this filesystem: it does not punch holes in files, so readings take several times the room they would; move the MariaDB data directory to a filesystem that supports hole punching (ext4, XFS)',
      { dataDir: finding.dataDir, filesystem: finding.filesystem, reason: finding.reason },
    );
  } else {
    logger.info('storage: hole punching not checked', { reason: finding.reason });
  }
}
