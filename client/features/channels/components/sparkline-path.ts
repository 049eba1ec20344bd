/**
 * The SVG path of a sparkline over `values` in a `width` × `height` box: one `M … L …` run per
 * stretch of consecutive numbers, so a `null` (no reading that hour) leaves a gap instead of a
 * bridge. Values are scaled to the box between their own minimum and maximum (a flat series
 * sits at mid-height). `dots` lists lone values (no neighbour on either side), which a path
 * cannot show as a line. O(n).
 */
export function sparklinePath(values: ReadonlyArray<number | null>, width: number, height: number, pad = 1.5): { d: string; dots: Array<[number, number]> } {
  const present = values.filter((v): v is number => v !== null && Number.isFinite(v));
  if (present.length === 0) return { d: '', dots: [] };
  const lo = Math.min(...present);
  const hi = Math.max(...present);
  const dx = values.length > 1 ? (width - 2 * pad) / (values.length - 1) : 0;
  const y = (v: number) => (hi === lo ? height / 2 : pad + (height - 2 * pad) * (1 - (v - lo) / (hi - lo)));
  const r = (n: number) => Math.round(n * 100) / 100;
  let d = '';
  const dots: Array<[number, number]> = [];
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (v === null || !Number.isFinite(v)) continue;
    const point = `${r(pad + i * dx)} ${r(y(v))}`;
    const prevMissing = i === 0 || values[i - 1] === null;
    const nextMissing = i === values.length - 1 || values[i + 1] === null;
    if (prevMissing && nextMissing) dots.push([r(pad + i * dx), r(y(v))]);
    else d += `${prevMissing ? (d ? ' M' : 'M') : ' L'}${point}`;
  }
  return { d, dots };
}
