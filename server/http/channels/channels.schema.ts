import { z } from 'zod';
import { parseReadingTime } from '../../services/ingest/parse-reading-time.ts';

/**
 * Query schemas of the channel browser, series, exports and diagnostics. Pure zod, shared with
 * the client. Times are epoch milliseconds or ISO 8601 with a zone (Z or ±hh:mm).
 */

/** Longest range a request may ask for (20 years of 365.25 days). */
export const MAX_RANGE_MS = 20 * 365.25 * 86_400_000;
/** Default range when from/to are left out: the 7 days up to now (to rounded up to the minute). */
export const DEFAULT_RANGE_MS = 7 * 86_400_000;

const ZONED_ISO = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d{1,9})?)?(Z|[+-]\d{2}:\d{2})$/;
const TIME_MESSAGE = 'must be epoch milliseconds or an ISO 8601 time with a zone, e.g. 2026-03-01T00:00:00Z';

export const timeParam = z
  .string()
  .trim()
  .transform((s, ctx) => {
    if (!/^-?\d{1,16}$/.test(s) && !ZONED_ISO.test(s)) {
      ctx.addIssue({ code: 'custom', message: TIME_MESSAGE });
      return z.NEVER;
    }
    // the calendar and offset checks of ingestion (no 30 February, offsets −12:00…+14:00)
    const parsed = parseReadingTime(s);
    if (!parsed.ok) {
      ctx.addIssue({ code: 'custom', message: parsed.reason.replace(/^ts: /, '') });
      return z.NEVER;
    }
    return parsed.ts;
  });

const wholeNumber = (min: number, max: number) =>
  z.coerce
    .number({ error: 'must be a number' })
    .int('must be a whole number')
    .min(min, `must be at least ${min}`)
    .max(max, `must be at most ${max}`);

const rangeFields = { from: timeParam.optional(), to: timeParam.optional() };

type RangeInput = { from?: number; to?: number };

/** Fills the default range and checks from < to and the 20-year limit. */
function resolveRange<T extends RangeInput>(q: T, ctx: z.RefinementCtx, now: () => number): Omit<T, 'from' | 'to'> & { from: number; to: number } {
  const to = q.to ?? Math.ceil(now() / 60_000) * 60_000;
  const from = q.from ?? to - DEFAULT_RANGE_MS;
  if (!(from < to)) ctx.addIssue({ code: 'custom', path: ['to'], message: 'must be after from' });
  else if (to - from > MAX_RANGE_MS) ctx.addIssue({ code: 'custom', path: ['to'], message: 'the range must be at most 20 years' });
  return { ...q, from, to };
}

export const channelParams = z.object({ channelId: wholeNumber(1, Number.MAX_SAFE_INTEGER) });

/** `GET …/channels/:channelId/series?from&to&points`. */
export const seriesQuery = (now: () => number = Date.now) =>
  z.object({ ...rangeFields, points: wholeNumber(10, 10_000).default(2000) }).transform((q, ctx) => resolveRange(q, ctx, now));

/** `GET …/channels/:channelId/readings.csv?from&to`. */
export const readingsExportQuery = (now: () => number = Date.now) =>
  z.object(rangeFields).transform((q, ctx) => resolveRange(q, ctx, now));

const periodParam = z
  .string()
  .trim()
  .transform((s, ctx) => {
    if (s === 'auto' || s === 'none') return s;
    const n = /^\d+$/.test(s) ? Number(s) : NaN;
    if (!Number.isInteger(n) || n < 2 || n > 100_000) {
      ctx.addIssue({ code: 'custom', message: 'must be auto, none or a whole number of steps from 2 to 100000' });
      return z.NEVER;
    }
    return n;
  });

/** `GET …/channels/:channelId/diagnostics?…` (and diagnostics.csv). */
export const diagnosticsQuery = (now: () => number = Date.now) =>
  z
    .object({
      ...rangeFields,
      step: wholeNumber(1, 31 * 86_400).optional(),
      agg: z.enum(['mean', 'median', 'last', 'min', 'max'], { error: 'must be mean, median, last, min or max' }).default('mean'),
      difference: wholeNumber(0, 2).default(0),
      seasonalDifference: wholeNumber(0, 1).default(0),
      maxLag: wholeNumber(1, 10_000).optional(),
      period: periodParam.default('auto'),
      decomposition: z.enum(['stl', 'stl-robust', 'classical', 'none'], { error: 'must be stl, stl-robust, classical or none' }).default('stl'),
      alpha: z.coerce.number({ error: 'must be a number' }).gt(0, 'must be above 0').max(0.5, 'must be at most 0.5').default(0.05),
      ccfWith: wholeNumber(1, Number.MAX_SAFE_INTEGER).optional(),
      ccfMaxLag: wholeNumber(1, 10_000).optional(),
    })
    .refine((q) => !(q.seasonalDifference > 0 && q.period === 'none'), { path: ['seasonalDifference'], message: 'needs a period (auto or a number of steps), not none' })
    .refine((q) => q.ccfMaxLag === undefined || q.ccfWith !== undefined, { path: ['ccfMaxLag'], message: 'needs ccfWith' })
    .transform((q, ctx) => resolveRange(q, ctx, now));

export type DiagnosticsQuery = z.infer<ReturnType<typeof diagnosticsQuery>>;

/** A time that must be given. */
const requiredTime = z.string({ error: 'is required: epoch milliseconds or an ISO 8601 time with a zone' }).pipe(timeParam);

/** Checks one comparison range: start before end, at most 20 years. */
function checkRange(from: number, to: number, path: string, ctx: z.RefinementCtx): void {
  if (!(from < to)) ctx.addIssue({ code: 'custom', path: [path], message: 'must be after the start of its range' });
  else if (to - from > MAX_RANGE_MS) ctx.addIssue({ code: 'custom', path: [path], message: 'the range must be at most 20 years' });
}

/**
 * `GET …/channels/:channelId/comparison?aFrom&aTo&bFrom&bTo…`: range a of this channel against
 * range b of `otherChannel` (this channel when left out).
 */
export const comparisonQuery = z
  .object({
    aFrom: requiredTime,
    aTo: requiredTime,
    bFrom: requiredTime,
    bTo: requiredTime,
    step: wholeNumber(1, 31 * 86_400).optional(),
    agg: z.enum(['mean', 'median', 'last', 'min', 'max'], { error: 'must be mean, median, last, min or max' }).default('mean'),
    otherChannel: wholeNumber(1, Number.MAX_SAFE_INTEGER).optional(),
    alpha: z.coerce.number({ error: 'must be a number' }).gt(0, 'must be above 0').max(0.5, 'must be at most 0.5').default(0.05),
  })
  .superRefine((q, ctx) => {
    checkRange(q.aFrom, q.aTo, 'aTo', ctx);
    checkRange(q.bFrom, q.bTo, 'bTo', ctx);
  });

export type ComparisonQuery = z.infer<typeof comparisonQuery>;
