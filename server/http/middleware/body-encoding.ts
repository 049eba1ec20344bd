import type { Request, RequestHandler } from 'express';
import { AppError } from '../../errors.ts';

/** Content codings the body parsers decompress. Brotli, zstd and `compress` are refused. */
export const SUPPORTED_CONTENT_ENCODINGS = ['identity', 'gzip', 'deflate'] as const;
/** Charsets accepted for JSON and text bodies: UTF-8 (RFC 8259 §8.1 requires it for JSON), and ASCII, its subset. */
const UTF8_NAMES = new Set(['utf-8', 'utf8', 'us-ascii']);
const CHARSET = /;\s*charset\s*=\s*"?([^";\s]*)"?/i;

/** 415 for a body in a content coding or charset Lagbook does not read. */
export class UnsupportedBodyError extends AppError {
  constructor(code: 'unsupported_encoding' | 'unsupported_charset', message: string) {
    super(415, code, message);
  }
}

const hasBody = (req: Request) => req.get('transfer-encoding') !== undefined || (req.get('content-length') ?? '0') !== '0';

/**
 * Refuses, before any body is read, what the body parsers would otherwise fail on in ways that
 * are hard to answer well: a `Content-Encoding` other than identity, gzip or deflate (or more
 * than one), and a JSON or text body declared in a charset other than UTF-8. Both get 415 in the
 * usual error shape, naming what is accepted. Mounted once for every route.
 */
export function bodyEncodingGuard(): RequestHandler {
  return (req, _res, next) => {
    if (!hasBody(req)) return next();
    const encoding = req.get('content-encoding');
    if (encoding !== undefined) {
      const codings = encoding
        .toLowerCase()
        .split(',')
        .map((c) => c.trim())
        .filter((c) => c !== '' && c !== 'identity');
      if (codings.length > 1 || (codings.length === 1 && !(SUPPORTED_CONTENT_ENCODINGS as readonly string[]).includes(codings[0]))) {
        return next(
          new UnsupportedBodyError(
            'unsupported_encoding',
            `Content-Encoding "${encoding.slice(0, 40)}" is not supported; send the body uncompressed, or compressed once with gzip or deflate.`,
          ),
        );
      }
    }
    const type = req.get('content-type') ?? '';
    const charset = CHARSET.exec(type)?.[1];
    if (charset !== undefined && /^\s*(application\/([\w.+-]*\+)?json|text\/)/i.test(type) && !UTF8_NAMES.has(charset.toLowerCase())) {
      return next(new UnsupportedBodyError('unsupported_charset', `charset "${charset.slice(0, 40)}" is not supported; send the body as UTF-8.`));
    }
    next();
  };
}

/** Deepest nesting accepted in a JSON body on the session routes (their schemas need a handful of levels). */
export const MAX_BODY_DEPTH = 64;

/**
 * A `verify` hook for `express.json`: refuses (400) a body nested deeper than `MAX_BODY_DEPTH`
 * before it is parsed, so nothing later (a schema, a log line, JSON.stringify) recurses through
 * thousands of levels and overflows the stack. One pass over the bytes; every byte that opens
 * or closes a string or container is ASCII, so UTF-8 needs no decoding.
 */
export function refuseDeepJson(_req: unknown, _res: unknown, buf: Buffer): void {
  let depth = 0;
  let inString = false;
  let escaped = false;
  for (let i = 0; i < buf.length; i++) {
    const c = buf[i];
    if (inString) {
      if (escaped) escaped = false;
      else if (c === 0x5c) escaped = true;
      else if (c === 0x22) inString = false;
    } else if (c === 0x22) inString = true;
    else if (c === 0x7b || c === 0x5b) {
      if (++depth > MAX_BODY_DEPTH) throw new AppError(400, 'invalid_input', `The request is nested deeper than ${MAX_BODY_DEPTH} levels.`);
    } else if (c === 0x7d || c === 0x5d) depth--;
  }
}
