import { Button } from '../../../components/button.tsx';

/** An indeterminate progress bar with the elapsed time and a Cancel button, for a running analysis. */
export function RunProgress({ what, elapsed, onCancel }: { what: string; elapsed: number | null; onCancel: () => void }) {
  return (
    <div role="status" className="flex flex-wrap items-center gap-3 rounded-lg border border-rule bg-paper p-3 text-sm">
      <progress aria-label={what} className="h-2 w-40 accent-lichen" />
      <span>
        {what} · <span className="font-mono">{elapsed ?? 0} s</span>
      </span>
      <Button size="sm" tone="danger" onClick={onCancel}>
        Cancel
      </Button>
    </div>
  );
}
