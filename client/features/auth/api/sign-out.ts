import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';

/** `POST /auth/sign-out`. */
export function signOut(): Promise<void> {
  return apiFetch<void>('/auth/sign-out', { method: 'POST' });
}

/** Signs out, forgets every cached answer and returns to the sign-in page. */
export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSuccess: () => {
      queryClient.clear();
      window.location.assign('/sign-in?signedOut=1');
    },
  });
}
