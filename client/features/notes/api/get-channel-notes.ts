import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { NotesAnswer } from '@shared/contract/notes.ts';
import type { TimeRange } from '@shared/contract/channels.ts';
import { apiFetch } from '../../../lib/api-client.ts';

/** `/api/v1/labs/:lab`, the base of every notes route. */
export const labBase = (slug: string) => `/api/v1/labs/${encodeURIComponent(slug)}`;

/** The root of every notes query of a lab: a change to a note or kind refreshes all of them. */
export const notesRootKey = (slug: string) => ['labs', slug, 'notes'] as const;

/** `GET …/channels/:channelId/notes?from&to`: the channel's notes and its logger's whole-logger notes overlapping the range. */
export function getChannelNotes(slug: string, channelId: number, range: TimeRange): Promise<NotesAnswer> {
  return apiFetch(`${labBase(slug)}/channels/${channelId}/notes?from=${range.from}&to=${range.to}`);
}

export const channelNotesQueryOptions = (slug: string, channelId: number, range: TimeRange) =>
  queryOptions({
    queryKey: [...notesRootKey(slug), 'channel', channelId, range.from, range.to],
    queryFn: () => getChannelNotes(slug, channelId, range),
    placeholderData: keepPreviousData,
  });

/** The notes to draw on a channel's chart and list beside it. */
export function useChannelNotes(slug: string, channelId: number, range: TimeRange) {
  return useQuery(channelNotesQueryOptions(slug, channelId, range));
}

/** Link to the channel's notes over `range` as CSV. */
export function channelNotesCsvUrl(slug: string, channelId: number, range: TimeRange): string {
  return `${labBase(slug)}/channels/${channelId}/notes.csv?from=${range.from}&to=${range.to}`;
}
