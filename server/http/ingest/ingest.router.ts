import express, { Router } from 'express';
import { AppError } from '../../errors.ts';
import type { RateLimit } from '../middleware/rate-limits.ts';
import type { IngestService } from '../../services/ingest/ingest.service.ts';
import { readingsFromCsvBody, readingsFromJsonBody } from '../../services/ingest/readings-from-body.ts';
import { createLoggerRateLimit } from './logger-rate-limit.ts';
import { createFailedKeyLimit } from './failed-key-limit.ts';

export const INGEST_BODY_LIMIT = '8mb';

const JSON_TYPES = ['application/json', 'application/*+json'];

/**
 * `POST /api/v1/ingest` — loggers push readings with `Authorization: Bearer <ingest key>`,
 * as JSON (`{"readings":[…]}`) or CSV (`text/csv`, header `channel,ts,value`), UTF-8, optionally
 * gzip- or deflate-compressed. Order: wrong-key throttle (per address) → key → rate limit (per
 * logger) → content type → body (at most 8 MB) → rows, read in slices that yield to other
 * requests (at most 100,000 readings: 413; more than 1,000 unreadable rows: 422, nothing stored)
 * → one all-or-nothing batch → `200 {accepted, duplicates, quarantined}` only after COMMIT.
 */
export function ingestRouter(deps: { ingest: IngestService; rate?: { perSecond: number; burst: number }; failedKeys?: RateLimit }): Router {
  const router = Router();
  const limiter = createLoggerRateLimit(deps.rate ?? { perSecond: 20, burst: 40 });
  const wrongKeys = createFailedKeyLimit(deps.failedKeys);
  // The body as bytes (decompressed, size-limited by body-parser); it is read into rows below.
  const raw = express.raw({ limit: INGEST_BODY_LIMIT, type: () => true });

  router.post(
    '/api/v1/ingest',
    wrongKeys.middleware,
    async (req, res, next) => {
      const header = req.get('authorization') ?? '';
      const presented = /^Bearer\s+(\S+)$/i.exec(header)?.[1];
      res.locals.logger = await deps.ingest.authenticate(presented);
      wrongKeys.remember(req);
      limiter.take(res.locals.logger.loggerId);
      if (!req.is([...JSON_TYPES, 'text/csv'])) {
        throw new AppError(415, 'unsupported_media_type', 'Send readings as application/json or text/csv.');
      }
      next();
    },
    raw,
    async (req, res) => {
      const body = Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0);
      const rows = req.is('text/csv') ? await readingsFromCsvBody(body.toString('utf8')) : await readingsFromJsonBody(body);
      const outcome = await deps.ingest.ingest(res.locals.logger, rows, { source: 'api' });
      res.json({
        accepted: outcome.accepted,
        duplicates: outcome.duplicates,
        quarantined: outcome.quarantined.map((q) => ({ index: q.index, code: q.code, reason: q.reason })),
      });
    },
  );
  return router;
}
