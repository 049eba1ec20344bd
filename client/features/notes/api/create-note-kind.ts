import type { CreateNoteKindInput, NoteKindAnswer } from '@shared/contract/notes.ts';
import { useRefreshingMutation } from '../../../components/use-refreshing-mutation.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { labBase, notesRootKey } from './get-channel-notes.ts';

/** `POST …/note-kinds`: a kind at the end of the lab's list. */
export function createNoteKind(slug: string, input: CreateNoteKindInput): Promise<NoteKindAnswer> {
  return apiFetch(`${labBase(slug)}/note-kinds`, { method: 'POST', body: JSON.stringify(input) });
}

/** Adds a kind, then refreshes the lab's notes queries. */
export function useCreateNoteKind(slug: string) {
  return useRefreshingMutation(notesRootKey(slug), (input: CreateNoteKindInput) => createNoteKind(slug, input));
}
