import { useState, type FormEvent } from 'react';
import type { Note, NoteKind } from '@shared/contract/notes.ts';
import { Button } from '../../../components/button.tsx';
import { SelectField, TextField } from '../../../components/form-field.tsx';
import { Notice } from '../../../components/notice.tsx';
import { fieldFromServerError } from '../../../components/server-field-error.ts';
import { toZonedInput } from '../../../components/clock/format.ts';
import { DateTimeInput } from '../../../components/date-time-input.tsx';
import { readDateTime } from '../../../components/date-time-input-read.ts';

/** What the note form hands back: a note's fields with the span as instants. */
export interface NoteFormValues {
  kindId: number;
  text: string;
  start: number;
  end: number;
  wholeLogger: boolean;
  excludeFromAnalysis: boolean;
}

// fields with a control of their own; a refusal naming another (channelId, loggerId) shows whole above the buttons
const FIELDS = ['kindId', 'text', 'start', 'end'] as const;

/**
 * Add or change a note: kind (the lab's kinds in use; a retired kind only when the note
 * already has it), text, start and end typed on the logger's clock (`timezone`), whether it is
 * on this channel or the whole logger (only when adding), and "leave out of analysis". The
 * server's `field: reason` answers land on the field they name.
 */
export function NoteForm({
  kinds,
  timezone,
  initial,
  defaultSpan,
  channelLabel,
  loggerName,
  submitLabel,
  pending,
  error,
  onSubmit,
  onCancel,
}: {
  kinds: readonly NoteKind[];
  timezone: string;
  /** The note being changed; absent when adding. */
  initial?: Note;
  /** The span a new note starts with. */
  defaultSpan: { from: number; to: number };
  channelLabel: string | null;
  loggerName: string;
  submitLabel: string;
  pending: boolean;
  error: Error | null;
  onSubmit: (values: NoteFormValues) => void;
  onCancel: () => void;
}) {
  const usable = kinds.filter((k) => !k.retired || k.id === initial?.kind.id);
  const [kindId, setKindId] = useState(String(initial?.kind.id ?? usable[0]?.id ?? ''));
  const [text, setText] = useState(initial?.text ?? '');
  const [start, setStart] = useState(toZonedInput(initial?.from ?? defaultSpan.from, timezone));
  const [end, setEnd] = useState(toZonedInput(initial?.to ?? defaultSpan.to, timezone));
  const [wholeLogger, setWholeLogger] = useState(initial ? initial.channelId === null : channelLabel === null);
  const [exclude, setExclude] = useState(initial?.excludeFromAnalysis ?? false);
  const [local, setLocal] = useState<{ field: string; reason: string } | null>(null);

  const server = error ? fieldFromServerError(error, FIELDS) : null;
  const problem = local ?? server;
  const on = (field: string) => (problem?.field === field ? problem.reason : undefined);

  function submit(e: FormEvent) {
    e.preventDefault();
    const startAt = readDateTime(start, timezone);
    const endAt = readDateTime(end, timezone);
    if (!startAt.ok) return setLocal({ field: 'start', reason: startAt.problem });
    if (!endAt.ok) return setLocal({ field: 'end', reason: endAt.problem });
    const [s, t] = [startAt.ms, endAt.ms];
    if (t <= s) return setLocal({ field: 'end', reason: 'must be after the start' });
    if (!text.trim()) return setLocal({ field: 'text', reason: 'say what happened' });
    setLocal(null);
    onSubmit({ kindId: Number(kindId), text: text.trim(), start: s, end: t, wholeLogger, excludeFromAnalysis: exclude });
  }

  return (
    <form aria-label={initial ? 'Change the note' : 'Add a note'} onSubmit={submit} className="grid gap-3 rounded-lg border border-rule bg-paper p-3 text-sm">
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField label="Kind" value={kindId} onChange={(e) => setKindId(e.target.value)} error={on('kindId')}>
          {usable.map((k) => (
            <option key={k.id} value={k.id}>
              {k.name}
              {k.retired ? ' (retired)' : ''}
            </option>
          ))}
        </SelectField>
        {!initial && (
          <fieldset className="grid gap-1">
            <legend className="text-sm font-medium">On</legend>
            {channelLabel !== null && (
              <label className="flex items-center gap-2">
                <input type="radio" name="note-on" checked={!wholeLogger} onChange={() => setWholeLogger(false)} />
                this channel ({channelLabel})
              </label>
            )}
            <label className="flex items-center gap-2">
              <input type="radio" name="note-on" checked={wholeLogger} onChange={() => setWholeLogger(true)} />
              every channel of {loggerName}
            </label>
          </fieldset>
        )}
      </div>
      <TextField
        label="What happened"
        value={text}
        onChange={(e) => setText(e.target.value)}
        maxLength={2000}
        error={on('text')}
        placeholder="Probe cleaned and dried"
      />
      <div className="grid gap-3 sm:grid-cols-2">
        <DateTimeInput label="Starts" value={start} onChange={setStart} timeZone={timezone} error={on('start')} />
        <DateTimeInput label="Ends" value={end} onChange={setEnd} timeZone={timezone} error={on('end')} />
      </div>
      <label className="flex items-start gap-2">
        <input type="checkbox" checked={exclude} onChange={(e) => setExclude(e.target.checked)} className="mt-1" />
        <span>
          Leave out of analysis
          <span className="block text-xs text-ink-soft">
            Diagnostics, range comparisons and unusual-reading alerts treat the readings of this span as missing.
          </span>
        </span>
      </label>
      {error && !server && <Notice tone="alert">{error.message}</Notice>}
      <div className="flex gap-2">
        <Button type="submit" tone="primary" size="sm" disabled={pending}>
          {pending ? 'Saving…' : submitLabel}
        </Button>
        <Button size="sm" tone="quiet" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
