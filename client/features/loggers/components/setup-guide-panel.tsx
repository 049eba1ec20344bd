import { useState, type ReactNode } from 'react';
import { CopyButton } from '../../../components/copy-button.tsx';
import type { Channel } from '@shared/contract/loggers.ts';
import { curlSnippet, ingestEndpoint, isoWithOffset, pythonSnippet, rawHttpSnippet, microcontrollerSnippet } from './setup-snippets.ts';
import { TestReadingPanel } from './test-reading-panel.tsx';

/** One example, folded away until opened (the first starts open), with a copy button. */
function Example({ title, code, testId, open = false, children }: { title: string; code: string; testId: string; open?: boolean; children?: ReactNode }) {
  return (
    <details open={open} className="group rounded-lg border border-rule bg-card">
      <summary className="cursor-pointer px-3 py-2 text-sm font-medium">{title}</summary>
      <div className="grid gap-2 px-3 pb-3">
        {children && <p className="text-xs text-ink-soft">{children}</p>}
        <pre data-testid={testId} tabIndex={0} className="overflow-x-auto rounded-lg bg-spruce p-3 font-mono text-xs text-paper">
          {code}
        </pre>
        <div>
          <CopyButton text={code} what={title} />
        </div>
      </div>
    </details>
  );
}

/**
 * "Set up this logger": where to send readings, this logger's channel keys, how times are
 * written, and copy-ready examples (curl, Python, a raw HTTP/1.1 request, a C program for a microcontroller logger) built
 * from those keys; for roles that manage loggers, a test reading that shows the round trip.
 * The ingest key itself is never shown here: the examples read it from `$LAGBOOK_INGEST_KEY`.
 */
export function SetupGuidePanel({
  slug,
  loggerId,
  timezone,
  channels,
  origin,
  canSendTest,
}: {
  slug: string;
  loggerId: number;
  timezone: string;
  channels: Channel[];
  origin: string;
  canSendTest: boolean;
}) {
  // Fixed when the panel appears, so the examples do not change under the reader's eyes.
  const [at] = useState(() => Math.floor(Date.now() / 1000) * 1000);
  const endpoint = ingestEndpoint(origin);
  return (
    <div className="grid gap-5">
      <dl className="grid gap-x-4 gap-y-2 text-sm sm:grid-cols-[10rem_1fr]">
        <dt className="text-ink-soft">Endpoint</dt>
        <dd className="flex flex-wrap items-center gap-3">
          <code data-testid="ingest-endpoint" className="font-mono">
            POST {endpoint}
          </code>
          <CopyButton text={endpoint} what="the endpoint" />
        </dd>
        <dt className="text-ink-soft">Authentication</dt>
        <dd>
          <span className="font-mono">Authorization: Bearer lbk_…</span> with this logger’s ingest key. It is shown once when issued; the examples read it from{' '}
          <span className="font-mono">$LAGBOOK_INGEST_KEY</span>.
        </dd>
        <dt className="text-ink-soft">Channel keys</dt>
        <dd>
          <ul className="flex flex-wrap gap-2" data-testid="setup-channel-keys">
            {channels.map((c) => (
              <li key={c.id} className="rounded-md border border-rule bg-card px-2 py-0.5">
                <span className="font-mono">{c.key}</span>
                <span className="text-ink-soft">
                  {' '}
                  {c.label}
                  {c.unit ? ` (${c.unit})` : ''}
                </span>
              </li>
            ))}
          </ul>
        </dd>
        <dt className="text-ink-soft">Times</dt>
        <dd>
          ISO 8601 with an offset, e.g. <span className="font-mono">{isoWithOffset(at, timezone)}</span> (this logger’s zone, {timezone}) or{' '}
          <span className="font-mono">{new Date(at).toISOString().replace('.000Z', 'Z')}</span>, or UTC epoch milliseconds, e.g.{' '}
          <span className="font-mono">{at}</span> — the easier choice on a board that keeps time with NTP. A time without an offset is not accepted, nor an
          offset outside −12:00…+14:00, nor fractions of a millisecond.
        </dd>
        <dt className="text-ink-soft">Limits</dt>
        <dd>
          At most 100,000 readings and 8 MB per request, UTF-8, optionally gzip or deflate (413 or 415 otherwise). If more than 1,000 rows of one request cannot
          be read, the whole request is refused with 422 and nothing is stored: fix what the logger sends rather than re-sending it. After 20 wrong keys in a
          minute from one address the answer is 429 for the rest of that minute.
        </dd>
        <dt className="text-ink-soft">Answers</dt>
        <dd>
          A 2xx answer means the readings are committed, with counts of accepted, duplicate and quarantined rows (and why). On a 429 or 5xx answer keep the
          readings and send them again later (after the Retry-After seconds when given): re-sending never stores a reading twice.
        </dd>
      </dl>

      <div className="grid gap-2">
        <Example title="curl (JSON)" code={curlSnippet(origin, channels, at, timezone)} testId="setup-curl" open>
          Sends one reading per channel at the time shown; export <span className="font-mono">LAGBOOK_INGEST_KEY</span> first.
        </Example>
        <Example title="Python (standard library)" code={pythonSnippet(origin, channels)} testId="setup-python">
          Python 3, no packages to install. Call <span className="font-mono">send()</span> with your sensor values.
        </Example>
        <Example title="HTTP request (microcontroller)" code={rawHttpSnippet(origin, channels, at, timezone)} testId="setup-http">
          The exact request to write to a TCP socket; lines end with CR LF and Content-Length counts the body’s bytes.
        </Example>
        <Example title="C program for a microcontroller logger (any TCP client)" code={microcontrollerSnippet(origin, channels)} testId="setup-microcontroller">
          Times as epoch milliseconds from the board’s clock; adapt the four net_ calls to your board’s network library.
        </Example>
      </div>

      {canSendTest && (
        <section aria-labelledby="test-reading-heading" className="grid gap-2">
          <h4 id="test-reading-heading" className="text-lg font-semibold">
            Send a test reading
          </h4>
          <TestReadingPanel slug={slug} loggerId={loggerId} channels={channels} />
        </section>
      )}
    </div>
  );
}
