import type { ErrorAnswer } from '@shared/contract/common.ts';
import type { ImportProgress, ImportSummary, UploadLine, UploadOptions } from '@shared/contract/uploads.ts';
import { ApiError } from '../../../lib/api-client.ts';
import { createNdjsonReader } from './ndjson-reader.ts';
import { UPLOAD_MESSAGES, uploadRefused } from '../messages.ts';

export interface UploadHandlers {
  /** Bytes of the file sent so far (from the browser's upload progress). */
  onSent?: (loaded: number, total: number) => void;
  /** A `progress` line of the server's NDJSON answer. */
  onProgress?: (progress: ImportProgress) => void;
}

const isLine = (v: unknown): v is UploadLine => typeof v === 'object' && v !== null && typeof (v as { type?: unknown }).type === 'string';

/**
 * `POST /api/v1/labs/:lab/loggers/:loggerId/uploads?options=…` with the file as the raw body.
 * XMLHttpRequest rather than fetch, because only it reports upload progress in bytes; its
 * answer (NDJSON: progress lines, then a summary or an error line) is read as it streams in.
 * Resolves with the summary; rejects with an ApiError for a refusal (JSON error before the
 * import began), an `error` line, a lost connection or `abort()`.
 */
export function uploadFile(slug: string, loggerId: number, file: Blob, options: UploadOptions, handlers: UploadHandlers = {}) {
  const xhr = new XMLHttpRequest();
  const reader = createNdjsonReader();
  let seen = 0;
  let summary: ImportSummary | null = null;
  let failure: ApiError | null = null;

  const take = (lines: unknown[]) => {
    for (const line of lines) {
      if (!isLine(line)) continue;
      if (line.type === 'progress') handlers.onProgress?.(line);
      else if (line.type === 'summary') summary = line;
      // The answer itself was 200: the import began, then stopped and said why.
      else if (line.type === 'error') failure = new ApiError(xhr.status, line.code, line.message);
    }
  };
  const readNew = () => {
    const text = xhr.responseText;
    take(reader.push(text.slice(seen)));
    seen = text.length;
  };

  const done = new Promise<ImportSummary>((resolve, reject) => {
    xhr.upload.onprogress = (e) => handlers.onSent?.(e.loaded, e.lengthComputable ? e.total : file.size);
    xhr.onprogress = () => {
      if (xhr.status === 200) readNew();
    };
    xhr.onload = () => {
      if (xhr.status !== 200) {
        // a refusal before the import began is the API's error body (or, from a proxy, not JSON at all)
        let body: Partial<ErrorAnswer> | null;
        try {
          body = JSON.parse(xhr.responseText);
        } catch {
          body = null;
        }
        reject(new ApiError(xhr.status, body?.error?.code ?? 'unknown', body?.error?.message ?? uploadRefused(xhr.status)));
        return;
      }
      readNew();
      take(reader.end());
      if (failure) reject(failure);
      else if (summary) resolve(summary);
      else reject(new ApiError(0, 'no_summary', 'The import stopped without a summary. What was stored is kept; send the file again to finish.'));
    };
    xhr.onerror = () => reject(new ApiError(0, 'network', UPLOAD_MESSAGES.connectionLost));
    xhr.onabort = () => reject(new ApiError(0, 'aborted', UPLOAD_MESSAGES.cancelled));
  });

  xhr.open('POST', `/api/v1/labs/${encodeURIComponent(slug)}/loggers/${loggerId}/uploads?options=${encodeURIComponent(JSON.stringify(options))}`);
  xhr.setRequestHeader('Content-Type', 'text/csv');
  xhr.setRequestHeader('Accept', 'application/x-ndjson, application/json');
  xhr.send(file);
  return { done, abort: () => xhr.abort() };
}
