/** Words of the person's own settings (`PATCH /api/v1/me`). */

/** Fields of the person's own settings. */
export const ME_LABELS = {
  timeZone: 'Your time zone',
  clock: 'Show times on',
} as const;
