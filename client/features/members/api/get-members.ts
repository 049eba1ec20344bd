import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import type { MembersAnswer } from '@shared/contract/members.ts';

/** `GET /api/v1/labs/:lab/members`. */
export function getMembers(slug: string): Promise<MembersAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/members`);
}

export const membersQueryOptions = (slug: string) => queryOptions({ queryKey: ['labs', slug, 'members'], queryFn: () => getMembers(slug) });

/** The lab's members. */
export function useMembers(slug: string) {
  return useQuery(membersQueryOptions(slug));
}
