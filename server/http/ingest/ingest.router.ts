import express, { Router } from 'express';
import { AppError } from '../../errors.ts';
import type { IngestService } from '../../services/ingest/ingest.service.ts';
import { readingsFromCsv, readingsFromJson } from '../../services/ingest/readings-from-body.ts';
import { createLoggerRateLimit } from './logger-rate-limit.ts';

export const INGEST_BODY_LIMIT = '8mb';

/**
 * `POST /api/v1/ingest` — loggers push readings with `Authorization: Bearer <ingest key>`,
 * as JSON (`{"readings":[…]}`) or CSV (`text/csv`, header `channel,ts,value`).
 * Order: key → rate limit → content type → body (bounded) → one all-or-nothing batch →
 * `200 {accepted, duplicates, quarantined}` only after COMMIT.
 */
export function ingestRouter(deps: { ingest: IngestService; rate?: { perSecond: number; burst: number } }): Router {
  const router = Router();
  const limiter = createLoggerRateLimit(deps.rate ?? { perSecond: 20, burst: 40 });
  const json = express.json({ limit: INGEST_BODY_LIMIT, type: ['application/json', 'application/*+json'] });
  const csv = express.text({ limit: INGEST_BODY_LIMIT, type: ['text/csv'] });

  router.post(
    '/api/v1/ingest',
    async (req, res, next) => {
      const header = req.get('authorization') ?? '';
      const presented = /^Bearer\s+(\S+)$/i.exec(header)?.[1];
      res.locals.logger = await deps.ingest.authenticate(presented);
      limiter.take(res.locals.logger.loggerId);
      if (!req.is(['application/json', 'application/*+json', 'text/csv'])) {
        throw new AppError(415, 'unsupported_media_type', 'Send readings as application/json or text/csv.');
      }
      next();
    },
    json,
    csv,
    async (req, res) => {
      const rows = req.is('text/csv') ? readingsFromCsv(typeof req.body === 'string' ? req.body : '') : readingsFromJson(req.body);
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
