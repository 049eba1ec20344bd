/**
 * Words of the loggers area (loggers, their channels, ingest keys, test readings): the label of
 * every input field as the forms name it, and the reasons its own checks give. Shared by the
 * contract schemas, the services' refusals and the client's forms (`@shared/contract/words/loggers.ts`).
 */

/** Fields of a logger (`POST/PATCH …/loggers`). */
export const LOGGER_LABELS = {
  name: 'Name',
  serial: 'Serial number',
  site: 'Site',
  timezone: "Logger's time zone",
  expectedIntervalS: 'Expected time between readings',
  channels: 'Channels',
  includeRetired: 'Show retired loggers',
  rotate: 'Stop the older keys',
  loggerId: 'Logger',
} as const;

/** Fields of a channel (`POST/PATCH …/channels`, and each channel of a new logger). */
export const CHANNEL_LABELS = {
  key: 'Channel key',
  label: 'Label',
  unit: 'Unit',
  quantity: 'Quantity measured',
  validMin: 'Lowest valid value',
  validMax: 'Highest valid value',
  expectedIntervalS: 'Expected time between readings',
  seasonalPeriodHint: 'Readings in one cycle',
  channelId: 'Channel',
} as const;

/** Fields of a test reading sent by hand (`POST …/test-readings`). */
export const TEST_READING_LABELS = {
  channel: 'Channel',
  value: 'Value',
  confirmOutsideRange: 'Store it although it is outside the valid range',
  testReadingId: 'Test reading',
} as const;

/** Reasons the loggers area's own checks give. */
export const LOGGER_REASONS = {
  channelKey: 'use 1 to 64 letters, digits, "_", "." or "-", starting with a letter or digit',
  intervalWhole: 'must be a whole number of seconds',
  intervalMin: 'must be at least 1 second',
  intervalMax: 'must be at most 7 days (604,800 seconds)',
  validRangeOrder: 'must be above the lowest valid value',
  channelsMax: 'a logger has at most 64 channels',
  channelKeysUnique: 'each channel of a logger needs its own channel key',
  testValueRange: 'must lie between -1,000,000,000,000 and 1,000,000,000,000 (a test reading is a plausible measurement)',
} as const;
