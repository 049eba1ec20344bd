import { AppError } from '../../errors.ts';
import { loggerParams } from '../../contract/loggers.ts';
import {
  MAX_UPLOAD_BYTES,
  timePreviewSchema,
  UPLOAD_MEDIA_TYPES,
  uploadCsvBody,
  uploadQuerySchema,
  type TimePreviewAnswer,
  type UploadLine,
} from '../../contract/uploads.ts';
import type { UploadsService } from '../../services/uploads.service.ts';
import type { LogWriter } from '../../log-writer.ts';
import { defineRoute, type Route } from '../routes/route.ts';

/**
 * `POST /api/v1/labs/:lab/loggers/:loggerId/uploads?options=<json>` — a historical export
 * file as the raw request body (text/csv). The handler streams the request itself into the
 * import (no body parser reads it) and answers NDJSON: `progress` lines after each stored batch,
 * then one `summary` (or `error`) line.
 */
export function uploadRoutes(deps: { uploads: UploadsService; logger: LogWriter }): Route[] {
  return [
    defineRoute({
      method: 'post',
      path: '/loggers/:loggerId/uploads/time-preview',
      auth: { permission: 'uploads.create' },
      summary:
        "How an upload's first time texts will be read: each as received, the instant stored (UTC and the zone's wall clock) or why it cannot be read, rows the layouts read differently, and the layout the rows suggest.",
      params: loggerParams,
      body: timePreviewSchema,
      response: { status: 200, description: 'The rows as they will be stored, the layout used and the guess.' },
      errors: { 409: "`logger_retired`: a retired logger's history cannot be extended." },
      handle: async ({ lab, params, body }): Promise<TimePreviewAnswer> => {
        await deps.uploads.targetFor(lab, params.loggerId);
        return deps.uploads.previewTimes(body);
      },
    }),
    defineRoute({
      method: 'post',
      path: '/loggers/:loggerId/uploads',
      auth: { permission: 'uploads.create' },
      summary: "Upload a logger's historical export file (text/csv); progress and a summary stream back as NDJSON.",
      params: loggerParams,
      query: uploadQuerySchema,
      bodyMediaTypes: { 'text/csv': uploadCsvBody },
      response: {
        status: 200,
        description:
          'NDJSON, one line per event: `progress` after each stored batch, then `summary`, or `error` if the import stopped (what was stored is kept).',
        mediaType: 'application/x-ndjson',
      },
      errors: {
        409: "`logger_retired`: a retired logger's history cannot be extended.",
        413: '`payload_too_large`: the file is larger than 2 GB (Content-Length); split it and upload the parts.',
        415: '`unsupported_media_type`: upload the export file as text/csv.',
      },
      stream: true,
      handle: async ({ lab, params, query, actor }, { req, res }) => {
        const target = await deps.uploads.targetFor(lab, params.loggerId);
        const layout = deps.uploads.layoutOf(query.options);
        if (!req.is(UPLOAD_MEDIA_TYPES)) throw new AppError(415, 'unsupported_media_type', 'Upload the export file as text/csv.');
        const declared = Number(req.get('content-length') ?? 0);
        if (declared > MAX_UPLOAD_BYTES) throw new AppError(413, 'payload_too_large', 'The file is larger than 2 GB; split it and upload the parts.');

        res.status(200).set('Content-Type', 'application/x-ndjson; charset=utf-8').set('Cache-Control', 'no-store');
        res.flushHeaders();
        const line = (l: UploadLine) => res.write(`${JSON.stringify(l)}\n`);
        try {
          const summary = await deps.uploads.run(target, req, layout, (p) => line({ type: 'progress', ...p }), actor);
          line({ type: 'summary', ...summary });
        } catch (err) {
          const e = err as AppError;
          if (!(err instanceof AppError)) deps.logger.warn('upload failed', { loggerId: params.loggerId, reason: (err as Error).message });
          line({
            type: 'error',
            code: e.code ?? 'upload_failed',
            message:
              err instanceof AppError
                ? e.message
                : 'The upload stopped: what was stored before this point is kept; send the file again to finish (stored rows count as duplicates).',
          });
          req.unpipe();
          req.resume();
        }
        res.end();
      },
    }),
  ];
}
