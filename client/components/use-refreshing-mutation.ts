import { useMutation, useQueryClient, type QueryKey } from '@tanstack/react-query';

/**
 * A mutation that, once it succeeds, refreshes every query under `queryKey` (e.g. all logger
 * queries of a lab), so lists and detail pages never show what the change has replaced.
 */
export function useRefreshingMutation<TInput, TResult>(queryKey: QueryKey, mutationFn: (input: TInput) => Promise<TResult>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn,
    onSuccess: () => queryClient.invalidateQueries({ queryKey }),
  });
}
