import { formatCount, usedShare } from './billing-format.ts';

/** One usage line: label, "used of allowed", and a bar that turns amber from 80% and red at the limit. */
export function UsageBar({ label, used, allowed, note }: { label: string; used: number; allowed: number; note?: string }) {
  const share = usedShare(used, allowed);
  const colour = share >= 100 ? 'bg-alert' : share >= 80 ? 'bg-amber' : 'bg-lichen';
  return (
    <div className="grid gap-1">
      <div className="flex items-baseline justify-between gap-4 text-sm">
        <span className="font-medium">{label}</span>
        <span className="tabular-nums text-ink-soft">
          {formatCount(used)} of {formatCount(allowed)} ({share}%)
        </span>
      </div>
      <div
        role="meter"
        aria-label={label}
        aria-valuemin={0}
        aria-valuemax={allowed}
        aria-valuenow={used}
        className="h-2.5 overflow-hidden rounded-full bg-rule/60"
      >
        <div className={`h-full ${colour}`} style={{ width: `${share}%` }} />
      </div>
      {note && <p className="text-xs text-ink-soft">{note}</p>}
    </div>
  );
}
