import { queryOptions, useQuery } from '@tanstack/react-query';
import type { NotesAnswer } from '@shared/contract/notes.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { labBase, notesRootKey } from './get-channel-notes.ts';

/** `GET …/notes`: every note of the lab (the newest 2,000 at most). */
export function getLabNotes(slug: string): Promise<NotesAnswer> {
  return apiFetch(`${labBase(slug)}/notes`);
}

export const labNotesQueryOptions = (slug: string) => queryOptions({ queryKey: [...notesRootKey(slug), 'lab'], queryFn: () => getLabNotes(slug) });

/** The lab's notes, for its notes page. */
export function useLabNotes(slug: string) {
  return useQuery(labNotesQueryOptions(slug));
}

/** Link to every note of the lab as CSV. */
export const labNotesCsvUrl = (slug: string) => `${labBase(slug)}/notes.csv`;
