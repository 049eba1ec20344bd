import { useRefreshingMutation } from '../../../components/use-refreshing-mutation.ts';
import { quarantineRootKey } from './get-quarantine.ts';

/** A change to quarantined rows that refreshes every quarantine list of the lab once it succeeds. */
export function useQuarantineMutation<TInput, TResult>(slug: string, mutationFn: (input: TInput) => Promise<TResult>) {
  return useRefreshingMutation(quarantineRootKey(slug), mutationFn);
}
