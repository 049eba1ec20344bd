import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import type { Role } from '../../../../server/policies/permissions.ts';

export interface Member {
  userId: number;
  name: string;
  email: string;
  role: Role;
  joinedAt: string;
}

/** `GET /api/v1/labs/:lab/members`. */
export function getMembers(slug: string): Promise<{ members: Member[] }> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/members`);
}

export const membersQueryOptions = (slug: string) =>
  queryOptions({ queryKey: ['labs', slug, 'members'], queryFn: () => getMembers(slug) });

/** The lab's members. */
export function useMembers(slug: string) {
  return useQuery(membersQueryOptions(slug));
}
