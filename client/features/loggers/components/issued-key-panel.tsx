import { useMemo, type ReactNode } from 'react';
import { CopyButton } from '../../../components/copy-button.tsx';
import type { IssuedKey } from '@shared/contract/loggers.ts';
import { curlIngestExample, type ExampleChannel } from './ingest-example.ts';

/**
 * A just-issued ingest key, shown this once: the key in monospace with a copy button, the
 * warning that Lagbook keeps only a hash, and — when the logger has a channel — a ready-to-run
 * `curl` command that posts one reading with that key. `children` adds what comes next (a link).
 */
export function IssuedKeyPanel({
  issued,
  channel,
  heading = 'Ingest key',
  children,
}: {
  issued: IssuedKey;
  channel?: ExampleChannel;
  heading?: string;
  children?: ReactNode;
}) {
  // Fixed when the panel appears, so the command does not change under the reader's eyes.
  const example = useMemo(() => (channel ? curlIngestExample(window.location.origin, issued.key, channel, new Date()) : null), [channel, issued.key]);
  return (
    <section aria-labelledby={`issued-key-${issued.id}`} className="grid gap-4 rounded-xl border-2 border-amber bg-card p-5">
      <h3 id={`issued-key-${issued.id}`} className="text-lg font-semibold">
        {heading}
      </h3>
      <p className="text-sm">
        <strong>Store it on the logger now; Lagbook keeps only a hash and cannot show it again.</strong> Anyone with this key can send readings as this logger.
      </p>
      <div className="flex flex-wrap items-center gap-3">
        <code data-testid="issued-key" className="break-all rounded-lg border border-rule bg-paper px-3 py-2 font-mono text-sm select-all">
          {issued.key}
        </code>
        <CopyButton text={issued.key} what="the ingest key" />
      </div>
      {example && (
        <div className="grid gap-2">
          <p className="text-sm text-ink-soft">
            Try it: this command sends one reading of <span className="font-mono">{channel!.key}</span> at the time shown. It is stored like any other reading,
            so send a real value if you keep it.
          </p>
          <pre data-testid="ingest-example" tabIndex={0} className="overflow-x-auto rounded-lg bg-spruce p-3 font-mono text-xs text-paper">
            {example}
          </pre>
          <div>
            <CopyButton text={example} label="Copy command" what="the curl command" />
          </div>
        </div>
      )}
      {children}
    </section>
  );
}
