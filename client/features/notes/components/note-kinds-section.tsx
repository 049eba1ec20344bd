import { useState, type FormEvent } from 'react';
import type { NoteKind } from '@shared/contract/notes.ts';
import { Button } from '../../../components/button.tsx';
import { TextField } from '../../../components/form-field.tsx';
import { LoadingNote, Notice } from '../../../components/notice.tsx';
import { fieldFromServerError } from '../../../components/server-field-error.ts';
import { useNoteKinds } from '../api/get-note-kinds.ts';
import { useCreateNoteKind } from '../api/create-note-kind.ts';
import { useUpdateNoteKind } from '../api/update-note-kind.ts';

/** One kind with rename and retire / bring back. */
function KindRow({ slug, kind, canEdit }: { slug: string; kind: NoteKind; canEdit: boolean }) {
  const [name, setName] = useState<string | null>(null);
  const update = useUpdateNoteKind(slug);
  function rename(e: FormEvent) {
    e.preventDefault();
    if (name === null) return;
    update.mutate({ kindId: kind.id, input: { name } }, { onSuccess: () => setName(null) });
  }
  return (
    <li className="flex flex-wrap items-center gap-3 py-1.5 text-sm">
      {name === null ? (
        <span className={kind.retired ? 'text-ink-soft line-through' : 'font-medium'}>{kind.name}</span>
      ) : (
        <form onSubmit={rename} aria-label={`Rename ${kind.name}`} className="flex items-end gap-2">
          <TextField label="New name" value={name} onChange={(e) => setName(e.target.value)} maxLength={40} />
          <Button type="submit" size="sm" tone="primary" disabled={update.isPending}>
            Save
          </Button>
          <Button size="sm" tone="quiet" onClick={() => setName(null)}>
            Cancel
          </Button>
        </form>
      )}
      <span className="text-xs text-ink-soft">
        {kind.notes} note{kind.notes === 1 ? '' : 's'}
        {kind.retired ? ' · retired: kept on old notes, not offered for new ones' : ''}
      </span>
      {canEdit && name === null && (
        <span className="flex gap-2">
          <Button size="sm" tone="quiet" onClick={() => setName(kind.name)}>
            Rename
          </Button>
          <Button size="sm" tone="quiet" disabled={update.isPending} onClick={() => update.mutate({ kindId: kind.id, input: { retired: !kind.retired } })}>
            {kind.retired ? 'Bring back' : 'Retire'}
          </Button>
        </span>
      )}
      {update.error && <span className="text-alert">{update.error.message}</span>}
    </li>
  );
}

/**
 * The lab's list of note kinds: every kind with how many notes use it; technicians and admins
 * rename, retire (old notes keep the kind) and add kinds.
 */
export function NoteKindsSection({ slug, canEdit }: { slug: string; canEdit: boolean }) {
  const kinds = useNoteKinds(slug);
  const create = useCreateNoteKind(slug);
  const [name, setName] = useState('');
  function add(e: FormEvent) {
    e.preventDefault();
    create.mutate({ name }, { onSuccess: () => setName('') });
  }
  return (
    <section aria-labelledby="note-kinds-heading" className="grid gap-2 rounded-xl border border-rule bg-card p-4">
      <h3 id="note-kinds-heading" className="text-lg font-semibold">
        Kinds of note
      </h3>
      {kinds.isError ? (
        <Notice tone="alert">{kinds.error.message}</Notice>
      ) : kinds.isPending ? (
        <LoadingNote what="Loading kinds…" />
      ) : (
        <ul className="divide-y divide-rule">
          {kinds.data.kinds.map((k) => (
            <KindRow key={k.id} slug={slug} kind={k} canEdit={canEdit} />
          ))}
        </ul>
      )}
      {canEdit && (
        <form onSubmit={add} aria-label="Add a kind" className="flex flex-wrap items-end gap-2">
          <TextField
            label="New kind"
            value={name}
            onChange={(e) => setName(e.target.value)}
            maxLength={40}
            error={create.error ? (fieldFromServerError(create.error, ['name'])?.reason ?? create.error.message) : undefined}
          />
          <Button type="submit" size="sm" disabled={create.isPending || !name.trim()}>
            Add the kind
          </Button>
        </form>
      )}
    </section>
  );
}
