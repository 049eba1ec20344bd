import type { ErrorRequestHandler } from 'express';
import { ZodError } from 'zod';
import { AppError, ServiceUnavailableError, ValidationError } from '../../errors.ts';
import type { LogWriter } from '../../log-writer.ts';
import { problemsMessage, problemsOfIssues, type FieldProblem } from '../../contract/words/fields.ts';
import { isDatabaseFull, isDatabaseReadOnly, isDatabaseUnavailable, isLockConflict, isNodeNotReady } from '../../db/db-errors.ts';

/**
 * Turns a ZodError into the one invalid-input answer: `fields` keeps each refused field's key
 * path for programs and form placement, and `message` is for people, one `Label: reason.` per
 * field with the labels of the route's message catalogue (server/contract/words/), so no key
 * name reaches a person ("Highest valid value: must be above the lowest valid value.").
 */
export function zodToValidationError(err: ZodError, routePath?: string): ValidationError {
  const fields = problemsOfIssues(err.issues, routePath);
  return new ValidationError(problemsMessage(fields), fields);
}

/** The `fields` of an answer: an error's details when they are field problems (see FieldProblem). */
function fieldsOf(error: AppError): FieldProblem[] | undefined {
  const d = error.details;
  if (!Array.isArray(d) || d.length === 0) return undefined;
  const ok = d.every((p) => p && typeof p === 'object' && typeof p.field === 'string' && typeof p.reason === 'string' && typeof p.label === 'string');
  return ok ? (d as FieldProblem[]) : undefined;
}

/**
 * The typed error for a failure of reading a request body (body-parser's errors carry a 4xx
 * status and a `type`; decompression errors carry zlib's `Z_…` code), or null for anything else.
 */
function bodyParserError(err: unknown): AppError | null {
  const bp = err as { status?: number; type?: string; expose?: boolean; code?: string; message?: string } | null;
  if (!bp || typeof bp !== 'object' || typeof bp.status !== 'number' || bp.status < 400 || bp.status >= 500) return null;
  switch (bp.type) {
    case 'entity.too.large':
      return new AppError(413, 'payload_too_large', 'The request body is too large.');
    case 'entity.parse.failed':
      return new ValidationError('The request could not be read: it is not valid JSON.');
    case 'charset.unsupported':
      return new AppError(415, 'unsupported_charset', 'The request could not be read: only UTF-8 text is accepted.');
    case 'encoding.unsupported':
      return new AppError(415, 'unsupported_encoding', 'The request could not be read: only uncompressed, gzip or deflate bodies are accepted.');
  }
  if (typeof bp.code === 'string' && bp.code.startsWith('Z_')) {
    return new AppError(400, 'corrupt_body', 'The request could not be read: its compressed body is corrupt or cut short (it says gzip or deflate).');
  }
  if (bp.expose) return new AppError(bp.status, 'bad_request', 'The request could not be read.');
  return null;
}

/**
 * The one error middleware: typed errors become `{ error: { code, message, fields? } }` with
 * their status (`fields` lists refused fields by key); body-parser failures (too large, bad JSON, unsupported charset or coding, corrupt
 * gzip) become 4xx; an unreachable database, a cluster node that is not ready (Galera's 1047) and a
 * lock conflict that survived its retries (`retry-transaction.ts`) become 503 with Retry-After;
 * anything else is logged and answered 500 without internals.
 */
export function errorHandler(logger: LogWriter): ErrorRequestHandler {
  return (err, req, res, _next) => {
    let error: unknown = err;
    if (error instanceof ZodError) error = zodToValidationError(error);
    if (!(error instanceof AppError) && isDatabaseReadOnly(error)) {
      error = new ServiceUnavailableError(
        'The database accepts no changes right now (read-only, e.g. during maintenance); nothing was saved. Try again later.',
        30,
      );
    } else if (!(error instanceof AppError) && isDatabaseFull(error)) {
      error = new ServiceUnavailableError(
        'The database has no room left (its disk or tablespace is full); nothing was saved. Operators must free space or grow the disk; try again later.',
        300,
      );
    } else if (!(error instanceof AppError) && isNodeNotReady(error)) {
      error = new ServiceUnavailableError('The database is rejoining its cluster and not ready yet; nothing was saved. Try again shortly.', 2);
    } else if (!(error instanceof AppError) && isDatabaseUnavailable(error)) {
      error = new ServiceUnavailableError('The database is unreachable; try again shortly.');
    } else if (!(error instanceof AppError) && isLockConflict(error)) {
      error = new ServiceUnavailableError('The database was busy with a conflicting change; nothing was saved. Try again.', 1);
    }
    if (!(error instanceof AppError)) error = bodyParserError(err) ?? error;
    if (error instanceof AppError) {
      if (error.retryAfterSeconds !== undefined && !res.headersSent) res.set('Retry-After', String(error.retryAfterSeconds));
      if (error.status >= 500)
        logger.warn('request failed', { path: req.path, code: error.code, cause: (err as { code?: string; name?: string })?.code ?? (err as Error)?.name });
      if (res.headersSent) return;
      // a batch refused whole shows the first rows it could not read (see TooManyQuarantinedError)
      const sample = (error as { sample?: unknown }).sample;
      const fields = fieldsOf(error);
      res
        .status(error.status)
        .json({ error: { code: error.code, message: error.message, ...(fields ? { fields } : {}), ...(Array.isArray(sample) ? { sample } : {}) } });
      return;
    }
    logger.error('unexpected error', { path: req.path, err: (err as Error)?.stack ?? String(err) });
    if (res.headersSent) return;
    res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on our side.' } });
  };
}
