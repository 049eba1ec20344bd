import { useRefreshingMutation } from '../../../components/use-refreshing-mutation.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { labBase, notesRootKey } from './get-channel-notes.ts';

/** `DELETE …/notes/:noteId`. */
export function deleteNote(slug: string, noteId: number): Promise<void> {
  return apiFetch(`${labBase(slug)}/notes/${noteId}`, { method: 'DELETE' });
}

/** Deletes a note, then refreshes the lab's notes queries. */
export function useDeleteNote(slug: string) {
  return useRefreshingMutation(notesRootKey(slug), (noteId: number) => deleteNote(slug, noteId));
}
