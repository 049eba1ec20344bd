/**
 * Shared timing helpers for the `npm run bench:*` scripts.
 *
 * Benchmarks report; they never assert. Each figure is the median of several runs after a
 * warm-up, so one slow run (GC, the other core busy) does not decide the result.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';

export interface TimingOptions {
  /** Timed runs (the median is reported). */
  runs?: number;
  /** Untimed runs first, so the JIT has compiled the hot loops. */
  warmup?: number;
}

/** Median wall time in seconds of `fn()` over `runs` runs after `warmup` untimed runs. */
export function timeMedian(fn: () => unknown, { runs = 5, warmup = 2 }: TimingOptions = {}): number {
  for (let i = 0; i < warmup; i++) fn();
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const start = performance.now();
    fn();
    times.push((performance.now() - start) / 1000);
  }
  return median(times);
}

/** Median of a list of numbers (the list is copied, not sorted in place). */
export function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

/** True when `command` is on PATH. */
export function hasCommand(command: string): boolean {
  return spawnSync('sh', ['-c', `command -v ${command}`], { stdio: 'ignore' }).status === 0;
}

/** Debian's python3 carries python3-statsmodels; a pyenv shim earlier on PATH may not. */
export const DEBIAN_PYTHON = '/usr/bin/python3';

export type ReferenceTool = 'R' | 'statsmodels';

/** Whether a reference tool is installed, with the Debian package that provides it. */
export function referenceAvailable(tool: ReferenceTool): { ok: boolean; hint: string } {
  if (tool === 'R') return { ok: hasCommand('Rscript'), hint: 'apt-get install r-base-core' };
  const ok = spawnSync(DEBIAN_PYTHON, ['-c', 'import statsmodels'], { stdio: 'ignore' }).status === 0;
  return { ok, hint: 'apt-get install python3-statsmodels' };
}

/**
 * Runs a reference script (R or Python) and returns the number it prints on its last line,
 * which by convention is the median run time in seconds. Returns null when the tool is missing.
 */
export function timeReference(tool: ReferenceTool, script: string): number | null {
  if (!referenceAvailable(tool).ok) return null;
  const dir = mkdtempSync(join(tmpdir(), 'lagbook-bench-'));
  try {
    const file = join(dir, tool === 'R' ? 'bench.R' : 'bench.py');
    writeFileSync(file, script);
    const out =
      tool === 'R'
        ? execFileSync('Rscript', ['--vanilla', file], { encoding: 'utf8', maxBuffer: 1 << 26 })
        : execFileSync(DEBIAN_PYTHON, [file], { encoding: 'utf8', maxBuffer: 1 << 26 });
    const last = out.trim().split('\n').pop() ?? '';
    const seconds = Number(last);
    if (!Number.isFinite(seconds)) throw new Error(`reference script printed no time: ${last}`);
    return seconds;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

export interface ReferenceTiming {
  name: string;
  seconds: number | null;
  /** Why there is no figure (tool missing), shown instead of a ratio. */
  missing?: string;
}

/**
 * Prints one benchmark line: our time, each reference's time and the ratio ours / fastest
 * reference (≤ 1.0 means Lagbook is at least as fast).
 */
export function printRatioLine(label: string, oursSeconds: number, refs: ReferenceTiming[]): void {
  const fmt = (s: number) => `${(s * 1000).toFixed(1)} ms`;
  const available = refs.filter((r) => r.seconds !== null) as { name: string; seconds: number }[];
  const parts = refs.map((r) => (r.seconds === null ? `${r.name}: not run (${r.missing ?? 'missing'})` : `${r.name} ${fmt(r.seconds)}`));
  let ratio = 'ratio: n/a';
  if (available.length) {
    const fastest = available.reduce((a, b) => (a.seconds <= b.seconds ? a : b));
    ratio = `ratio vs ${fastest.name}: ${(oursSeconds / fastest.seconds).toFixed(2)}`;
  }
  console.log(`${label.padEnd(44)} lagbook ${fmt(oursSeconds).padStart(10)} | ${parts.join(' | ')} | ${ratio}`);
}
