import { queryOptions, useQuery } from '@tanstack/react-query';
import type { NoteKindsAnswer } from '@shared/contract/notes.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { labBase, notesRootKey } from './get-channel-notes.ts';

/** `GET …/note-kinds`: the lab's kinds in list order, retired ones too. */
export function getNoteKinds(slug: string): Promise<NoteKindsAnswer> {
  return apiFetch(`${labBase(slug)}/note-kinds`);
}

export const noteKindsQueryOptions = (slug: string) => queryOptions({ queryKey: [...notesRootKey(slug), 'kinds'], queryFn: () => getNoteKinds(slug) });

/** The lab's note kinds. */
export function useNoteKinds(slug: string) {
  return useQuery(noteKindsQueryOptions(slug));
}
