import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/button.tsx';
import { toZonedInput } from '../../../components/clock/format.ts';
import { DateTimeInput } from '../../../components/date-time-input.tsx';
import { readDateTime } from '../../../components/date-time-input-read.ts';
import type { TimeRange } from '@shared/contract/channels.ts';
import { presetRange, RANGE_PRESETS, type RangePreset } from './range-presets.ts';

/**
 * Range presets (each ending now) as a group of toggle buttons, and a custom from/to typed on
 * the logger's clock (`timezone`).
 */
export function RangePicker({
  range,
  preset,
  timezone,
  onChange,
}: {
  range: TimeRange;
  preset: RangePreset | null;
  timezone: string;
  onChange: (range: TimeRange, preset: RangePreset | null) => void;
}) {
  const [from, setFrom] = useState(() => toZonedInput(range.from, timezone));
  const [to, setTo] = useState(() => toZonedInput(range.to, timezone));
  const [error, setError] = useState<string | null>(null);
  const [shownRange, setShownRange] = useState(range);
  if (shownRange.from !== range.from || shownRange.to !== range.to) {
    // the range changed from outside (a preset or a zoom): show it in the inputs
    setShownRange(range);
    setFrom(toZonedInput(range.from, timezone));
    setTo(toZonedInput(range.to, timezone));
  }

  function applyCustom(e: FormEvent) {
    e.preventDefault();
    const f = readDateTime(from, timezone);
    const t = readDateTime(to, timezone);
    if (!f.ok) return setError(`From: ${f.problem}`);
    if (!t.ok) return setError(`To: ${t.problem}`);
    if (f.ms >= t.ms) return setError('“To” must be after “From”.');
    setError(null);
    onChange({ from: f.ms, to: t.ms }, null);
  }

  return (
    <div className="flex flex-wrap items-end gap-4">
      <div role="group" aria-label="Range" className="flex flex-wrap gap-1">
        {RANGE_PRESETS.map((p) => (
          <Button
            key={p.id}
            size="sm"
            tone={preset === p.id ? 'primary' : 'secondary'}
            aria-pressed={preset === p.id}
            onClick={() => onChange(presetRange(p.id, Date.now()), p.id)}
          >
            {p.label}
          </Button>
        ))}
      </div>
      <form aria-label="Custom range" onSubmit={applyCustom} className="flex flex-wrap items-end gap-2 text-sm">
        <DateTimeInput label="From" value={from} onChange={setFrom} timeZone={timezone} />
        <DateTimeInput label="To" value={to} onChange={setTo} timeZone={timezone} />
        <Button size="sm" type="submit">
          Show range
        </Button>
        {error && (
          <p role="alert" className="text-alert">
            {error}
          </p>
        )}
      </form>
    </div>
  );
}
