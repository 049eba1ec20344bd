import type { DiagnosticsParams } from '@shared/contract/diagnostics.ts';
import { diagnosticsQueryOptions } from '../api/get-diagnostics.ts';
import { useAnalysisRun } from './use-analysis-run.ts';

/** One diagnostics run at a time for a channel, with progress and Cancel (see {@link useAnalysisRun}). */
export function useDiagnosticsRun(slug: string, channelId: number) {
  return useAnalysisRun((params: DiagnosticsParams | null) => diagnosticsQueryOptions(slug, channelId, params));
}
