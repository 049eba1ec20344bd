import { CopyButton } from '../../../components/copy-button.tsx';

/** A titled, copy-ready code sample in Lagbook's dark panel. */
export function SnippetBlock({ title, code, testId }: { title: string; code: string; testId?: string }) {
  return (
    <figure className="grid gap-2">
      <figcaption className="flex items-center justify-between gap-3 text-sm font-medium">
        {title}
        <CopyButton text={code} what={title} />
      </figcaption>
      <pre data-testid={testId} tabIndex={0} className="overflow-x-auto rounded-lg bg-spruce p-3 font-mono text-xs text-paper">
        {code}
      </pre>
    </figure>
  );
}
