import type { ReactNode } from 'react';
import { LoadingNote, Notice } from '../../../components/notice.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import type { LoggerDetail } from '@shared/contract/loggers.ts';
import { useLogger } from '../api/get-logger.ts';
import { LOGGER_NOTICES } from '../messages.ts';

/**
 * Loads one logger of the lab and renders `children` with it; meanwhile a loading note, and
 * for an id that is no logger of this lab (404, or 400 for a malformed id) one plain message.
 */
export function LoggerLoader({ slug, loggerId, children }: { slug: string; loggerId: number; children: (logger: LoggerDetail) => ReactNode }) {
  const logger = useLogger(slug, loggerId);
  if (logger.isPending) return <LoadingNote what="Loading the logger…" />;
  if (logger.isError) {
    const missing = logger.error instanceof ApiError && (logger.error.status === 404 || logger.error.status === 400);
    return <Notice tone="alert">{missing ? LOGGER_NOTICES.noSuchLogger : logger.error.message}</Notice>;
  }
  return children(logger.data.logger);
}
