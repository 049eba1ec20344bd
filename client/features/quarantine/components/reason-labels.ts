/** The quarantine reason codes the server uses (API contract, "Reason codes"). */
export const REASON_CODES = [
  'missing_channel',
  'unknown_channel',
  'retired_channel',
  'bad_time',
  'time_out_of_range',
  'bad_value',
  'conflict_in_batch',
  'conflicts_with_stored',
] as const;
export type ReasonCode = (typeof REASON_CODES)[number];

/** Short names of the reasons, for the filter and the table. */
export const REASON_LABELS: Record<ReasonCode, string> = {
  missing_channel: 'No channel',
  unknown_channel: 'Unknown channel',
  retired_channel: 'Retired channel',
  bad_time: 'Unreadable time',
  time_out_of_range: 'Time out of range',
  bad_value: 'Unreadable value',
  conflict_in_batch: 'Two values in one batch',
  conflicts_with_stored: 'Differs from stored value',
};

/** True for a code from {@link REASON_CODES}. */
export function isReasonCode(value: string): value is ReasonCode {
  return (REASON_CODES as readonly string[]).includes(value);
}
