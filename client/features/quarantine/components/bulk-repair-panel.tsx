import { useState } from 'react';
import type { BulkRequest, BulkSelection } from '@shared/contract/quarantine.ts';
import { Button } from '../../../components/button.tsx';
import { Notice } from '../../../components/notice.tsx';
import { useBulkPreview, useBulkRun, useStartBulkRun } from '../api/bulk-repair.ts';
import { bulkActionFromDraft, EMPTY_DRAFT, type BulkActionDraft } from '../hooks/bulk-action-draft.ts';
import { BulkActionFields } from './bulk-action-fields.tsx';
import { BulkPreviewTable } from './bulk-preview-table.tsx';
import { BulkRunStatus } from './bulk-run-status.tsx';

/**
 * Repairing many quarantined rows at once: choose the repair and its fields, see its preview
 * (nothing changes), then apply it to the selection; the repair works in the background in one
 * go, the panel following its progress until it says what became of the rows. `selection`
 * names the rows (every row matching the filter, or the ticked ones) and `describes` says so
 * in words; changing either starts over at the preview.
 */
export function BulkRepairPanel({
  slug,
  selection,
  describes,
  channels,
  onClose,
}: {
  slug: string;
  selection: BulkSelection;
  describes: string;
  channels: Array<{ id: number; key: string; label: string }> | null;
  onClose: () => void;
}) {
  const [draft, setDraft] = useState<BulkActionDraft>(EMPTY_DRAFT);
  const [problem, setProblem] = useState<string | null>(null);
  const [runId, setRunId] = useState<number | null>(null);
  const preview = useBulkPreview(slug);
  const start = useStartBulkRun(slug);
  const run = useBulkRun(slug, runId);
  const request = (): BulkRequest | null => {
    const built = bulkActionFromDraft(draft);
    if ('error' in built) {
      setProblem(built.error);
      return null;
    }
    setProblem(null);
    return { selection, action: built.action };
  };
  const edit = (next: BulkActionDraft) => {
    setDraft(next);
    setProblem(null);
    preview.reset();
  };
  const working = run.data?.state === 'running' || start.isPending;

  return (
    <section aria-labelledby="bulk-heading" className="grid gap-4 rounded-xl border border-lichen/40 bg-card p-4">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 id="bulk-heading" className="text-lg font-semibold">
          Repair in bulk
        </h3>
        <p className="text-sm text-ink-soft">{describes}</p>
      </div>
      {runId === null ? (
        <>
          <BulkActionFields draft={draft} onChange={edit} channels={channels} />
          {problem && <Notice tone="alert">{problem}</Notice>}
          {preview.isError && <Notice tone="alert">{preview.error.message}</Notice>}
          {start.isError && <Notice tone="alert">{start.error.message}</Notice>}
          {preview.data && <BulkPreviewTable preview={preview.data} />}
          <div className="flex flex-wrap gap-3">
            <Button
              tone={preview.data ? 'secondary' : 'primary'}
              disabled={preview.isPending}
              onClick={() => {
                const r = request();
                if (r) preview.mutate(r);
              }}
            >
              {preview.isPending ? 'Working out the preview…' : preview.data ? 'Preview again' : 'Preview'}
            </Button>
            {preview.data && (
              <Button
                tone={draft.kind === 'discard' ? 'danger' : 'primary'}
                disabled={start.isPending}
                onClick={() => {
                  const r = request();
                  if (r) start.mutate(r, { onSuccess: (started) => setRunId(started.id) });
                }}
              >
                Apply to {preview.data.selected.toLocaleString('en')} row{preview.data.selected === 1 ? '' : 's'}
              </Button>
            )}
            <Button tone="quiet" onClick={onClose} disabled={working}>
              Close
            </Button>
          </div>
        </>
      ) : run.data ? (
        <>
          <BulkRunStatus run={run.data} />
          {run.data.state !== 'running' && (
            <div className="flex gap-3">
              <Button
                onClick={() => {
                  setRunId(null);
                  preview.reset();
                  start.reset();
                }}
              >
                Another repair
              </Button>
              <Button tone="quiet" onClick={onClose}>
                Close
              </Button>
            </div>
          )}
        </>
      ) : run.isError ? (
        <Notice tone="alert">{run.error.message}</Notice>
      ) : (
        <p role="status" className="text-sm text-ink-soft">
          Starting the repair…
        </p>
      )}
    </section>
  );
}
