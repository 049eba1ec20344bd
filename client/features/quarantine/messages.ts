import type { QuarantinedRow } from '@shared/contract/quarantine.ts';
import { QUARANTINE_LABELS } from '@shared/contract/words/quarantine.ts';

/**
 * Words the quarantine screens write themselves (outcomes of re-submitting and discarding,
 * confirmations, the names of single readings). This file is the one place to review how the
 * quarantine feature speaks to people; field labels the server shares live in
 * `@shared/contract/words/quarantine.ts`. A reading is named by what arrived (logger, channel
 * as received, time, value), never by its row number in the database.
 */

/** `1 row` / `3 rows`. */
export const rows = (n: number): string => `${n.toLocaleString('en-GB')} ${n === 1 ? 'row' : 'rows'}`;

/** What arrived, as text, or a dash for a part that was missing. */
const shown = (text: string | number | null | undefined): string =>
  text === null || text === undefined || String(text).trim() === '' ? '—' : `“${String(text)}”`;

/** One quarantined reading as people can find it again: its channel as received and its time as received. */
export function readingName(row: Pick<QuarantinedRow, 'channel' | 'ts'>): string {
  return `the reading of ${shown(row.channel)} at ${shown(row.ts)}`;
}

/** A reading that was re-submitted and failed again: which one (logger, channel, time, value) and why. */
export interface ReadingAgain {
  /** The logger's name, or null when the row arrived for no known logger. */
  logger: string | null;
  channel: string | null;
  ts: string | number | null;
  value: string | number | null;
  /** Why the server kept it (its own words). */
  reason: string;
}

/** The parts of a reading a stored reason may start with (`ts: "…" has no UTC offset`), by their labels. */
const REASON_PARTS: Record<string, string> = { ts: QUARANTINE_LABELS.ts, value: QUARANTINE_LABELS.value, channel: QUARANTINE_LABELS.channel };

/**
 * A stored quarantine reason in words: a leading part key (`ts:`, `value:`, `channel:`, as rows
 * kept before the reasons were reworded still carry) becomes its label ("Time: …").
 */
export function plainReason(reason: string): string {
  return reason.replace(/^(ts|value|channel):\s*/, (_, key: string) => `${REASON_PARTS[key]}: `);
}

/** "Back in quarantine: Hedgerow mast, channel “air_t” as received, time “…”, value “n/a”. Why: …" */
export function readingBackInQuarantine(r: ReadingAgain): string {
  const logger = r.logger ?? 'no known logger';
  return `Back in quarantine: ${logger}, channel ${shown(r.channel)} as received, time ${shown(r.ts)}, value ${shown(r.value)}. Why: ${plainReason(r.reason).replace(/[.\s]+$/, '')}.`;
}

/** The counts of a re-submission. */
export function resubmitSummary(o: { resubmitted: number; accepted: number; duplicates: number; again: number }): string {
  return `Re-submitted ${rows(o.resubmitted)}: ${o.accepted} stored, ${o.duplicates} already stored, ${o.again} quarantined again.`;
}

/** A logger the rows name that is not in the lab's list any more (retired and hidden, or deleted): never its id. */
export const UNLISTED_LOGGER = 'A logger no longer listed';

/** The short name of a reason code this client has no words for yet (the server's own reason text is shown beside it). */
export const OTHER_REASON = 'Other reason';

/** The bulk repair form's own checks, before the server's schema. */
export const BULK_DRAFT_MESSAGES = {
  hoursWhole: 'Hours: must be a whole number.',
  minutesWhole: 'Minutes: must be a whole number from 0 to 59.',
  chooseChannel: 'Choose the channel these rows belong to.',
} as const;

/** Question before chosen rows are deleted. */
export const discardQuestion = (n: number): string => `Discard ${rows(n)} for good?`;

/** Notice after rows were deleted. */
export const discardedNotice = (n: number): string => `Discarded ${rows(n)}.`;
