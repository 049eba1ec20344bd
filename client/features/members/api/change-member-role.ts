import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import type { ChangeRoleInput, MemberAnswer } from '@shared/contract/members.ts';
import { membersQueryOptions } from './get-members.ts';

/** `PATCH /api/v1/labs/:lab/members/:userId`; 409 `last_admin` if the lab would be left without an admin. */
export function changeMemberRole(slug: string, userId: number, input: ChangeRoleInput): Promise<MemberAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/members/${userId}`, {
    method: 'PATCH',
    body: JSON.stringify(input),
  });
}

/** Changes one member's role, then refreshes the member list. */
export function useChangeMemberRole(slug: string, userId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ChangeRoleInput) => changeMemberRole(slug, userId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: membersQueryOptions(slug).queryKey }),
  });
}
