import { Button } from '../../../components/button.tsx';

/** "Entries 51–100 of 240 · page 2 of 5" with Previous and Next (disabled at either end). */
export function AuditPager({
  page,
  pageSize,
  total,
  onPage,
}: {
  page: number;
  pageSize: number;
  total: number;
  onPage: (page: number) => void;
}) {
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const first = total === 0 ? 0 : (page - 1) * pageSize + 1;
  const last = Math.min(total, page * pageSize);
  return (
    <nav aria-label="Audit log pages" className="flex flex-wrap items-center justify-between gap-3 text-sm">
      <p aria-live="polite">
        {total === 0 ? 'No entries' : `Entries ${first}–${last} of ${total}`} · page {Math.min(page, pages)} of {pages}
      </p>
      <div className="flex gap-2">
        <Button size="sm" disabled={page <= 1} onClick={() => onPage(page - 1)}>
          ← Previous
        </Button>
        <Button size="sm" disabled={page >= pages} onClick={() => onPage(page + 1)}>
          Next →
        </Button>
      </div>
    </nav>
  );
}
