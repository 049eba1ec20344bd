import type { ReactNode } from 'react';

/**
 * A message block in one of two voices: `alert` (something failed; announced at once by
 * screen readers) or `status` (information, announced politely).
 */
export function Notice({ tone, children, className = '' }: { tone: 'alert' | 'status'; children: ReactNode; className?: string }) {
  const look = tone === 'alert' ? 'border-alert/30 bg-alert/5 text-alert' : 'border-rule bg-paper text-ink';
  return (
    <div role={tone} className={`rounded-lg border p-3 text-sm ${look} ${className}`}>
      {children}
    </div>
  );
}

/** The placeholder shown while a page's data loads. */
export function LoadingNote({ what = 'Loading…' }: { what?: string }) {
  return (
    <p role="status" className="py-6 text-ink-soft">
      {what}
    </p>
  );
}
