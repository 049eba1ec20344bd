import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { TimePreviewAnswer, TimePreviewInput } from '@shared/contract/uploads.ts';
import { apiFetch } from '../../../lib/api-client.ts';

/** `POST /api/v1/labs/:lab/loggers/:loggerId/uploads/time-preview`: how the first time texts will be stored. */
export function previewUploadTimes(slug: string, loggerId: number, input: TimePreviewInput): Promise<TimePreviewAnswer> {
  return apiFetch(`/api/v1/labs/${encodeURIComponent(slug)}/loggers/${loggerId}/uploads/time-preview`, {
    method: 'POST',
    body: JSON.stringify(input),
  });
}

export const uploadTimesPreviewQueryOptions = (slug: string, loggerId: number, input: TimePreviewInput) =>
  queryOptions({
    queryKey: ['labs', slug, 'loggers', loggerId, 'upload-time-preview', input],
    queryFn: () => previewUploadTimes(slug, loggerId, input),
    // a refusal (a pattern it cannot read) will not change by asking again
    retry: false,
    placeholderData: keepPreviousData,
  });

/** The preview of an upload's time column; off while there is nothing to preview. */
export function useUploadTimesPreview(slug: string, loggerId: number, input: TimePreviewInput | null) {
  return useQuery({
    ...uploadTimesPreviewQueryOptions(slug, loggerId, input ?? { samples: [], timeFormat: 'auto', timeZone: 'UTC' }),
    enabled: input !== null,
  });
}
