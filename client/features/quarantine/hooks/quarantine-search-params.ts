import { isReasonCode, type ReasonCode } from '../components/reason-labels.ts';

/** The quarantine page's filters as they live in the URL. */
export interface QuarantineFilters {
  loggerId: number | null;
  reason: ReasonCode | '';
  page: number;
}

const positiveInt = (text: string | null) => {
  const n = Number(text);
  return text !== null && Number.isInteger(n) && n >= 1 ? n : null;
};

/** Reads the filters from search params, dropping what is malformed (a hand-edited URL shows everything, not an error). */
export function readQuarantineFilters(params: URLSearchParams): QuarantineFilters {
  const reason = params.get('reason') ?? '';
  return { loggerId: positiveInt(params.get('loggerId')), reason: isReasonCode(reason) ? reason : '', page: positiveInt(params.get('page')) ?? 1 };
}

/** Writes filters as search params, leaving out empty ones and page 1. */
export function writeQuarantineFilters(filters: QuarantineFilters): URLSearchParams {
  const params = new URLSearchParams();
  if (filters.loggerId) params.set('loggerId', String(filters.loggerId));
  if (filters.reason) params.set('reason', filters.reason);
  if (filters.page > 1) params.set('page', String(filters.page));
  return params;
}
