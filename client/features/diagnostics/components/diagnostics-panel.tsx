import { Notice } from '../../../components/notice.tsx';
import { diagnosticsExportUrls } from '../api/get-diagnostics.ts';
import { useDiagnosticsRun } from '../hooks/use-diagnostics-run.ts';
import { DiagnosticsForm } from './diagnostics-form.tsx';
import { DiagnosticsResults } from './diagnostics-results.tsx';
import { RunProgress } from './run-progress.tsx';

/**
 * The diagnostics of one channel: parameters, "Analyse" with progress and Cancel, exports of the
 * answer (JSON and CSV, when the role may export) and the results.
 */
export function DiagnosticsPanel({
  slug,
  channelId,
  channelKey,
  timezone,
  chartRange,
  canExport,
}: {
  slug: string;
  channelId: number;
  channelKey: string;
  timezone: string;
  chartRange: { from: number; to: number };
  canExport: boolean;
}) {
  const run = useDiagnosticsRun(slug, channelId);
  const report = run.query.data;
  const urls = run.params ? diagnosticsExportUrls(slug, channelId, run.params) : null;
  return (
    <section aria-labelledby="diagnostics-heading" className="grid gap-4 rounded-xl border border-rule bg-card p-4">
      <h3 id="diagnostics-heading" className="text-lg font-semibold">
        Diagnostics
      </h3>
      <DiagnosticsForm chartRange={chartRange} timezone={timezone} running={run.running} onRun={run.run} />
      {run.running && <RunProgress what="Analysing" elapsed={run.elapsed} onCancel={run.cancel} />}
      {run.query.isError && <Notice tone="alert">{run.query.error.message}</Notice>}
      {report && !run.running && (
        <>
          {canExport && urls && (
            <div className="flex flex-wrap gap-4 text-sm">
              <a href={urls.json} download={`${slug}-${channelKey}-diagnostics.json`} className="font-medium text-lichen-dark underline underline-offset-2">
                Download diagnostics (JSON)
              </a>
              <a href={urls.csv} download className="font-medium text-lichen-dark underline underline-offset-2">
                Download diagnostics (CSV)
              </a>
            </div>
          )}
          <DiagnosticsResults report={report} timezone={timezone} pngPrefix={`${slug}-${channelKey}`} />
        </>
      )}
    </section>
  );
}
