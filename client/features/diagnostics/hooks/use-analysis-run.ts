import { useState } from 'react';
import { useQuery, useQueryClient, type QueryKey, type UseQueryOptions } from '@tanstack/react-query';
import { useElapsedSeconds } from './use-elapsed.ts';

/**
 * One analysis request at a time, started by a button: `run(params)` starts it, `cancel()`
 * aborts the request (the server then drops the work) and forgets it; `elapsed` counts seconds
 * while the request is in flight. `options(params)` is the operation's `queryOptions` (disabled
 * while `params` is null), so query keys are never retyped.
 */
export function useAnalysisRun<P, T, K extends QueryKey>(options: (params: P | null) => UseQueryOptions<T, Error, T, K>) {
  const queryClient = useQueryClient();
  const [params, setParams] = useState<P | null>(null);
  const [startedAt, setStartedAt] = useState<number | null>(null);
  const query = useQuery(options(params));
  const running = params !== null && query.isFetching;
  const elapsed = useElapsedSeconds(running ? startedAt : null);

  return {
    params,
    query,
    running,
    elapsed,
    run(next: P) {
      setStartedAt(Date.now());
      setParams(next);
    },
    cancel() {
      void queryClient.cancelQueries({ queryKey: options(params).queryKey });
      setParams(null);
    },
  };
}
