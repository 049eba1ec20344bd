import { LoadingNote, Notice } from '../../../components/notice.tsx';
import { useLoggerNotes } from '../api/get-logger-notes.ts';
import { useNoteKinds } from '../api/get-note-kinds.ts';
import { NotesList } from './notes-list.tsx';
import { NOTES_MESSAGES } from '../messages.ts';

/** A logger's notes (on the whole logger and on each channel), for the logger page. */
export function LoggerNotesPanel({ slug, loggerId, timezone, canEdit }: { slug: string; loggerId: number; timezone: string; canEdit: boolean }) {
  const notes = useLoggerNotes(slug, loggerId);
  const kinds = useNoteKinds(slug);
  return (
    <section aria-labelledby="logger-notes-heading" className="grid gap-2 rounded-xl border border-rule bg-card p-4">
      <h3 id="logger-notes-heading" className="text-lg font-semibold">
        Notes
      </h3>
      <p className="text-sm text-ink-soft">Notes are added from a channel’s chart. Times are on the logger’s clock ({timezone}).</p>
      {notes.isError ? (
        <Notice tone="alert">{notes.error.message}</Notice>
      ) : notes.isPending ? (
        <LoadingNote what="Loading notes…" />
      ) : (
        <>
          <NotesList
            slug={slug}
            notes={notes.data.notes}
            kinds={kinds.data?.kinds ?? []}
            timezone={timezone}
            canEdit={canEdit}
            empty="No notes on this logger yet."
          />
          {notes.data.truncated && <p className="text-xs text-ink-soft">{NOTES_MESSAGES.newestOnly}</p>}
        </>
      )}
    </section>
  );
}
