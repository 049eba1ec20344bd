import { useMemo, useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { paths } from '../../../app/paths.ts';
import { Button, buttonClasses } from '../../../components/button.tsx';
import { SelectField, TextField } from '../../../components/form-field.tsx';
import type { ChannelOverviewRow, ChannelStatus } from '@shared/contract/channels.ts';
import { filterChannels, readChannelFilter } from './channel-filter.ts';
import { ChannelsTable, type ChannelChoice } from './channels-table.tsx';
import { STATUS_LOOKS, StatusLegend } from './status-badge.tsx';
import { MAX_TOGETHER } from './together-url.ts';
import { tooManyTogether } from '../messages.ts';

/**
 * The channels overview: filters (text, status, logger) kept in the page's query string so a
 * filtered view can be shared, the table with a checkbox per channel to open up to six of any
 * loggers together on one chart (the choice, kept in the query string as `pick`, survives
 * filtering, paging and a trip to the chart and back; a seventh is refused
 * with a message), and the legend of the status marks.
 */
export function ChannelsOverview({ slug, rows, now }: { slug: string; rows: ChannelOverviewRow[]; now: number }) {
  const [params, setParams] = useSearchParams();
  const filter = readChannelFilter(params);
  const shown = useMemo(() => filterChannels(rows, filter), [rows, filter.text, filter.status, filter.loggerId]); // eslint-disable-line react-hooks/exhaustive-deps
  // the choice lives in the query string too (`pick`), so coming back from the chart keeps it
  // (held here as well, so a checkbox answers at once rather than after the navigation)
  const [picked, setPicked] = useState(() => [...new Set((params.get('pick') ?? '').split(',').map(Number))]);
  const chosen = useMemo(() => picked.filter((id) => rows.some((r) => r.id === id)).slice(0, MAX_TOGETHER), [picked, rows]);
  const setChosen = (ids: number[]) => {
    setPicked(ids);
    set('pick', ids.join(','));
  };
  const [refused, setRefused] = useState<string | null>(null);
  const byId = useMemo(() => new Map(rows.map((r) => [r.id, r])), [rows]);
  const choice = useMemo<ChannelChoice>(
    () => ({
      chosen,
      onChoose: (row, choose) => {
        const name = `${row.logger.name} · ${row.label}`;
        if (!choose) {
          setRefused(null);
          return setChosen(chosen.filter((id) => id !== row.id));
        }
        if (chosen.length >= MAX_TOGETHER) return setRefused(tooManyTogether(MAX_TOGETHER, name));
        setRefused(null);
        if (!chosen.includes(row.id)) setChosen([...chosen, row.id]);
      },
    }),
    [chosen, params], // eslint-disable-line react-hooks/exhaustive-deps -- `set` is remade with `params` (a stale one would drop filters set since)
  );
  const loggers = useMemo(() => [...new Map(rows.map((r) => [r.logger.id, r.logger.name])).entries()].sort((a, b) => a[1].localeCompare(b[1])), [rows]);

  function set(name: string, value: string) {
    setParams(
      (current) => {
        const next = new URLSearchParams(current);
        if (value) next.set(name, value);
        else next.delete(name);
        return next;
      },
      { replace: true },
    );
  }

  return (
    <div className="grid gap-4">
      <form role="search" aria-label="Filter channels" className="grid gap-3 sm:grid-cols-[2fr_1fr_1fr]" onSubmit={(e) => e.preventDefault()}>
        <TextField label="Find" type="search" placeholder="label, key, logger, site, unit" value={filter.text} onChange={(e) => set('q', e.target.value)} />
        <SelectField label="Status" value={filter.status} onChange={(e) => set('status', e.target.value)}>
          <option value="">Any status</option>
          {(Object.keys(STATUS_LOOKS) as ChannelStatus[]).map((s) => (
            <option key={s} value={s}>
              {STATUS_LOOKS[s].label}
            </option>
          ))}
        </SelectField>
        <SelectField label="Logger" value={filter.loggerId ?? ''} onChange={(e) => set('logger', e.target.value)}>
          <option value="">Every logger</option>
          {loggers.map(([id, name]) => (
            <option key={id} value={id}>
              {name}
            </option>
          ))}
        </SelectField>
      </form>
      <p className="text-sm text-ink-soft" aria-live="polite">
        {shown.length === rows.length ? `${rows.length} channels` : `${shown.length} of ${rows.length} channels match`}
      </p>
      <section aria-label="Open channels together" className="grid gap-2 rounded-xl border border-rule bg-card p-3 text-sm">
        <div className="flex flex-wrap items-center gap-3">
          <p aria-live="polite" data-testid="chosen-count" className="font-medium">
            {chosen.length} of {MAX_TOGETHER} chosen
          </p>
          {chosen.length > 0 ? (
            <Link to={paths.labChannelsTogether.href(slug, `?channels=${chosen.join(',')}`)} className={buttonClasses('primary', 'sm')}>
              Open together
            </Link>
          ) : (
            <span className="text-ink-soft">Tick channels of any loggers to lay them over one time axis.</span>
          )}
          {chosen.length > 0 && (
            <Button
              size="sm"
              tone="quiet"
              onClick={() => {
                setChosen([]);
                setRefused(null);
              }}
            >
              Clear the choice
            </Button>
          )}
        </div>
        {chosen.length > 0 && (
          <p className="break-words text-ink-soft">
            Chosen: {chosen.map((id) => (byId.get(id) ? `${byId.get(id)!.logger.name} · ${byId.get(id)!.label}` : `channel ${id}`)).join('; ')}
          </p>
        )}
        {refused && (
          <p role="alert" className="text-alert">
            {refused}
          </p>
        )}
      </section>
      <ChannelsTable slug={slug} rows={shown} now={now} choice={choice} />
      <section aria-labelledby="status-legend-heading" className="rounded-xl border border-rule bg-card p-4">
        <h3 id="status-legend-heading" className="mb-2 text-sm font-semibold">
          What the status marks mean
        </h3>
        <StatusLegend />
      </section>
    </div>
  );
}
