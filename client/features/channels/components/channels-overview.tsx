import { useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';
import { SelectField, TextField } from '../../../components/form-field.tsx';
import type { ChannelOverviewRow, ChannelStatus } from '@shared/contract/channels.ts';
import { filterChannels, readChannelFilter } from './channel-filter.ts';
import { ChannelsTable } from './channels-table.tsx';
import { STATUS_LOOKS, StatusLegend } from './status-badge.tsx';

/**
 * The channels overview: filters (text, status, logger) kept in the page's query string so a
 * filtered view can be shared, the table, and the legend of the status marks.
 */
export function ChannelsOverview({ slug, rows, now }: { slug: string; rows: ChannelOverviewRow[]; now: number }) {
  const [params, setParams] = useSearchParams();
  const filter = readChannelFilter(params);
  const shown = useMemo(() => filterChannels(rows, filter), [rows, filter.text, filter.status, filter.loggerId]); // eslint-disable-line react-hooks/exhaustive-deps
  const loggers = useMemo(() => [...new Map(rows.map((r) => [r.logger.id, r.logger.name])).entries()].sort((a, b) => a[1].localeCompare(b[1])), [rows]);

  function set(name: string, value: string) {
    const next = new URLSearchParams(params);
    if (value) next.set(name, value);
    else next.delete(name);
    setParams(next, { replace: true });
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
      <ChannelsTable slug={slug} rows={shown} now={now} />
      <section aria-labelledby="status-legend-heading" className="rounded-xl border border-rule bg-card p-4">
        <h3 id="status-legend-heading" className="mb-2 text-sm font-semibold">
          What the status marks mean
        </h3>
        <StatusLegend />
      </section>
    </div>
  );
}
