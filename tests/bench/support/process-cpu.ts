import { readFileSync } from 'node:fs';

/** Clock ticks per second of /proc/<pid>/stat on Linux (USER_HZ; 100 on every mainstream kernel). */
const TICKS_PER_SECOND = 100;

/**
 * CPU time (user + system, seconds) a process has used so far, all threads included, read from
 * /proc/<pid>/stat (fields 14 and 15, see proc(5)). Differences of two readings tell how much CPU
 * a phase of a benchmark cost each process — steadier than wall time on a shared machine.
 */
export function processCpuSeconds(pid: number): number {
  const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
  // the command name (field 2) may hold spaces; the fields after its closing parenthesis are fixed
  const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
  return (Number(fields[11]) + Number(fields[12])) / TICKS_PER_SECOND;
}
