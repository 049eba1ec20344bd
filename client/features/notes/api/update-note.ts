import type { NoteAnswer, UpdateNoteInput } from '@shared/contract/notes.ts';
import { useRefreshingMutation } from '../../../components/use-refreshing-mutation.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { labBase, notesRootKey } from './get-channel-notes.ts';

/** `PATCH …/notes/:noteId`: a note's kind, text, span or leave-out flag. */
export function updateNote(slug: string, noteId: number, input: UpdateNoteInput): Promise<NoteAnswer> {
  return apiFetch(`${labBase(slug)}/notes/${noteId}`, { method: 'PATCH', body: JSON.stringify(input) });
}

/** Changes a note, then refreshes the lab's notes queries. */
export function useUpdateNote(slug: string) {
  return useRefreshingMutation(notesRootKey(slug), ({ noteId, input }: { noteId: number; input: UpdateNoteInput }) => updateNote(slug, noteId, input));
}
