import { useCallback, useMemo, useState } from 'react';
import { Button } from '../../../components/button.tsx';
import { ConfirmButton } from '../../../components/confirm-button.tsx';
import { LoadingNote, Notice } from '../../../components/notice.tsx';
import { quarantineExportUrl, useQuarantine } from '../api/get-quarantine.ts';
import { useDiscardRows } from '../api/discard-rows.ts';
import type { ResubmitOutcome as Outcome, ResubmitRow } from '@shared/contract/quarantine.ts';
import { useResubmitRows } from '../api/resubmit-rows.ts';
import { useQuarantineFilters } from '../hooks/use-quarantine-filters.ts';
import { asResubmitRow } from './fix-row-form.tsx';
import { QuarantineFilterBar } from './quarantine-filter-bar.tsx';
import { QuarantinePager } from './quarantine-pager.tsx';
import { QuarantineTable } from './quarantine-table.tsx';
import { ResubmitOutcome } from './resubmit-outcome.tsx';

export const QUARANTINE_PAGE_SIZE = 50;

/**
 * The quarantine review: filters (logger, reason) and the page's cursor in the URL, the rows
 * of the page (keyset pages: Next follows the server's `nextCursor`, Newer goes back along the
 * cursors this view came through, First returns to the newest rows),
 * and what can be done with them — select rows to discard (asked first) or re-submit as they
 * are, fix a single row and re-submit it, download every matching row as CSV. The outcome
 * of the last re-submission stays on screen until the next action.
 */
export function QuarantineReview({ slug, loggers }: { slug: string; loggers: Array<{ id: number; name: string }> }) {
  const [filters, setFilters] = useQuarantineFilters();
  const query = {
    ...(filters.loggerId ? { loggerId: filters.loggerId } : {}),
    ...(filters.reason ? { reason: filters.reason } : {}),
    ...(filters.cursor ? { cursor: filters.cursor } : {}),
    pageSize: QUARANTINE_PAGE_SIZE,
  };
  const list = useQuarantine(slug, query);
  const discard = useDiscardRows(slug);
  const resubmit = useResubmitRows(slug);
  const [selected, setSelected] = useState<Set<number>>(new Set());
  const [outcome, setOutcome] = useState<Outcome | null>(null);
  const [discarded, setDiscarded] = useState<number | null>(null);
  // the cursors of the pages before the shown one, newest first page = null
  const [trail, setTrail] = useState<Array<string | null>>([]);
  const loggerNames = useMemo(() => new Map(loggers.map((l) => [l.id, l.name])), [loggers]);

  const send = useCallback(
    (rows: ResubmitRow[]) => {
      setDiscarded(null);
      resubmit.mutate(rows, {
        onSuccess: (result) => {
          setOutcome(result);
          setSelected(new Set());
        },
      });
    },
    [resubmit],
  );
  const rows = list.data?.rows ?? [];
  const chosen = rows.filter((r) => selected.has(r.id));

  return (
    <div className="grid gap-4">
      <QuarantineFilterBar
        filters={filters}
        loggers={loggers}
        onChange={(next) => {
          setSelected(new Set());
          setTrail([]);
          setFilters(next);
        }}
      />
      <div className="flex flex-wrap items-center gap-3">
        <span className="text-sm text-ink-soft" aria-live="polite">
          {chosen.length} selected
        </span>
        <Button size="sm" tone="primary" disabled={chosen.length === 0 || resubmit.isPending} onClick={() => send(chosen.map(asResubmitRow))}>
          Re-submit selected
        </Button>
        {chosen.length > 0 && (
          <ConfirmButton
            label="Discard selected"
            question={`Discard ${chosen.length} row${chosen.length === 1 ? '' : 's'} for good?`}
            confirmLabel="Discard"
            pending={discard.isPending}
            onConfirm={() =>
              discard.mutate(
                chosen.map((r) => r.id),
                {
                  onSuccess: (r) => {
                    setOutcome(null);
                    setDiscarded(r.discarded);
                    setSelected(new Set());
                  },
                },
              )
            }
          />
        )}
        <a
          href={quarantineExportUrl(slug, { loggerId: filters.loggerId ?? undefined, reason: filters.reason || undefined })}
          download
          className="ml-auto text-sm font-medium text-lichen-dark underline-offset-2 hover:underline"
        >
          Download CSV
        </a>
      </div>
      {outcome && <ResubmitOutcome outcome={outcome} />}
      {discarded !== null && (
        <Notice tone="status">
          Discarded {discarded} row{discarded === 1 ? '' : 's'}.
        </Notice>
      )}
      {resubmit.isError && <Notice tone="alert">{resubmit.error.message}</Notice>}
      {discard.isError && <Notice tone="alert">{discard.error.message}</Notice>}
      {list.isPending ? (
        <LoadingNote what="Loading quarantined rows…" />
      ) : list.isError ? (
        <Notice tone="alert">{list.error.message}</Notice>
      ) : (
        <>
          <QuarantineTable rows={rows} loggerNames={loggerNames} selected={selected} onSelect={setSelected} pending={resubmit.isPending} onResubmit={send} />
          <QuarantinePager
            shown={rows.length}
            total={list.data.total}
            totalAtLeast={list.data.totalAtLeast}
            atFirst={!filters.cursor}
            canGoBack={trail.length > 0}
            nextCursor={list.data.nextCursor}
            onFirst={() => {
              setSelected(new Set());
              setTrail([]);
              setFilters({ ...filters, cursor: null });
            }}
            onBack={() => {
              setSelected(new Set());
              setTrail(trail.slice(0, -1));
              setFilters({ ...filters, cursor: trail[trail.length - 1] ?? null });
            }}
            onNext={(cursor) => {
              setSelected(new Set());
              setTrail([...trail, filters.cursor]);
              setFilters({ ...filters, cursor });
            }}
          />
        </>
      )}
    </div>
  );
}
