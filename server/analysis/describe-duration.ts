/**
 * A duration in words for the diagnostics sentences: the largest unit that divides it (d, h,
 * min, s); between two hours and two days, hours with one decimal (385 min → 6.4 h); otherwise
 * the largest unit with two decimals. Common practice for readable durations. Cost: O(1).
 */
export function describeDuration(ms: number): string {
  const units: Array<[number, string]> = [
    [86_400_000, 'd'],
    [3_600_000, 'h'],
    [60_000, 'min'],
    [1000, 's'],
  ];
  // beyond two hours a delay reads better in hours (385 min → 6.4 h)
  if (ms >= 2 * 3_600_000 && ms < 2 * 86_400_000 && ms % 3_600_000 !== 0) return `${(ms / 3_600_000).toFixed(1)} h`;
  for (const [size, name] of units) if (ms >= size && ms % size === 0) return `${ms / size} ${name}`;
  for (const [size, name] of units) if (ms >= size) return `${(ms / size).toFixed(2)} ${name}`;
  return `${ms} ms`;
}
