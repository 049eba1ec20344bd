import { useState } from 'react';
import type { Note, NoteKind } from '@shared/contract/notes.ts';
import { Button } from '../../../components/button.tsx';
import { ConfirmButton } from '../../../components/confirm-button.tsx';
import { Notice } from '../../../components/notice.tsx';
import { formatInstant } from '../../../components/clock/format.ts';
import { Instant } from '../../../components/clock/instant.tsx';
import { useClock } from '../../../components/clock/use-clock.ts';
import { useDeleteNote } from '../api/delete-note.ts';
import { useUpdateNote } from '../api/update-note.ts';
import { NoteForm } from './note-form.tsx';
import { spanWords } from './note-spans.ts';
import { lastChangedBy, NOTES_MESSAGES } from '../messages.ts';

/**
 * Notes as a list, earliest first: kind, span on the logger's clock, where (channel or whole
 * logger), the text, "left out of analysis" when so, and who wrote it. With `canEdit`, each note
 * can be changed in place or deleted (after a confirmation).
 */
export function NotesList({
  slug,
  notes,
  kinds,
  timezone,
  zoneOf,
  canEdit,
  showWhere = true,
  empty = NOTES_MESSAGES.noneInRange,
}: {
  slug: string;
  notes: readonly Note[];
  kinds: readonly NoteKind[];
  /** The logger's IANA zone (a channel's or logger's own list). */
  timezone: string;
  /** Each note's logger zone, for a list across loggers (the lab's notes); `timezone` otherwise. */
  zoneOf?: (n: Note) => string | undefined;
  canEdit: boolean;
  /** Name the logger and channel of each note (off on a channel's own list, where "whole logger" still shows). */
  showWhere?: boolean;
  /** What to say when there is no note. */
  empty?: string;
}) {
  const [editing, setEditing] = useState<number | null>(null);
  const update = useUpdateNote(slug);
  const remove = useDeleteNote(slug);
  // notes are read beside the readings: on the clock the person chose for readings (the logger's by default)
  const clock = useClock();
  const loggerZone = (n: Note) => zoneOf?.(n) ?? timezone;
  const zone = (n: Note) => clock.zoneFor('readings', loggerZone(n));
  if (notes.length === 0) return <p className="text-sm text-ink-soft">{empty}</p>;
  return (
    <ul className="grid gap-2" aria-label="Notes">
      {notes.map((n) => (
        <li key={n.id} className="rounded-lg border border-rule bg-card p-3 text-sm">
          {editing === n.id ? (
            <NoteForm
              kinds={kinds}
              timezone={zone(n)}
              initial={n}
              defaultSpan={n}
              channelLabel={n.channelLabel}
              loggerName={n.loggerName}
              submitLabel="Save the note"
              pending={update.isPending}
              error={update.error}
              onCancel={() => setEditing(null)}
              onSubmit={(v) =>
                update.mutate(
                  { noteId: n.id, input: { kindId: v.kindId, text: v.text, start: v.start, end: v.end, excludeFromAnalysis: v.excludeFromAnalysis } },
                  { onSuccess: () => setEditing(null) },
                )
              }
            />
          ) : (
            <div className="grid gap-1">
              <div className="flex flex-wrap items-baseline gap-x-3 gap-y-1">
                <span className="rounded bg-slate-100 px-1.5 py-0.5 text-xs font-semibold uppercase tracking-wide text-[#3f5478]">{n.kind.name}</span>
                <span className="font-mono text-xs">{spanWords(n.from, n.to, (ms) => formatInstant(ms, zone(n)))}</span>
                {(showWhere || n.channelId === null) && (
                  <span className="text-xs text-ink-soft">
                    {n.channelId === null ? `whole logger ${n.loggerName}` : `${n.loggerName} · ${n.channelLabel ?? ''}`}
                  </span>
                )}
                {n.excludeFromAnalysis && <span className="text-xs font-medium text-[#3f5478]">left out of analysis</span>}
              </div>
              <p className="whitespace-pre-wrap">{n.text}</p>
              <p className="text-xs text-ink-soft">
                {n.updatedBy ? lastChangedBy(n.updatedBy.name) : NOTES_MESSAGES.byFormerMember},{' '}
                <Instant at={n.updatedAt} kind="readings" loggerZone={loggerZone(n)} />
              </p>
              {canEdit && (
                <div className="flex gap-2">
                  <Button size="sm" onClick={() => setEditing(n.id)}>
                    Change
                  </Button>
                  <ConfirmButton
                    label="Delete"
                    question={NOTES_MESSAGES.deleteQuestion}
                    confirmLabel="Delete the note"
                    pending={remove.isPending}
                    onConfirm={() => remove.mutate(n.id)}
                  />
                </div>
              )}
            </div>
          )}
        </li>
      ))}
      {remove.error && <Notice tone="alert">{remove.error.message}</Notice>}
    </ul>
  );
}
