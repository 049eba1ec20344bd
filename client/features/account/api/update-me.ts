import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Me, UpdateMeInput } from '@shared/contract/me.ts';
import { apiFetch } from '../../../lib/api-client.ts';
import { meQueryOptions } from '../../auth/api/get-me.ts';

/** `PATCH /api/v1/me`: the person's own settings (their time zone, null clears it; which clock times are shown on). */
export function updateMe(input: UpdateMeInput): Promise<Me> {
  return apiFetch<Me>('/api/v1/me', { method: 'PATCH', body: JSON.stringify(input) });
}

/** Saves the settings and puts the answer in the `/me` query, so the shell shows them at once. */
export function useUpdateMe() {
  const client = useQueryClient();
  return useMutation({ mutationFn: updateMe, onSuccess: (me) => client.setQueryData(meQueryOptions().queryKey, me) });
}
