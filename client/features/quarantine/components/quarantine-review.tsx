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
import { ResubmitOutcome, type SentReading } from './resubmit-outcome.tsx';
import { discardedNotice, discardQuestion } from '../messages.ts';
import { BulkRepairPanel } from './bulk-repair-panel.tsx';
import { loggerQueryOptions } from '../../loggers/api/get-logger.ts';
import { useQuery } from '@tanstack/react-query';
import type { BulkSelection } from '@shared/contract/quarantine.ts';

export const QUARANTINE_PAGE_SIZE = 50;

/**
 * The quarantine review: filters (logger, reason) and the page's cursor in the URL, the rows
 * of the page (keyset pages: Next follows the server's `nextCursor`, Newer goes back along the
 * cursors this view came through, First returns to the newest rows),
 * and what can be done with them — select rows to discard (asked first) or re-submit as they
 * are, fix a single row and re-submit it, download every matching row as CSV. The outcome
 * of the last re-submission stays on screen until the next action.
 */
export function QuarantineReview({ slug, loggers }: { slug: string; loggers: Array<{ id: number; name: string; timezone?: string }> }) {
  const [filters, setFilters] = useQuarantineFilters();
  const query = {
    ...(filters.loggerId ? { loggerId: filters.loggerId } : {}),
    ...(filters.reason ? { reason: filters.reason } : {}),
    ...(filters.channel ? { channel: filters.channel } : {}),
    ...(filters.cursor ? { cursor: filters.cursor } : {}),
    pageSize: QUARANTINE_PAGE_SIZE,
  };
  const list = useQuarantine(slug, query);
  const discard = useDiscardRows(slug);
  const resubmit = useResubmitRows(slug);
  const [selected, setSelected] = useState<Set<number>>(new Set());
  // every row matching the filter, not only the ticked ones (for a bulk repair)
  const [allMatching, setAllMatching] = useState(false);
  // the rows a bulk repair works on, fixed when its panel opens (the list changes under it)
  const [bulk, setBulk] = useState<{ selection: BulkSelection; describes: string } | null>(null);
  const logger = useQuery({ ...loggerQueryOptions(slug, filters.loggerId ?? 0), enabled: !!filters.loggerId });
  const [outcome, setOutcome] = useState<Outcome | null>(null);
  // the readings of the last re-submission by row id, so its outcome names them (not their ids)
  const [sent, setSent] = useState<ReadonlyMap<number, SentReading>>(new Map());
  const [discarded, setDiscarded] = useState<number | null>(null);
  // the cursors of the pages before the shown one, newest first page = null
  const [trail, setTrail] = useState<Array<string | null>>([]);
  const loggerNames = useMemo(() => new Map(loggers.map((l) => [l.id, l.name])), [loggers]);
  // each row's received time on its logger's clock (by default)
  const loggerZones = useMemo(() => new Map(loggers.flatMap((l) => (l.timezone ? [[l.id, l.timezone] as const] : []))), [loggers]);

  const pageRows = list.data?.rows;
  const send = useCallback(
    (rows: ResubmitRow[]) => {
      setDiscarded(null);
      const loggerOf = new Map((pageRows ?? []).map((r) => [r.id, r.loggerId]));
      setSent(
        new Map(
          rows.map((r) => {
            const loggerId = loggerOf.get(r.id);
            return [r.id, { logger: loggerId == null ? null : (loggerNames.get(loggerId) ?? null), channel: r.channel, ts: r.ts, value: r.value }];
          }),
        ),
      );
      resubmit.mutate(rows, {
        onSuccess: (result) => {
          setOutcome(result);
          setSelected(new Set());
        },
      });
    },
    [resubmit, pageRows, loggerNames],
  );
  const rows = list.data?.rows ?? [];
  const chosen = rows.filter((r) => selected.has(r.id));
  const total = list.data?.total ?? 0;
  const tooMany = list.data?.totalAtLeast ?? false;
  const clearSelection = () => {
    setSelected(new Set());
    setAllMatching(false);
    setBulk(null);
  };
  const bulkSelection: BulkSelection = allMatching
    ? {
        filter: {
          ...(filters.loggerId ? { loggerId: filters.loggerId } : {}),
          ...(filters.reason ? { reason: filters.reason } : {}),
          ...(filters.channel ? { channel: filters.channel } : {}),
        },
      }
    : { ids: chosen.map((r) => r.id) };
  const channels = filters.loggerId && logger.data ? logger.data.logger.channels.filter((c) => !c.retiredAt) : null;

  return (
    <div className="grid gap-4">
      <QuarantineFilterBar
        filters={filters}
        loggers={loggers}
        onChange={(next) => {
          clearSelection();
          setTrail([]);
          setFilters(next);
        }}
      />
      <div className="flex flex-wrap items-center gap-3" role="group" aria-label="Selection">
        <span className="text-sm text-ink-soft" aria-live="polite">
          {allMatching
            ? total > 0
              ? `All ${total.toLocaleString('en')} matching rows selected`
              : 'No rows match the filter now'
            : `${chosen.length} selected`}
        </span>
        {allMatching ? (
          <Button size="sm" tone="quiet" onClick={clearSelection}>
            Clear selection
          </Button>
        ) : (
          total > 0 &&
          (tooMany ? (
            <span className="text-xs text-ink-soft">10,000 or more match: narrow the filter to repair them in bulk.</span>
          ) : (
            <Button
              size="sm"
              tone="quiet"
              onClick={() => {
                setAllMatching(true);
                setSelected(new Set(rows.map((r) => r.id)));
              }}
            >
              Select all {total.toLocaleString('en')} matching
            </Button>
          ))
        )}
        <Button
          size="sm"
          disabled={allMatching ? total === 0 : chosen.length === 0}
          onClick={() =>
            setBulk({
              selection: bulkSelection,
              describes: allMatching
                ? `All ${total.toLocaleString('en')} rows matching the filter`
                : `The ${chosen.length} ticked row${chosen.length === 1 ? '' : 's'}`,
            })
          }
        >
          Repair in bulk…
        </Button>
        <Button size="sm" tone="primary" disabled={allMatching || chosen.length === 0 || resubmit.isPending} onClick={() => send(chosen.map(asResubmitRow))}>
          Re-submit selected
        </Button>
        {chosen.length > 0 && !allMatching && (
          <ConfirmButton
            label="Discard selected"
            question={discardQuestion(chosen.length)}
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
          href={quarantineExportUrl(slug, {
            loggerId: filters.loggerId ?? undefined,
            reason: filters.reason || undefined,
            channel: filters.channel || undefined,
          })}
          download
          className="ml-auto text-sm font-medium text-lichen-dark underline-offset-2 hover:underline"
        >
          Download CSV
        </a>
      </div>
      {bulk && (
        <BulkRepairPanel
          key={JSON.stringify(bulk.selection)}
          slug={slug}
          selection={bulk.selection}
          describes={bulk.describes}
          channels={channels}
          onClose={clearSelection}
        />
      )}
      {outcome && <ResubmitOutcome outcome={outcome} sent={sent} />}
      {discarded !== null && <Notice tone="status">{discardedNotice(discarded)}</Notice>}
      {resubmit.isError && <Notice tone="alert">{resubmit.error.message}</Notice>}
      {discard.isError && <Notice tone="alert">{discard.error.message}</Notice>}
      {list.isPending ? (
        <LoadingNote what="Loading quarantined rows…" />
      ) : list.isError ? (
        <Notice tone="alert">{list.error.message}</Notice>
      ) : (
        <>
          <QuarantineTable
            rows={rows}
            loggerNames={loggerNames}
            loggerZones={loggerZones}
            selected={selected}
            onSelect={setSelected}
            pending={resubmit.isPending}
            onResubmit={send}
          />
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
