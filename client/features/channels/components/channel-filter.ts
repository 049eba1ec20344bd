import type { ChannelOverviewRow, ChannelStatus } from '@shared/contract/channels.ts';

/** What the overview is narrowed to; empty strings mean "any". */
export interface ChannelFilter {
  text: string;
  status: ChannelStatus | '';
  loggerId: number | null;
}

/** Reads the filter from the page's query string (`q`, `status`, `logger`), ignoring values it does not know. */
export function readChannelFilter(params: URLSearchParams): ChannelFilter {
  const status = params.get('status') ?? '';
  const logger = Number(params.get('logger'));
  return {
    text: params.get('q') ?? '',
    status: ['live', 'silent', 'out-of-range', 'no-data'].includes(status) ? (status as ChannelStatus) : '',
    loggerId: Number.isSafeInteger(logger) && logger > 0 ? logger : null,
  };
}

/**
 * The channels that pass `filter`: the text (case-insensitive, every word must occur) is
 * looked for in label, key, logger name, site, unit and quantity.
 */
export function filterChannels(rows: readonly ChannelOverviewRow[], filter: ChannelFilter): ChannelOverviewRow[] {
  const words = filter.text.toLowerCase().split(/\s+/).filter(Boolean);
  return rows.filter((r) => {
    if (filter.status && r.status !== filter.status) return false;
    if (filter.loggerId !== null && r.logger.id !== filter.loggerId) return false;
    if (words.length === 0) return true;
    const hay = [r.label, r.key, r.logger.name, r.logger.site, r.unit, r.quantity].filter(Boolean).join(' ').toLowerCase();
    return words.every((w) => hay.includes(w));
  });
}
