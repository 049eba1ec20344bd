import type { BulkRun } from '@shared/contract/quarantine.ts';
import { Notice } from '../../../components/notice.tsx';
import { BulkCountsList } from './bulk-preview-table.tsx';

/** A repair at work (how far, as a bar) or its outcome: what became of the rows, or why nothing was applied. */
export function BulkRunStatus({ run }: { run: BulkRun }) {
  if (run.state === 'running') {
    const share = run.total ? Math.round((100 * run.done) / run.total) : 0;
    return (
      <div className="grid gap-2" role="status">
        <p className="text-sm">
          Repairing… {run.done.toLocaleString('en')} of {run.total.toLocaleString('en')} rows worked through. Nothing is kept until every row is done.
        </p>
        <progress className="h-2 w-full accent-lichen" max={run.total || 1} value={run.done} aria-label="Repair progress">
          {share}%
        </progress>
      </div>
    );
  }
  if (run.state === 'failed') {
    return <Notice tone="alert">The repair did not go through: {run.error ?? 'it stopped.'} Every row is still where it was.</Notice>;
  }
  return (
    <Notice tone="status">
      <p className="mb-2 font-medium">Repair done: {run.total.toLocaleString('en')} rows, all at once.</p>
      {run.counts && <BulkCountsList counts={run.counts} tense="did" />}
    </Notice>
  );
}
