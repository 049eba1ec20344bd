/**
 * Words of the channel browser's queries (ranges, chart points): labels and reasons, shared by
 * the contract and the client.
 */

/** Fields of a range query and of the chart series. */
export const RANGE_LABELS = {
  from: 'From',
  to: 'To',
  points: 'Points on the chart',
  channelId: 'Channel',
} as const;

/** Reasons the range checks give. */
export const RANGE_REASONS = {
  time: 'must be a date and time with its zone, e.g. 2026-03-01T00:00:00Z, or milliseconds since 1970',
  toAfterFrom: 'must be after the start of the range',
  rangeMax: 'the range must be at most 20 years',
} as const;
