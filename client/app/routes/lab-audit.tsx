import { useAuditLog } from '../../features/audit/api/get-audit-log.ts';
import { AuditFilterForm } from '../../features/audit/components/audit-filter-form.tsx';
import { Pager } from '../../components/pager.tsx';
import { AuditTable } from '../../features/audit/components/audit-table.tsx';
import { toAuditQuery, writeAuditFilters } from '../../features/audit/hooks/audit-search-params.ts';
import { useAuditFilters } from '../../features/audit/hooks/use-audit-filters.ts';
import { MissingPermission } from '../../features/labs/components/lab-not-found.tsx';
import { LoadingNote, Notice } from '../../components/notice.tsx';
import { useLabContext } from './lab-context.ts';

const PAGE_SIZE = 25;

/** `/labs/:lab/audit`: the audit log, filtered and paged through the URL's search params. */
export default function LabAuditRoute() {
  const { detail } = useLabContext();
  if (!detail.permissions.includes('audit.read')) return <MissingPermission what="the audit log" />;
  return <AuditLog slug={detail.lab.slug} />;
}

function AuditLog({ slug }: { slug: string }) {
  const [filters, setFilters] = useAuditFilters();
  const log = useAuditLog(slug, toAuditQuery(filters, PAGE_SIZE));
  return (
    <section aria-labelledby="audit-heading" className="grid gap-4">
      <h2 id="audit-heading" className="text-xl font-semibold">
        Audit log
      </h2>
      {/* Keyed by the URL filters so Back/Forward also resets the form's fields. */}
      <AuditFilterForm key={writeAuditFilters(filters).toString()} filters={filters} onApply={setFilters} />
      {log.isPending ? (
        <LoadingNote what="Loading the audit log…" />
      ) : log.isError ? (
        <Notice tone="alert">{log.error.message}</Notice>
      ) : (
        <>
          <AuditTable entries={log.data.entries} />
          <Pager
            label="Audit log pages"
            noun="Entries"
            page={filters.page}
            pageSize={PAGE_SIZE}
            total={log.data.total}
            onPage={(page) => setFilters({ ...filters, page })}
          />
        </>
      )}
    </section>
  );
}
