import { AUDIT_ACTIONS, type AuditAction, type AuditQuery } from '@shared/contract/audit.ts';

/** The audit page's filters as they live in the URL: calendar days, not instants. */
export interface AuditFilters {
  action: AuditAction | '';
  actor: string;
  /** First day to include, `YYYY-MM-DD` in the reader's time zone, or ''. */
  from: string;
  /** Last day to include, `YYYY-MM-DD` in the reader's time zone, or ''. */
  to: string;
  page: number;
}

export const NO_AUDIT_FILTERS: AuditFilters = { action: '', actor: '', from: '', to: '', page: 1 };

const DAY = /^(\d{4})-(\d{2})-(\d{2})$/;

function localDay(text: string): Date | null {
  const m = DAY.exec(text);
  if (!m) return null;
  const date = new Date(Number(m[1]), Number(m[2]) - 1, Number(m[3]));
  // Reject days that do not exist (2026-02-30 would roll over into March).
  return date.getMonth() === Number(m[2]) - 1 && date.getDate() === Number(m[3]) ? date : null;
}

function isAuditAction(value: string): value is AuditAction {
  return (AUDIT_ACTIONS as readonly string[]).includes(value);
}

/**
 * Reads the filters from the URL's search params, dropping anything malformed (an unknown
 * action, an impossible day, a page below 1), so a hand-edited URL shows the unfiltered log
 * rather than an error.
 */
export function readAuditFilters(params: URLSearchParams): AuditFilters {
  const action = params.get('action') ?? '';
  const from = params.get('from') ?? '';
  const to = params.get('to') ?? '';
  const page = Number(params.get('page') ?? '1');
  return {
    action: isAuditAction(action) ? action : '',
    actor: (params.get('actor') ?? '').trim(),
    from: localDay(from) ? from : '',
    to: localDay(to) ? to : '',
    page: Number.isInteger(page) && page >= 1 ? page : 1,
  };
}

/** Writes filters back as search params, leaving out empty ones and page 1, so URLs stay short. */
export function writeAuditFilters(filters: AuditFilters): URLSearchParams {
  const params = new URLSearchParams();
  if (filters.action) params.set('action', filters.action);
  if (filters.actor.trim()) params.set('actor', filters.actor.trim());
  if (filters.from) params.set('from', filters.from);
  if (filters.to) params.set('to', filters.to);
  if (filters.page > 1) params.set('page', String(filters.page));
  return params;
}

/**
 * Turns URL filters into the API's query: `from` becomes the first instant of that day and
 * `to` the last millisecond of that day, both in the reader's time zone, so a one-day range
 * (from = to) covers the whole day the reader means.
 */
export function toAuditQuery(filters: AuditFilters, pageSize: number): Partial<AuditQuery> {
  const from = localDay(filters.from);
  const toStart = localDay(filters.to);
  const to = toStart ? new Date(toStart.getFullYear(), toStart.getMonth(), toStart.getDate() + 1, 0, 0, 0, -1) : null;
  return {
    ...(filters.action ? { action: filters.action } : {}),
    ...(filters.actor ? { actor: filters.actor } : {}),
    ...(from ? { from: from.toISOString() } : {}),
    ...(to ? { to: to.toISOString() } : {}),
    page: filters.page,
    pageSize,
  };
}
