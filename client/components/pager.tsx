import { Button } from './button.tsx';

/**
 * Paging for a list the server pages: "Rows 101–200 of 340 · page 2 of 4" with Previous and
 * Next (disabled at either end). `label` names the navigation landmark, `noun` the things.
 */
export function Pager({
  label,
  noun,
  page,
  pageSize,
  total,
  onPage,
}: {
  label: string;
  noun: string;
  page: number;
  pageSize: number;
  total: number;
  onPage: (page: number) => void;
}) {
  const pages = Math.max(1, Math.ceil(total / pageSize));
  const range = total === 0 ? `No ${noun.toLowerCase()}` : `${noun} ${(page - 1) * pageSize + 1}–${Math.min(total, page * pageSize)} of ${total}`;
  return (
    <nav aria-label={label} className="flex flex-wrap items-center justify-between gap-3 text-sm">
      <p aria-live="polite">
        {range} · page {Math.min(page, pages)} of {pages}
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
