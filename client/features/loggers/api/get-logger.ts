import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client.ts';
import type { LoggerAnswer } from '@shared/contract/loggers.ts';
import { loggersRootKey } from './get-loggers.ts';

/** `GET /api/v1/labs/:lab/loggers/:loggerId`. */
export function getLogger(slug: string, loggerId: number): Promise<LoggerAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/loggers/${loggerId}`);
}

export const loggerQueryOptions = (slug: string, loggerId: number) =>
  queryOptions({ queryKey: [...loggersRootKey(slug), 'one', loggerId], queryFn: () => getLogger(slug, loggerId) });

/** One logger of the lab; a 404 ApiError when there is no such logger in this lab. */
export function useLogger(slug: string, loggerId: number) {
  return useQuery(loggerQueryOptions(slug, loggerId));
}
