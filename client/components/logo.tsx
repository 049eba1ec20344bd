/**
 * Lagbook's mark: four stems shrinking from left to right, the silhouette of a
 * correlogram dying away, beside the wordmark.
 */
export function Logo({ className = '' }: { className?: string }) {
  return (
    <span className={`inline-flex items-center gap-2 ${className}`}>
      <svg viewBox="0 0 32 32" aria-hidden="true" className="h-7 w-7">
        <rect width="32" height="32" rx="7" fill="var(--color-spruce)" />
        <g fill="var(--color-amber)">
          <rect x="5" y="6" width="3" height="20" rx="1.5" />
          <rect x="10.5" y="12" width="3" height="14" rx="1.5" />
          <rect x="16" y="16.5" width="3" height="9.5" rx="1.5" />
          <rect x="21.5" y="20" width="3" height="6" rx="1.5" />
        </g>
      </svg>
      <span className="text-lg font-semibold tracking-tight">Lagbook</span>
    </span>
  );
}
