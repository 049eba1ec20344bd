/**
 * supervise.sh, the restart loop `npm start` runs the server under: a dead child is started
 * again with a doubling pause that resets after a long run, the log says why it stopped, and
 * TERM/INT to the supervisor stop the child without a restart. The child here is a small bash
 * stand-in that appends its process id to a file and then exits or sleeps as told by its
 * run number. The pauses are a few hundred milliseconds (environment settings); the checks
 * read the logged plan and the process table, never the clock.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';

const SCRIPT = join(import.meta.dirname, 'supervise.sh');

interface Running {
  proc: ChildProcess;
  log: () => string;
  pids: () => number[];
  exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
}

const dirs: string[] = [];
const procs: ChildProcess[] = [];
afterEach(() => {
  for (const p of procs.splice(0)) if (p.exitCode === null && p.signalCode === null) p.kill('SIGKILL');
  for (const d of dirs.splice(0)) rmSync(d, { recursive: true, force: true });
});

/**
 * Starts supervise.sh on a bash child whose behaviour per run is `script` (it sees its run number
 * as $n). Pauses: 100 ms first, 400 ms at most, a run of 1 s resets them.
 */
function supervise(script: string): Running {
  const dir = mkdtempSync(join(tmpdir(), 'lagbook-supervise-'));
  dirs.push(dir);
  const pidFile = join(dir, 'pids');
  const child = `echo $$ >> "${pidFile}"; n=$(wc -l < "${pidFile}"); ${script}`;
  const proc = spawn('bash', [SCRIPT, 'bash', '-c', child], {
    env: { ...process.env, LAGBOOK_RESTART_DELAY_MS: '100', LAGBOOK_RESTART_DELAY_MAX_MS: '400', LAGBOOK_RESTART_STABLE_MS: '1000' },
    stdio: ['ignore', 'ignore', 'pipe'],
  });
  procs.push(proc);
  let stderr = '';
  proc.stderr!.on('data', (b: Buffer) => (stderr += b.toString('utf8')));
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) =>
    proc.once('exit', (code, signal) => resolve({ code, signal })),
  );
  return {
    proc,
    log: () => stderr,
    pids: () => (existsSync(pidFile) ? readFileSync(pidFile, 'utf8').trim().split('\n').filter(Boolean).map(Number) : []),
    exited,
  };
}

/** Polls until `check` holds (fails the test after 10 s with `what`). */
async function until(what: string, check: () => boolean): Promise<void> {
  for (const give = Date.now() + 10_000; !check();) {
    if (Date.now() > give) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 20));
  }
}

const alive = (pid: number) => {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
};

const restartLines = (log: string) => log.split('\n').filter((l) => l.includes('restarting in'));

describe('supervise.sh', () => {
  it('starts a killed child again and says it was killed by a signal', async () => {
    const s = supervise('exec sleep 60');
    await until('the first run', () => s.pids().length === 1);
    const [first] = s.pids();
    process.kill(first, 'SIGKILL');
    await until('the second run', () => s.pids().length === 2);
    expect(s.pids()[1]).not.toBe(first);
    expect(alive(s.pids()[1])).toBe(true);
    expect(restartLines(s.log())).toEqual([
      expect.stringMatching(/^lagbook: the server was killed by signal KILL after [\d.]+ s; restarting in 0\.1 s \(restart 1;/),
    ]);
    s.proc.kill('SIGTERM');
    await s.exited;
  });

  it('doubles the pause after each quick failure up to the cap, and resets it after a long run', async () => {
    // runs 1–4 exit at once with code 3; run 5 lasts 1.3 s (longer than the 1 s reset) then exits 4; run 6 stays up
    const s = supervise('[ $n -le 4 ] && exit 3; [ $n -eq 5 ] && { sleep 1.3; exit 4; }; exec sleep 60');
    await until('the sixth run', () => s.pids().length === 6);
    const lines = restartLines(s.log());
    expect(lines.map((l) => /exited with code (\d+)/.exec(l)?.[1])).toEqual(['3', '3', '3', '3', '4']);
    expect(lines.map((l) => /restarting in ([\d.]+ s)/.exec(l)?.[1])).toEqual(['0.1 s', '0.2 s', '0.4 s', '0.4 s', '0.1 s']);
    s.proc.kill('SIGTERM');
    await s.exited;
  });

  it.each(['SIGTERM', 'SIGINT'] as const)('%s to the supervisor stops the child and does not start it again', async (signal) => {
    const s = supervise('exec sleep 60');
    await until('the first run', () => s.pids().length === 1);
    const [child] = s.pids();
    s.proc.kill(signal);
    expect(await s.exited).toEqual({ code: 0, signal: null });
    expect(alive(child)).toBe(false);
    expect(s.log()).toContain('supervisor stopped; the server was asked to stop and has ended.');
    // Several times the longest pause: a restart would have appended a second process id by now.
    await new Promise((r) => setTimeout(r, 1200));
    expect(s.pids()).toEqual([child]);
    expect(restartLines(s.log())).toEqual([]);
  });

  it('stops during a pause without starting the child again', async () => {
    const s = supervise('exit 5');
    await until('the first restart pause', () => restartLines(s.log()).length === 1);
    s.proc.kill('SIGTERM');
    expect(await s.exited).toEqual({ code: 0, signal: null });
    const runs = s.pids().length;
    await new Promise((r) => setTimeout(r, 1200));
    expect(s.pids()).toHaveLength(runs);
    expect(s.log()).toContain('supervisor stopped before restarting the server.');
  });

  it('refuses pauses that are not whole milliseconds', async () => {
    const proc = spawn('bash', [SCRIPT, 'true'], { env: { ...process.env, LAGBOOK_RESTART_DELAY_MS: '0.5' }, stdio: ['ignore', 'ignore', 'pipe'] });
    procs.push(proc);
    let stderr = '';
    proc.stderr!.on('data', (b: Buffer) => (stderr += b.toString('utf8')));
    const code = await new Promise((r) => proc.once('exit', r));
    expect(code).toBe(2);
    expect(stderr).toBe("supervise.sh: the restart pauses must be whole milliseconds (got '0.5')\n");
  });
});
