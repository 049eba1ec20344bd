import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/button.tsx';
import type { QuarantinedRow, ResubmitRow } from '@shared/contract/quarantine.ts';
import { readingName } from '../messages.ts';

const LOCAL_TIME = /^\d{4}-\d{2}-\d{2}[T ]\d{2}:\d{2}(:\d{2}([.,]\d+)?)?$/;

/** The row as the fix form starts: its fields as they arrived, empty where one was missing. */
export function asResubmitRow(row: QuarantinedRow): ResubmitRow {
  return { id: row.id, channel: row.channel ?? '', ts: row.ts ?? '', value: row.value ?? '' };
}

/**
 * "Fix" for one quarantined row: its channel, time and value as editable text, then
 * "Re-submit". Re-submitted rows are read like live readings, so a time without a UTC offset
 * is refused again: the form says so before it is sent.
 */
export function FixRowForm({
  row,
  pending,
  onResubmit,
  onCancel,
}: {
  row: QuarantinedRow;
  pending: boolean;
  onResubmit: (fixed: ResubmitRow) => void;
  onCancel: () => void;
}) {
  const [draft, setDraft] = useState(() => asResubmitRow(row));
  const ts = String(draft.ts).trim();
  function submit(e: FormEvent) {
    e.preventDefault();
    onResubmit({ id: row.id, channel: draft.channel.trim(), ts, value: String(draft.value).trim() });
  }
  const box = 'mt-0.5 block w-full rounded-md border border-rule bg-card px-2 py-1 font-mono text-xs';
  return (
    <form onSubmit={submit} aria-label={`Fix ${readingName(row)}`} className="grid min-w-56 gap-2">
      <label className="text-xs font-medium">
        Channel
        <input className={box} value={draft.channel} onChange={(e) => setDraft({ ...draft, channel: e.target.value })} />
      </label>
      <label className="text-xs font-medium">
        Time
        <input className={box} value={String(draft.ts)} onChange={(e) => setDraft({ ...draft, ts: e.target.value })} />
      </label>
      {LOCAL_TIME.test(ts) && <p className="text-xs text-alert">No UTC offset: add Z or ±hh:mm, or it is quarantined again.</p>}
      <label className="text-xs font-medium">
        Value
        <input className={box} inputMode="decimal" value={String(draft.value)} onChange={(e) => setDraft({ ...draft, value: e.target.value })} />
      </label>
      <div className="flex gap-2">
        <Button type="submit" size="sm" tone="primary" disabled={pending}>
          Re-submit
        </Button>
        <Button size="sm" tone="quiet" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
