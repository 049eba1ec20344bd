import { Button } from '../../../components/button.tsx';

/**
 * Paging for the quarantine's keyset pages: how many rows match (counted up to the server's
 * limit, "10,000 or more" beyond), and First / Newer / Older. Newer is available only back
 * along the pages this view came through; Older follows the server's `nextCursor`.
 */
const formatCount = (n: number) => n.toLocaleString('en');

export function QuarantinePager({
  shown,
  total,
  totalAtLeast,
  atFirst,
  canGoBack,
  nextCursor,
  onFirst,
  onBack,
  onNext,
}: {
  shown: number;
  total: number;
  totalAtLeast: boolean;
  atFirst: boolean;
  canGoBack: boolean;
  nextCursor: string | null;
  onFirst: () => void;
  onBack: () => void;
  onNext: (cursor: string) => void;
}) {
  const matching = `${formatCount(total)}${totalAtLeast ? ' or more' : ''}`;
  return (
    <nav aria-label="Quarantine pages" className="flex flex-wrap items-center justify-between gap-3 text-sm">
      <p aria-live="polite">{total === 0 ? 'No rows' : `${formatCount(shown)} row${shown === 1 ? '' : 's'} shown · ${matching} matching`}</p>
      <div className="flex gap-2">
        <Button size="sm" disabled={atFirst} onClick={onFirst}>
          ⇤ Newest
        </Button>
        <Button size="sm" disabled={!canGoBack} onClick={onBack}>
          ← Newer
        </Button>
        <Button size="sm" disabled={!nextCursor} onClick={() => nextCursor && onNext(nextCursor)}>
          Older →
        </Button>
      </div>
    </nav>
  );
}
