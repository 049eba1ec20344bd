/**
 * A whole number of seconds as people say it: "45 s", "10 min", "1 h 30 min", "2 d". Keeps
 * every non-zero part down to seconds, so nothing is rounded away.
 */
export function formatInterval(seconds: number): string {
  if (!Number.isFinite(seconds) || seconds <= 0) return '—';
  const parts: string[] = [];
  let rest = Math.round(seconds);
  for (const [unit, size] of [
    ['d', 86400],
    ['h', 3600],
    ['min', 60],
    ['s', 1],
  ] as const) {
    const n = Math.floor(rest / size);
    if (n > 0) parts.push(`${n} ${unit}`);
    rest -= n * size;
  }
  return parts.join(' ');
}
