import { useState } from 'react';
import type { Note } from '@shared/contract/notes.ts';
import type { TimeRange } from '@shared/contract/channels.ts';
import { Button } from '../../../components/button.tsx';
import { LoadingNote, Notice } from '../../../components/notice.tsx';
import { channelNotesCsvUrl } from '../api/get-channel-notes.ts';
import { useNoteKinds } from '../api/get-note-kinds.ts';
import { useCreateNote } from '../api/create-note.ts';
import { NoteForm } from './note-form.tsx';
import { NotesList } from './notes-list.tsx';

/**
 * The notes of a channel's chart range, beside the chart: the list (with change and delete for
 * those who may edit loggers), "Add a note" opening the form on the chart's range, and the
 * notes of the range as CSV for those who may export.
 */
export function ChannelNotesPanel({
  slug,
  channel,
  range,
  notes,
  loading,
  error,
  canEdit,
  canExport,
}: {
  slug: string;
  channel: { id: number; label: string; logger: { id: number; name: string; timezone: string } };
  range: TimeRange;
  notes: readonly Note[];
  loading: boolean;
  error: Error | null;
  canEdit: boolean;
  canExport: boolean;
}) {
  const [adding, setAdding] = useState(false);
  const kinds = useNoteKinds(slug);
  const create = useCreateNote(slug);
  const tz = channel.logger.timezone;
  // a new note starts on the last hour of the chart's range
  const defaultSpan = { from: Math.max(range.from, range.to - 3_600_000), to: range.to };

  return (
    <section aria-labelledby="notes-heading" className="grid gap-2 border-t border-rule pt-3">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h4 id="notes-heading" className="font-semibold">
          Notes on this range
        </h4>
        <div className="flex flex-wrap items-center gap-3">
          {canExport && (
            <a href={channelNotesCsvUrl(slug, channel.id, range)} download className="text-sm font-medium text-lichen-dark underline underline-offset-2">
              Notes as CSV
            </a>
          )}
          {canEdit && !adding && (
            <Button size="sm" onClick={() => setAdding(true)}>
              Add a note
            </Button>
          )}
        </div>
      </div>
      {adding && kinds.data && (
        <NoteForm
          kinds={kinds.data.kinds}
          timezone={tz}
          defaultSpan={defaultSpan}
          channelLabel={channel.label}
          loggerName={channel.logger.name}
          submitLabel="Add the note"
          pending={create.isPending}
          error={create.error}
          onCancel={() => setAdding(false)}
          onSubmit={(v) =>
            create.mutate(
              {
                ...(v.wholeLogger ? { loggerId: channel.logger.id } : { channelId: channel.id }),
                kindId: v.kindId,
                text: v.text,
                start: v.start,
                end: v.end,
                excludeFromAnalysis: v.excludeFromAnalysis,
              },
              { onSuccess: () => setAdding(false) },
            )
          }
        />
      )}
      {error ? (
        <Notice tone="alert">{error.message}</Notice>
      ) : loading ? (
        <LoadingNote what="Loading notes…" />
      ) : (
        <NotesList slug={slug} notes={notes} kinds={kinds.data?.kinds ?? []} timezone={tz} canEdit={canEdit} showWhere={false} />
      )}
    </section>
  );
}
