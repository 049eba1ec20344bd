import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/button.tsx';
import { SelectField, TextField } from '../../../components/form-field.tsx';
import { Notice } from '../../../components/notice.tsx';
import type { Channel, TestReadingResult } from '@shared/contract/loggers.ts';
import { useSendTestReading } from '../api/send-test-reading.ts';
import { sampleValue } from './ingest-example.ts';

/** The round trip in words: stored (and read back), a duplicate, or quarantined with the server's reason. */
function RoundTrip({ result }: { result: TestReadingResult }) {
  const { sent, outcome, storedValue, roundTripMs } = result;
  const refused = outcome.quarantined[0];
  if (refused) {
    return (
      <Notice tone="alert">
        Not stored: the reading of <span className="font-mono">{sent.channel}</span> went to quarantine — {refused.reason} (
        <span className="font-mono">{refused.code}</span>). Round trip {roundTripMs} ms.
      </Notice>
    );
  }
  return (
    <Notice tone="status">
      <dl data-testid="test-reading-result" className="grid grid-cols-[9rem_1fr] gap-x-3 gap-y-1">
        <dt className="text-ink-soft">Sent</dt>
        <dd>
          <span className="font-mono">{sent.channel}</span> = {sent.value}
        </dd>
        <dt className="text-ink-soft">Time stamped</dt>
        <dd className="font-mono">{sent.ts}</dd>
        <dt className="text-ink-soft">Stored value</dt>
        <dd data-testid="stored-value">{storedValue === null ? 'nothing stored' : storedValue}</dd>
        <dt className="text-ink-soft">Round trip</dt>
        <dd>{roundTripMs} ms (store, commit, read back)</dd>
        {outcome.duplicates > 0 && (
          <>
            <dt className="text-ink-soft">Note</dt>
            <dd>Already stored with the same value for this time: nothing changed.</dd>
          </>
        )}
      </dl>
    </Notice>
  );
}

/**
 * "Send a test reading": one value for one channel, stored now through the same ingestion path
 * as a logger's readings and read back, so a technician sees the whole path work before wiring
 * the logger. It becomes a real reading of the channel.
 */
export function TestReadingPanel({ slug, loggerId, channels }: { slug: string; loggerId: number; channels: Channel[] }) {
  const send = useSendTestReading(slug, loggerId);
  const [channelKey, setChannelKey] = useState(channels[0]?.key ?? '');
  const channel = channels.find((c) => c.key === channelKey);
  const [value, setValue] = useState(String(channel ? sampleValue(channel) : 0));
  const [valueError, setValueError] = useState<string | undefined>();

  function submit(e: FormEvent) {
    e.preventDefault();
    const number = Number(value);
    if (value.trim() === '' || !Number.isFinite(number)) {
      setValueError('value: must be a finite number');
      return;
    }
    setValueError(undefined);
    send.mutate({ channel: channelKey, value: number });
  }

  return (
    <div className="grid gap-3">
      <form noValidate aria-label="Send a test reading" onSubmit={submit} className="grid max-w-2xl gap-3 sm:grid-cols-[1fr_10rem_auto] sm:items-start">
        <SelectField
          label="Channel"
          value={channelKey}
          onChange={(e) => {
            setChannelKey(e.target.value);
            const next = channels.find((c) => c.key === e.target.value);
            if (next) setValue(String(sampleValue(next)));
          }}
        >
          {channels.map((c) => (
            <option key={c.id} value={c.key}>
              {c.key} — {c.label}
            </option>
          ))}
        </SelectField>
        <TextField label="Value" inputMode="decimal" value={value} error={valueError} onChange={(e) => setValue(e.target.value)} />
        <div className="sm:pt-6">
          <Button type="submit" tone="primary" disabled={send.isPending || !channel}>
            {send.isPending ? 'Sending…' : 'Send a test reading'}
          </Button>
        </div>
      </form>
      <p className="text-xs text-ink-soft">The value is stored as a real reading of the channel at the current time.</p>
      {send.isError && <Notice tone="alert">{send.error.message}</Notice>}
      {send.data && <RoundTrip result={send.data} />}
    </div>
  );
}
