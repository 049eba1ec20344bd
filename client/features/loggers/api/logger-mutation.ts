import { useRefreshingMutation } from '../../../components/use-refreshing-mutation.ts';
import { loggersRootKey } from './get-loggers.ts';

/**
 * A mutation on the lab's loggers (a logger, its channels or its keys) that refreshes every
 * logger query of the lab once it succeeds, so lists and pages never show stale rows.
 */
export function useLoggersMutation<TInput, TResult>(slug: string, mutationFn: (input: TInput) => Promise<TResult>) {
  return useRefreshingMutation(loggersRootKey(slug), mutationFn);
}
