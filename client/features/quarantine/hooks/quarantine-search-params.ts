import { isReasonCode, type ReasonCode } from '../components/reason-labels.ts';

/** The quarantine page's filters as they live in the URL. */
export interface QuarantineFilters {
  loggerId: number | null;
  reason: ReasonCode | '';
  /** The channel name as received ('' = any). */
  channel: string;
  /** Where the shown page starts: the `nextCursor` the page before it gave (null: the newest rows). */
  cursor: string | null;
}

/** The shape of the server's cursors (`receivedAtMs.rowIndex.id`); anything else is dropped. */
const CURSOR = /^\d{1,15}\.\d{1,10}\.\d{1,16}$/;

const positiveInt = (text: string | null) => {
  const n = Number(text);
  return text !== null && Number.isInteger(n) && n >= 1 ? n : null;
};

/** Reads the filters from search params, dropping what is malformed (a hand-edited URL shows everything, not an error). */
export function readQuarantineFilters(params: URLSearchParams): QuarantineFilters {
  const reason = params.get('reason') ?? '';
  const cursor = params.get('cursor');
  const channel = (params.get('channel') ?? '').trim();
  return {
    loggerId: positiveInt(params.get('loggerId')),
    reason: isReasonCode(reason) ? reason : '',
    channel: channel.length <= 191 ? channel : '',
    cursor: cursor && CURSOR.test(cursor) ? cursor : null,
  };
}

/** Writes filters as search params, leaving out empty ones and the first page's (absent) cursor. */
export function writeQuarantineFilters(filters: QuarantineFilters): URLSearchParams {
  const params = new URLSearchParams();
  if (filters.loggerId) params.set('loggerId', String(filters.loggerId));
  if (filters.reason) params.set('reason', filters.reason);
  if (filters.channel) params.set('channel', filters.channel);
  if (filters.cursor) params.set('cursor', filters.cursor);
  return params;
}
