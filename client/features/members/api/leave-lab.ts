import { useMutation } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';

/** `DELETE /api/v1/labs/:lab/membership`: the signed-in person leaves; 409 `last_admin` for the only admin. */
export function leaveLab(slug: string): Promise<void> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/membership`, { method: 'DELETE' });
}

/** Leaves the lab; the caller decides where to go next (the lab is gone from the person's list). */
export function useLeaveLab(slug: string) {
  return useMutation({ mutationFn: () => leaveLab(slug) });
}
