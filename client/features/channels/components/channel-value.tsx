/** A reading with its unit, in monospace so columns of numbers line up; an en dash when there is none. */
export function ChannelValue({ value, unit }: { value: number | null | undefined; unit: string | null }) {
  if (value === null || value === undefined) return <span className="text-ink-soft">—</span>;
  return (
    <span className="whitespace-nowrap font-mono">
      {Number(value.toPrecision(6))}
      {unit ? <span className="text-ink-soft"> {unit}</span> : null}
    </span>
  );
}
