import type { ComponentProps } from 'react';
import { ConfirmButton } from './confirm-button.tsx';

/**
 * A {@link ConfirmButton} for one server action, with the server's refusal (if any) shown
 * right under it as an alert, so the reason appears where the person acted.
 */
export function ConfirmAction({ error, ...button }: ComponentProps<typeof ConfirmButton> & { error?: Error | null }) {
  return (
    <span className="inline-grid gap-1">
      <ConfirmButton {...button} />
      {error && (
        <span role="alert" className="text-sm text-alert">
          {error.message}
        </span>
      )}
    </span>
  );
}
