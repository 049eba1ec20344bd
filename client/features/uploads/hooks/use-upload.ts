import { useCallback, useEffect, useRef, useState } from 'react';
import type { ImportProgress, ImportSummary, UploadOptions } from '@shared/contract/uploads.ts';
import { uploadFile } from '../api/upload-file.ts';

export type UploadState =
  | { phase: 'idle' }
  | { phase: 'running'; sent: number; total: number; progress: ImportProgress | null }
  | { phase: 'done'; summary: ImportSummary }
  | { phase: 'failed'; message: string; progress: ImportProgress | null };

/**
 * Runs one upload at a time and keeps its state for the page: bytes sent, the import's latest
 * progress line, then the summary or the reason it failed. `cancel` aborts a running upload;
 * leaving the page does too.
 */
export function useUpload(slug: string, loggerId: number) {
  const [state, setState] = useState<UploadState>({ phase: 'idle' });
  const abortRef = useRef<(() => void) | null>(null);
  useEffect(() => () => abortRef.current?.(), []);

  const start = useCallback(
    (file: File, options: UploadOptions) => {
      let progress: ImportProgress | null = null;
      setState({ phase: 'running', sent: 0, total: file.size, progress });
      const upload = uploadFile(slug, loggerId, file, options, {
        onSent: (sent, total) => setState((s) => (s.phase === 'running' ? { ...s, sent, total } : s)),
        onProgress: (p) => {
          progress = p;
          setState((s) => (s.phase === 'running' ? { ...s, progress: p } : s));
        },
      });
      abortRef.current = upload.abort;
      upload.done
        .then(
          (summary) => setState({ phase: 'done', summary }),
          (error: Error) => setState({ phase: 'failed', message: error.message, progress }),
        )
        .finally(() => {
          abortRef.current = null;
        });
    },
    [slug, loggerId],
  );
  const cancel = useCallback(() => abortRef.current?.(), []);
  const reset = useCallback(() => setState({ phase: 'idle' }), []);
  return { state, start, cancel, reset };
}
