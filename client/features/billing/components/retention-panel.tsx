import { Instant } from '../../../components/clock/instant.tsx';
import { Notice } from '../../../components/notice.tsx';
import { labExportUrl } from '../../labs/api/export-lab.ts';
import { useRetention } from '../api/get-retention.ts';

const count = (n: number) => n.toLocaleString('en');

/**
 * What the lab's plan removes from storage, on the billing page (admins): on a plan that keeps
 * every reading, one sentence saying so; on a plan that removes, which readings go and from when
 * ("Readings before 2026-09-05 are removed from 2026-12-05 (about 120,000 readings)"), with a link
 * to the lab's full export to take first. Dates on the reader's clock (`<Instant>`).
 */
export function RetentionPanel({ slug }: { slug: string }) {
  const retention = useRetention(slug);
  if (retention.isPending) return null;
  if (retention.isError) return <Notice tone="alert">What the plan removes from storage could not be loaded: {retention.error.message}</Notice>;
  const r = retention.data;
  if (!r.removes) {
    return (
      <p className="text-sm text-ink-soft" data-testid="retention">
        The {r.planName} plan never removes readings: readings older than its {count(r.historyDays)} days of history stay stored.
      </p>
    );
  }
  return (
    <div className="grid gap-2 rounded-lg border border-rule bg-card p-4" data-testid="retention">
      <p>
        {r.readingsBeforeHorizon > 0 ? (
          <>
            Readings before <Instant at={r.horizon} kind="account" part="date" /> are removed from <Instant at={r.nextRemovalAt} kind="account" part="date" />{' '}
            (about {count(r.readingsBeforeHorizon)} {r.readingsBeforeHorizon === 1 ? 'reading' : 'readings'}).
          </>
        ) : (
          <>
            Readings before <Instant at={r.horizon} kind="account" part="date" /> are removed; none is stored before that date now. The next removal runs on{' '}
            <Instant at={r.nextRemovalAt} kind="account" part="date" />.
          </>
        )}{' '}
        Export them first:{' '}
        <a className="underline" href={labExportUrl(slug)}>
          download the lab’s full export
        </a>
        .
      </p>
      <p className="text-sm text-ink-soft">
        The {r.planName} plan keeps readings for its {count(r.historyDays)} days of history and {count(r.exportDays)} days more for exporting them, then removes
        them for good.
        {r.oldestReading !== null && (
          <>
            {' '}
            The oldest stored reading is from <Instant at={r.oldestReading} kind="account" part="date" />.
          </>
        )}
      </p>
      <p className="text-sm text-ink-soft" data-testid="retention-caution">
        Records of freezers, incubators, cold rooms or gas supplies may have to be kept longer under your lab’s own rules or local regulations: keep an export
        of them wherever those rules say, before they are removed here.
      </p>
    </div>
  );
}
