import { useState } from 'react';
import { LoadingNote, Notice } from '../../../components/notice.tsx';
import type { IssuedToken } from '@shared/contract/tokens.ts';
import { useTokens } from '../api/get-tokens.ts';
import { IssuedTokenPanel } from './issued-token-panel.tsx';
import { NotebookGuide } from './notebook-guide.tsx';
import { TokenCreateForm } from './token-create-form.tsx';
import { TokensTable } from './tokens-table.tsx';

/**
 * The member's personal API tokens in a lab: make one (shown once), see each one's expiry and
 * last use, revoke; and how to use one from Python or R. `origin` is the server's address as
 * the browser sees it.
 */
export function TokensPage({ slug, origin }: { slug: string; origin: string }) {
  const tokens = useTokens(slug);
  const [issued, setIssued] = useState<IssuedToken | null>(null);
  return (
    <div className="grid gap-10">
      <section aria-labelledby="tokens-heading" className="grid gap-4">
        <div>
          <h2 id="tokens-heading" className="text-2xl font-semibold">
            API tokens
          </h2>
          <p className="mt-1 max-w-3xl text-sm text-ink-soft">
            A personal token lets a notebook or a script read this lab’s data as you, without signing in. It can only read, it works only in this lab, it
            follows your current role, and it stops at its expiry or when you revoke it.
          </p>
        </div>
        {issued && <IssuedTokenPanel issued={issued} onDismiss={() => setIssued(null)} />}
        <TokenCreateForm slug={slug} onCreated={setIssued} />
        {tokens.isPending && <LoadingNote what="Loading your tokens…" />}
        {tokens.isError && <Notice tone="alert">{tokens.error.message}</Notice>}
        {tokens.data && <TokensTable slug={slug} tokens={tokens.data.tokens} />}
      </section>
      <NotebookGuide slug={slug} origin={origin} />
    </div>
  );
}
