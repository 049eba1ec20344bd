import { useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { diagnosticsQueryOptions, useDiagnostics, type DiagnosticsParams } from '../api/get-diagnostics.ts';
import { useElapsedSeconds } from './use-elapsed.ts';

/**
 * One diagnostics run at a time for a channel: `run(params)` starts it, `cancel()` aborts the
 * request (the server then cancels its worker task) and forgets it; `elapsed` counts seconds
 * while the request is in flight.
 */
export function useDiagnosticsRun(slug: string, channelId: number) {
  const queryClient = useQueryClient();
  const [params, setParams] = useState<DiagnosticsParams | null>(null);
  const [startedAt, setStartedAt] = useState<number | null>(null);
  const query = useDiagnostics(slug, channelId, params);
  const running = params !== null && query.isFetching;
  const elapsed = useElapsedSeconds(running ? startedAt : null);

  return {
    params,
    query,
    running,
    elapsed,
    run(next: DiagnosticsParams) {
      setStartedAt(Date.now());
      setParams(next);
    },
    cancel() {
      void queryClient.cancelQueries({ queryKey: diagnosticsQueryOptions(slug, channelId, params).queryKey });
      setParams(null);
    },
  };
}
