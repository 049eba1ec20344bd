import { LoadingNote, Notice } from '../../components/notice.tsx';
import { MissingPermission } from '../../features/labs/components/lab-not-found.tsx';
import { labNotesCsvUrl, useLabNotes } from '../../features/notes/api/get-lab-notes.ts';
import { useNoteKinds } from '../../features/notes/api/get-note-kinds.ts';
import { NoteKindsSection } from '../../features/notes/components/note-kinds-section.tsx';
import { NotesList } from '../../features/notes/components/notes-list.tsx';
import { useLoggers } from '../../features/loggers/api/get-loggers.ts';
import { useLabContext } from './lab-context.ts';

/**
 * `/labs/:lab/notes`: every note of the lab (each on its logger's clock, or the clock the person
 * chose; every time names its zone), the CSV of all of them for those who may export, and the lab's kinds of note.
 */
export default function LabNotesRoute() {
  const { detail } = useLabContext();
  const slug = detail.lab.slug;
  const can = (p: (typeof detail.permissions)[number]) => detail.permissions.includes(p);
  const notes = useLabNotes(slug);
  const kinds = useNoteKinds(slug);
  // each note's logger zone, from the lab's loggers (retired ones too: their notes stay)
  const loggers = useLoggers(slug, true);
  const zones = new Map((loggers.data?.loggers ?? []).map((l) => [l.id, l.timezone]));
  if (!can('channels.read')) return <MissingPermission what="the notes" />;
  return (
    <div className="grid gap-6">
      <header className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h2 className="text-2xl font-semibold">Notes</h2>
          <p className="text-sm text-ink-soft">
            Notes are added from a channel’s readings chart. A note marked “leave out of analysis” takes its span out of diagnostics, range comparisons and
            unusual-reading alerts. Each time names its zone.
          </p>
        </div>
        {can('exports.create') && (
          <a href={labNotesCsvUrl(slug)} download className="text-sm font-medium text-lichen-dark underline underline-offset-2">
            All notes as CSV
          </a>
        )}
      </header>
      {notes.isError ? (
        <Notice tone="alert">{notes.error.message}</Notice>
      ) : notes.isPending ? (
        <LoadingNote what="Loading notes…" />
      ) : (
        <NotesList
          slug={slug}
          notes={notes.data.notes}
          kinds={kinds.data?.kinds ?? []}
          timezone="UTC"
          zoneOf={(n) => zones.get(n.loggerId)}
          canEdit={can('loggers.manage')}
          empty="No notes yet."
        />
      )}
      <NoteKindsSection slug={slug} canEdit={can('loggers.manage')} />
    </div>
  );
}
