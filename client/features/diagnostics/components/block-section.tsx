import type { ReactNode } from 'react';

/**
 * A titled block of the diagnostics results (heading h4 tied to the section); when `missing` is
 * given, the block shows only that reason, in the quiet voice, instead of its content.
 */
export function BlockSection({
  id,
  title,
  missing,
  testId,
  children,
}: {
  id: string;
  title: string;
  missing?: { text: string; testId: string };
  testId?: string;
  children?: ReactNode;
}) {
  return (
    <section aria-labelledby={id} className={missing ? 'grid gap-2' : 'grid gap-3'} data-testid={missing ? undefined : testId}>
      <h4 id={id} className="text-sm font-semibold">
        {title}
      </h4>
      {missing ? (
        <p className="text-sm text-ink-soft" data-testid={missing.testId}>
          {missing.text}
        </p>
      ) : (
        children
      )}
    </section>
  );
}
