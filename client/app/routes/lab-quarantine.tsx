import { useLoggers } from '../../features/loggers/api/get-loggers.ts';
import { QuarantineReview } from '../../features/quarantine/components/quarantine-review.tsx';
import { MissingPermission } from '../../features/labs/components/lab-not-found.tsx';
import { useLabContext } from './lab-context.ts';

/** `/labs/:lab/quarantine`: review and repair of quarantined rows, one by one or in bulk (technicians and admins), filters and page in the URL. */
export default function LabQuarantineRoute() {
  const { detail } = useLabContext();
  const slug = detail.lab.slug;
  // Retired loggers too: their rows may still wait in quarantine.
  const loggers = useLoggers(slug, true);
  if (!detail.permissions.includes('quarantine.review')) return <MissingPermission what="the quarantine" />;
  return (
    <section aria-labelledby="quarantine-heading" className="grid gap-4">
      <div>
        <h2 id="quarantine-heading" className="text-xl font-semibold">
          Quarantine
        </h2>
        <p className="text-sm text-ink-soft">
          Readings Lagbook could not store, each with its reason. Fix and re-submit them one by one, repair many at once (read their times again, move them,
          store them under the right channel), or discard what is beyond repair.
        </p>
      </div>
      <QuarantineReview slug={slug} loggers={loggers.data?.loggers.map((l) => ({ id: l.id, name: l.name, timezone: l.timezone })) ?? []} />
    </section>
  );
}
