import { Button } from '../../../components/button.tsx';
import { CopyButton } from '../../../components/copy-button.tsx';
import type { IssuedToken } from '@shared/contract/tokens.ts';

/**
 * A just-made personal token, shown this once: the token with a copy button and the warning
 * that Lagbook keeps only a hash of it. `onDismiss` hides it for good.
 */
export function IssuedTokenPanel({ issued, onDismiss }: { issued: IssuedToken; onDismiss: () => void }) {
  const headingId = `issued-token-${issued.tokenInfo.id}`;
  return (
    <section aria-labelledby={headingId} className="grid gap-4 rounded-xl border-2 border-amber bg-card p-5">
      <h3 id={headingId} className="text-lg font-semibold">
        New token “{issued.tokenInfo.name}”
      </h3>
      <p className="text-sm">
        <strong>Copy it now: Lagbook keeps only a hash and cannot show it again.</strong> Anyone holding it can read this lab’s channels as you until it expires
        or you revoke it. Keep it in an environment variable, not in a shared notebook.
      </p>
      <div className="flex flex-wrap items-center gap-3">
        <code data-testid="issued-token" className="break-all rounded-lg border border-rule bg-paper px-3 py-2 font-mono text-sm select-all">
          {issued.token}
        </code>
        <CopyButton text={issued.token} what="the personal token" />
      </div>
      <div>
        <Button size="sm" onClick={onDismiss}>
          I have copied it — hide the token
        </Button>
      </div>
    </section>
  );
}
