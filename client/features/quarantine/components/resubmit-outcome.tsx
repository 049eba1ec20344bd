import { Notice } from '../../../components/notice.tsx';
import type { ResubmitOutcome as Outcome } from '@shared/contract/quarantine.ts';
import { readingBackInQuarantine, resubmitSummary, type ReadingAgain } from '../messages.ts';

/** What was sent for one re-submitted row (by its id): the reading as people know it. */
export type SentReading = Omit<ReadingAgain, 'reason'>;

/**
 * What became of re-submitted rows: how many were stored, already there, or quarantined again —
 * and for each one quarantined again, which reading it is (logger, channel and time as received,
 * value) and why, never its row number.
 */
export function ResubmitOutcome({ outcome, sent }: { outcome: Outcome; sent: ReadonlyMap<number, SentReading> }) {
  const again = outcome.quarantined;
  return (
    <Notice tone={again.length ? 'alert' : 'status'}>
      <p>{resubmitSummary({ ...outcome, again: again.length })}</p>
      {again.length > 0 && (
        <ul className="mt-1 list-disc pl-5">
          {again.map((q) => (
            <li key={q.id}>{readingBackInQuarantine({ ...(sent.get(q.id) ?? { logger: null, channel: null, ts: null, value: null }), reason: q.reason })}</li>
          ))}
        </ul>
      )}
    </Notice>
  );
}
