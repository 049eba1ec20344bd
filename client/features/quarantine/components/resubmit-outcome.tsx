import { Notice } from '../../../components/notice.tsx';
import type { ResubmitOutcome as Outcome } from '@shared/contract/quarantine.ts';

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** What became of re-submitted rows: how many were stored, already there, or quarantined again — and why. */
export function ResubmitOutcome({ outcome }: { outcome: Outcome }) {
  const again = outcome.quarantined;
  return (
    <Notice tone={again.length ? 'alert' : 'status'}>
      <p>
        Re-submitted {plural(outcome.resubmitted, 'row', 'rows')}: {outcome.accepted} stored, {outcome.duplicates} already stored, {again.length} quarantined
        again.
      </p>
      {again.length > 0 && (
        <ul className="mt-1 list-disc pl-5">
          {again.map((q) => (
            <li key={q.id}>
              Row {q.id} is back in quarantine: {q.reason}
            </li>
          ))}
        </ul>
      )}
    </Notice>
  );
}
