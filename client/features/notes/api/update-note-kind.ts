import type { NoteKindAnswer, UpdateNoteKindInput } from '@shared/contract/notes.ts';
import { useRefreshingMutation } from '../../../components/use-refreshing-mutation.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { labBase, notesRootKey } from './get-channel-notes.ts';

/** `PATCH …/note-kinds/:kindId`: rename, retire or bring back a kind. */
export function updateNoteKind(slug: string, kindId: number, input: UpdateNoteKindInput): Promise<NoteKindAnswer> {
  return apiFetch(`${labBase(slug)}/note-kinds/${kindId}`, { method: 'PATCH', body: JSON.stringify(input) });
}

/** Changes a kind, then refreshes the lab's notes queries (notes show the new name). */
export function useUpdateNoteKind(slug: string) {
  return useRefreshingMutation(notesRootKey(slug), ({ kindId, input }: { kindId: number; input: UpdateNoteKindInput }) => updateNoteKind(slug, kindId, input));
}
