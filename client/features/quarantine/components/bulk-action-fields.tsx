import { TIME_LAYOUT_LABELS, type UploadTimeFormat } from '@shared/contract/uploads.ts';
import type { BulkActionKind } from '@shared/contract/quarantine.ts';
import { SelectField, TextField } from '../../../components/form-field.tsx';
import { timeZoneChoices } from '../../../components/time-zone-select.tsx';
import type { BulkActionDraft } from '../hooks/bulk-action-draft.ts';

/** The repairs, in plain words, in the order the form offers them. */
export const BULK_ACTION_LABELS: Record<BulkActionKind, string> = {
  reread: 'Read the times again with another layout or zone',
  shift: 'Move the times by a fixed amount (a logger clock that was off)',
  'map-channel': 'Store them under a channel of their logger',
  discard: 'Discard them, saying why',
};

const TIME_FORMAT_LABELS: Record<UploadTimeFormat, string> = {
  auto: 'ISO 8601 with an offset, or epoch milliseconds (as loggers send them)',
  ...TIME_LAYOUT_LABELS,
  pattern: 'A pattern of my own…',
};

/**
 * The fields of the chosen repair: the layout (or pattern) and zone to read the times with,
 * the signed shift in hours and minutes, the channel to store under (only when the list is
 * narrowed to one logger, since a channel belongs to one), or why rows are discarded.
 */
export function BulkActionFields({
  draft,
  onChange,
  channels,
}: {
  draft: BulkActionDraft;
  onChange: (next: BulkActionDraft) => void;
  /** The channels of the logger the list is filtered to; null when it shows every logger. */
  channels: Array<{ id: number; key: string; label: string }> | null;
}) {
  const set = (patch: Partial<BulkActionDraft>) => onChange({ ...draft, ...patch });
  return (
    <div className="grid gap-4 sm:grid-cols-2">
      <SelectField label="Repair" value={draft.kind} onChange={(e) => set({ kind: e.target.value as BulkActionKind })} className="sm:col-span-2">
        {(Object.keys(BULK_ACTION_LABELS) as BulkActionKind[]).map((k) => (
          <option key={k} value={k}>
            {BULK_ACTION_LABELS[k]}
          </option>
        ))}
      </SelectField>
      {draft.kind === 'reread' && (
        <>
          <SelectField label="Time layout" value={draft.timeFormat} onChange={(e) => set({ timeFormat: e.target.value as UploadTimeFormat })}>
            {(Object.keys(TIME_FORMAT_LABELS) as UploadTimeFormat[]).map((f) => (
              <option key={f} value={f}>
                {TIME_FORMAT_LABELS[f]}
              </option>
            ))}
          </SelectField>
          <SelectField
            label="Zone of the times"
            hint="For times written without a UTC offset."
            value={draft.timeZone}
            onChange={(e) => set({ timeZone: e.target.value })}
          >
            <option value="">Each logger’s own zone</option>
            {timeZoneChoices().map((zone) => (
              <option key={zone} value={zone}>
                {zone.replaceAll('_', ' ')}
              </option>
            ))}
          </SelectField>
          {draft.timeFormat === 'pattern' && (
            <TextField
              label="Pattern"
              hint="Unicode date symbols: dd day, MM month, yyyy year, HH hour (0–23), hh hour (1–12) with a for AM/PM, mm minutes, ss seconds."
              placeholder="dd.MM.yyyy HH:mm"
              value={draft.timePattern}
              onChange={(e) => set({ timePattern: e.target.value })}
            />
          )}
        </>
      )}
      {draft.kind === 'shift' && (
        <fieldset className="grid gap-3 sm:col-span-2 sm:grid-cols-3">
          <legend className="mb-1 text-sm font-medium">Move every time by</legend>
          <SelectField label="Direction" value={draft.sign} onChange={(e) => set({ sign: e.target.value as '+' | '-' })}>
            <option value="-">Earlier (the clock ran ahead)</option>
            <option value="+">Later (the clock ran behind)</option>
          </SelectField>
          <TextField label="Hours" inputMode="numeric" value={draft.hours} onChange={(e) => set({ hours: e.target.value })} />
          <TextField label="Minutes" inputMode="numeric" value={draft.minutes} onChange={(e) => set({ minutes: e.target.value })} />
        </fieldset>
      )}
      {draft.kind === 'map-channel' &&
        (channels ? (
          <SelectField label="Channel" value={draft.channelId} onChange={(e) => set({ channelId: e.target.value })}>
            <option value="">Choose a channel…</option>
            {channels.map((c) => (
              <option key={c.id} value={c.id}>
                {c.label} ({c.key})
              </option>
            ))}
          </SelectField>
        ) : (
          <p className="text-sm text-ink-soft sm:col-span-2">A channel belongs to one logger: choose the logger in the filter above first.</p>
        ))}
      {draft.kind === 'discard' && (
        <TextField
          label="Why"
          hint="Kept in the audit log with your name."
          placeholder="e.g. probe unplugged during the move"
          value={draft.reason}
          onChange={(e) => set({ reason: e.target.value })}
          className="sm:col-span-2"
        />
      )}
    </div>
  );
}
