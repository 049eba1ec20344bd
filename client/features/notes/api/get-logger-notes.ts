import { queryOptions, useQuery } from '@tanstack/react-query';
import type { NotesAnswer } from '@shared/contract/notes.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { labBase, notesRootKey } from './get-channel-notes.ts';

/** `GET …/loggers/:loggerId/notes`: every note of a logger, on the whole logger and on each channel. */
export function getLoggerNotes(slug: string, loggerId: number): Promise<NotesAnswer> {
  return apiFetch(`${labBase(slug)}/loggers/${loggerId}/notes`);
}

export const loggerNotesQueryOptions = (slug: string, loggerId: number) =>
  queryOptions({ queryKey: [...notesRootKey(slug), 'logger', loggerId], queryFn: () => getLoggerNotes(slug, loggerId) });

/** A logger's notes, for its page. */
export function useLoggerNotes(slug: string, loggerId: number) {
  return useQuery(loggerNotesQueryOptions(slug, loggerId));
}
