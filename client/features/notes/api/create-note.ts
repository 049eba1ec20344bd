import type { CreateNoteInput, NoteAnswer } from '@shared/contract/notes.ts';
import { useRefreshingMutation } from '../../../components/use-refreshing-mutation.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { labBase, notesRootKey } from './get-channel-notes.ts';

/** `POST …/notes`: a note on a channel or a whole logger. */
export function createNote(slug: string, input: CreateNoteInput): Promise<NoteAnswer> {
  return apiFetch(`${labBase(slug)}/notes`, { method: 'POST', body: JSON.stringify(input) });
}

/** Makes a note, then refreshes the lab's notes queries. */
export function useCreateNote(slug: string) {
  return useRefreshingMutation(notesRootKey(slug), (input: CreateNoteInput) => createNote(slug, input));
}
