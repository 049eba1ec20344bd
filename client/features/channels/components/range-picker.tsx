import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/button.tsx';
import { fromZonedInput, toZonedInput } from '../../../components/zoned-time.ts';
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
    const f = fromZonedInput(from, timezone);
    const t = fromZonedInput(to, timezone);
    if (f === null || t === null) return setError('Both times are needed.');
    if (f >= t) return setError('“To” must be after “From”.');
    setError(null);
    onChange({ from: f, to: t }, null);
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
        <label className="grid">
          <span>From ({timezone})</span>
          <input
            type="datetime-local"
            value={from}
            onChange={(e) => setFrom(e.target.value)}
            className="rounded-lg border border-rule bg-card px-2 py-1 font-mono"
          />
        </label>
        <label className="grid">
          <span>To ({timezone})</span>
          <input
            type="datetime-local"
            value={to}
            onChange={(e) => setTo(e.target.value)}
            className="rounded-lg border border-rule bg-card px-2 py-1 font-mono"
          />
        </label>
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
