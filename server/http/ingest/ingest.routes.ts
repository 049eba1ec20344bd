import express, { type RequestHandler } from 'express';
import { AppError } from '../../errors.ts';
import type { RateLimit } from '../middleware/rate-limits.ts';
import type { AuthenticatedLogger, IngestService } from '../../services/ingest/ingest.service.ts';
import { readingsFromCsvBody, readingsFromJsonBody } from '../../services/ingest/readings-from-body.ts';
import { ingestCsvBody, ingestJsonBody, type IngestAnswer } from '../../contract/ingest.ts';
import { presentIngestOutcome } from '../presenters/loggers.presenter.ts';
import { defineRoute, type Route } from '../routes/route.ts';
import { createLoggerRateLimit } from './logger-rate-limit.ts';
import { createFailedKeyLimit } from './failed-key-limit.ts';

export const INGEST_BODY_LIMIT = '8mb';

const JSON_TYPES = ['application/json', 'application/*+json'];

/** Every answer of `POST /api/v1/ingest` beyond 200, with the error codes it carries. */
const INGEST_ERRORS: Record<number, string> = {
  400: '`invalid_input`: not valid JSON or CSV, the wrong shape, a CSV header without channel, ts and value, or JSON nested deeper than 32 levels; `corrupt_body`: a gzip or deflate body that does not decompress.',
  401: '`invalid_ingest_key`: a missing, unknown or revoked key (one answer for all).',
  402: "`plan_limit_reached`: the batch would take the lab past its plan's stored readings, or its quarantine past the plan's quarantined-rows cap (`quarantinedRows` in the plan catalog). Nothing of the batch is stored, its good readings included. Retry-After (3600 s); the same batch succeeds once an admin raises the plan or, for the quarantine, a technician discards or re-submits quarantined rows.",
  413: '`too_many_readings`: more than 100,000 readings in one request (send the rest in further requests); `payload_too_large`: a body over 8 MB after decompression.',
  415: '`unsupported_media_type` (send application/json or text/csv), `unsupported_charset` (only UTF-8) or `unsupported_encoding` (Content-Encoding other than gzip or deflate).',
  422: '`too_many_quarantined`: more than 1,000 rows of the batch would go to quarantine (a field missing, the wrong number of CSV fields, not an object, an unknown channel, an unreadable time or value); nothing of the batch is stored. When the body reader caught it, `error.sample` lists the first rows with their reasons.',
  429: '`rate_limited`: this logger posts faster than 20 requests/s (bursts of 40); `too_many_wrong_keys`: more than 20 wrong keys from this address within a minute (counted per app process; a key that worked recently still gets through). Retry-After gives the seconds to wait.',
};

/**
 * `POST /api/v1/ingest` — loggers push readings with `Authorization: Bearer <ingest key>`,
 * as JSON (`{"readings":[…]}`) or CSV (`text/csv`, header `channel,ts,value`), UTF-8, optionally
 * gzip- or deflate-compressed. Order: wrong-key throttle (per address) → key → rate limit (per
 * logger) → content type → body (at most 8 MB) → rows, read in slices that yield to other
 * requests (at most 100,000 readings: 413; more than 1,000 unreadable rows: 422, nothing stored)
 * → one all-or-nothing batch → `200 {accepted, duplicates, quarantined}` only after COMMIT.
 * It needs no session: the route table mounts it before the session middleware and the JSON
 * parser (auth `ingest-key`), so it reads its own body.
 */
export function ingestRoutes(deps: { ingest: IngestService; rate?: { perSecond: number; burst: number }; failedKeys?: RateLimit }): Route[] {
  const limiter = createLoggerRateLimit(deps.rate ?? { perSecond: 20, burst: 40 });
  const wrongKeys = createFailedKeyLimit(deps.failedKeys);
  // The key, the logger's allowance and the media type, checked before any of the body is read.
  const checkKey: RequestHandler = async (req, res, next) => {
    const header = req.get('authorization') ?? '';
    const presented = /^Bearer\s+(\S+)$/i.exec(header)?.[1];
    res.locals.logger = await deps.ingest.authenticate(presented);
    wrongKeys.remember(req);
    limiter.take((res.locals.logger as AuthenticatedLogger).loggerId);
    if (!req.is([...JSON_TYPES, 'text/csv'])) {
      throw new AppError(415, 'unsupported_media_type', 'Send readings as application/json or text/csv.');
    }
    next();
  };
  // The body as bytes (decompressed, size-limited by body-parser); the handler reads it into rows.
  const raw = express.raw({ limit: INGEST_BODY_LIMIT, type: () => true });

  return [
    defineRoute({
      method: 'post',
      path: '/api/v1/ingest',
      auth: 'ingest-key',
      tag: 'ingest',
      summary:
        'A logger posts readings with its ingest key, as JSON or as CSV (header channel,ts,value); 200 means committed, bad rows are quarantined with reasons.',
      bodyMediaTypes: { 'application/json': ingestJsonBody, 'text/csv': ingestCsvBody },
      response: { status: 200, description: 'Committed: `{ accepted, duplicates, quarantined: [{ index, code, reason }] }`, accounting for every row sent.' },
      errors: INGEST_ERRORS,
      before: [wrongKeys.middleware, checkKey, raw],
      // it reads the raw body the `before` step collected, and the logger its key belongs to
      stream: true,
      handle: async (_input, { req, res }) => {
        const body = Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0);
        const rows = req.is('text/csv') ? await readingsFromCsvBody(body.toString('utf8')) : await readingsFromJsonBody(body);
        const outcome = await deps.ingest.ingest(res.locals.logger as AuthenticatedLogger, rows, { source: 'api' });
        res.json(presentIngestOutcome(outcome) satisfies IngestAnswer);
      },
    }),
  ];
}
