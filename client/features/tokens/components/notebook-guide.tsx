import { labApiBase, pythonNotebookSnippet, rNotebookSnippet } from './notebook-snippets.ts';
import { SnippetBlock } from './snippet-block.tsx';

/**
 * "Use it from a notebook": the Python and R examples of server/http/tokens/README.md with this lab's read API
 * filled in, and where the token goes (an environment variable, never the notebook itself).
 */
export function NotebookGuide({ slug, origin }: { slug: string; origin: string }) {
  return (
    <section aria-labelledby="notebook-guide-heading" className="grid gap-4">
      <h3 id="notebook-guide-heading" className="text-xl font-semibold">
        Use it from a notebook
      </h3>
      <p className="text-sm text-ink-soft">
        Put the token in the environment as <span className="font-mono">LAGBOOK_TOKEN</span> and send it as{' '}
        <span className="font-mono">Authorization: Bearer …</span> to this lab’s read API at{' '}
        <span className="font-mono" data-testid="lab-api-base">
          {labApiBase(origin, slug)}
        </span>
        . Tokens read only: channels, series, diagnostics and exports. Ranges take <span className="font-mono">from</span>/<span className="font-mono">to</span>{' '}
        as epoch milliseconds or ISO 8601 with an offset; without them you get the last 7 days.
      </p>
      <SnippetBlock title="Python (standard library)" code={pythonNotebookSnippet(origin, slug)} testId="notebook-python" />
      <SnippetBlock title="R (base)" code={rNotebookSnippet(origin, slug)} testId="notebook-r" />
      <p className="text-xs text-ink-soft">
        In Python, put one of this lab’s channel keys in place of <span className="font-mono">air_t</span>. In R, set{' '}
        <span className="font-mono">LAGBOOK_CHANNEL</span> to the channel’s id (the <span className="font-mono">id</span> field of{' '}
        <span className="font-mono">/channels</span>).
      </p>
    </section>
  );
}
