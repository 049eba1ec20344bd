/** A statistic for display: 4 significant digits, without trailing noise; an en dash for missing. */
export function fmtStat(v: number | null | undefined, digits = 4): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '—';
  return Number(v.toPrecision(digits)).toString();
}

/** A p-value for display: below 0.0001 written as "< 0.0001" (common practice in statistical tables). */
export function fmtP(p: number): string {
  return p < 1e-4 ? '< 0.0001' : p.toFixed(4);
}

/** A length of time in seconds as the two largest whole units: "1 d", "7 h 45 min", "90 s". */
export function fmtSeconds(s: number): string {
  const units: Array<[string, number]> = [
    ['d', 86_400],
    ['h', 3600],
    ['min', 60],
    ['s', 1],
  ];
  const parts: string[] = [];
  let rest = Math.round(Math.abs(s));
  for (const [name, size] of units) {
    if (rest >= size && parts.length < 2) {
      parts.push(`${Math.floor(rest / size)} ${name}`);
      rest %= size;
    } else if (parts.length > 0) break;
  }
  return parts.length ? parts.join(' ') : '0 s';
}
