import { useEffect, useState, type FormEvent } from 'react';
import { Button } from '../../../components/button.tsx';
import { SelectField, TextField } from '../../../components/form-field.tsx';
import { Notice } from '../../../components/notice.tsx';
import { Instant } from '../../../components/clock/instant.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import type { Channel, TestReading, TestReadingBody, TestReadingResult } from '@shared/contract/loggers.ts';
import { SafetyCautionNote } from '../../../components/safety-caution-note.tsx';
import { useSendTestReading } from '../api/send-test-reading.ts';
import { useLoggerTestReadings, useRemoveTestReading } from '../api/test-readings.ts';
import { sampleValue } from './ingest-example.ts';
import { TEST_VALUE_NOT_A_NUMBER, wouldGoToQuarantine } from '../messages.ts';

/** "m:ss" left of a countdown, never below 0:00. */
export function countdownText(ms: number): string {
  const s = Math.max(0, Math.ceil(ms / 1000));
  return `${Math.floor(s / 60)}:${String(s % 60).padStart(2, '0')}`;
}

/** The wall clock, ticking each second while `active`. */
function useTick(active: boolean): number {
  const [now, setNow] = useState(Date.now);
  useEffect(() => {
    if (!active) return;
    const id = setInterval(() => setNow(Date.now()), 1000);
    return () => clearInterval(id);
  }, [active]);
  return now;
}

/**
 * "Remove" with the time left, for the member who sent the reading while its 10 minutes last;
 * `receivedAt` is when the browser got the answer that said how long was left.
 */
function RemoveButton({ slug, reading, receivedAt }: { slug: string; reading: TestReading; receivedAt: number }) {
  const remove = useRemoveTestReading(slug, reading.loggerId);
  const deadline = receivedAt + reading.removableByYouForMs;
  const now = useTick(reading.removableByYouForMs > 0);
  if (reading.removableByYouForMs <= 0 || now >= deadline) return null;
  return (
    <span className="inline-flex flex-wrap items-center gap-2">
      <Button
        size="sm"
        onClick={() => remove.mutate(reading.id)}
        disabled={remove.isPending}
        aria-label={`Remove test reading ${reading.channel} = ${reading.value}`}
      >
        {remove.isPending ? 'Removing…' : `Remove (${countdownText(deadline - now)} left)`}
      </Button>
      {remove.isError && <span className="text-xs text-alert">{remove.error.message}</span>}
    </span>
  );
}

/** What a logger's reading would get, and the test reading kept in its place (if any). */
function Verdict({ slug, result, receivedAt }: { slug: string; result: TestReadingResult; receivedAt: number }) {
  const { sent, wouldGet, testReading, timezone } = result;
  if (wouldGet.outcome === 'quarantined') {
    return <Notice tone="alert">{wouldGoToQuarantine(sent.channel, wouldGet.reason)}</Notice>;
  }
  return (
    <Notice tone="status">
      <dl data-testid="test-reading-result" className="grid grid-cols-[10rem_1fr] gap-x-3 gap-y-1">
        <dt className="text-ink-soft">Sent</dt>
        <dd>
          <span className="font-mono">{sent.channel}</span> = {sent.value}
        </dd>
        <dt className="text-ink-soft">A logger’s reading</dt>
        <dd data-testid="would-get">would be stored</dd>
        {testReading && (
          <>
            <dt className="text-ink-soft">Kept as a test</dt>
            <dd data-testid="kept-at">
              at <Instant at={testReading.ts} kind="readings" loggerZone={timezone} seconds />
            </dd>
            {testReading.outsideRange && (
              <>
                <dt className="text-ink-soft">Note</dt>
                <dd>Outside the channel’s valid range (you confirmed it).</dd>
              </>
            )}
            <dt className="sr-only">Remove</dt>
            <dd className="col-start-2">
              <RemoveButton slug={slug} reading={testReading} receivedAt={receivedAt} />
            </dd>
          </>
        )}
      </dl>
    </Notice>
  );
}

/** The logger's latest test readings, with "Remove" on the signed-in member's own while they may. */
function RecentTestReadings({ slug, loggerId }: { slug: string; loggerId: number }) {
  const recent = useLoggerTestReadings(slug, loggerId);
  if (recent.isError) return <Notice tone="alert">{recent.error.message}</Notice>;
  const rows = recent.data?.testReadings ?? [];
  if (!recent.data || rows.length === 0) return null;
  const tz = recent.data.timezone;
  return (
    <table aria-label="Recent test readings" className="w-full max-w-3xl text-sm">
      <caption className="mb-1 text-left font-semibold">Recent test readings</caption>
      <thead className="text-left text-ink-soft">
        <tr>
          <th className="py-1 pr-3 font-medium">Time</th>
          <th className="py-1 pr-3 font-medium">Channel</th>
          <th className="py-1 pr-3 font-medium">Value</th>
          <th className="py-1 pr-3 font-medium">Sent by</th>
          <th className="py-1 font-medium">
            <span className="sr-only">Remove</span>
          </th>
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <tr key={r.id} className="border-t border-rule">
            <td className="py-1 pr-3 font-mono">
              <Instant at={r.ts} kind="readings" loggerZone={tz} seconds />
            </td>
            <td className="py-1 pr-3 font-mono">{r.channel}</td>
            <td className="py-1 pr-3">
              {r.value}
              {r.outsideRange && <span className="ml-1 text-xs text-alert">(outside the valid range)</span>}
            </td>
            <td className="py-1 pr-3">{r.sentBy?.name ?? 'a former member'}</td>
            <td className="py-1">
              <RemoveButton slug={slug} reading={r} receivedAt={recent.dataUpdatedAt} />
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/**
 * "Send a test reading": one value for one channel, checked now as a logger's reading would be
 * (the answer says whether it would be stored or quarantined and why), then kept as a test
 * reading — never among the channel's readings, so diagnostics and alerts leave it out. A value
 * outside the valid range asks for confirmation first; the sender may remove it for 10 minutes.
 */
export function TestReadingPanel({ slug, loggerId, channels }: { slug: string; loggerId: number; channels: Channel[] }) {
  const send = useSendTestReading(slug, loggerId);
  const [channelKey, setChannelKey] = useState(channels[0]?.key ?? '');
  const channel = channels.find((c) => c.key === channelKey);
  const [value, setValue] = useState(String(channel ? sampleValue(channel) : 0));
  const [valueError, setValueError] = useState<string | undefined>();
  const [receivedAt, setReceivedAt] = useState(0);

  function post(body: TestReadingBody) {
    send.mutate(body, { onSuccess: () => setReceivedAt(Date.now()) });
  }

  function submit(e: FormEvent) {
    e.preventDefault();
    const number = Number(value);
    if (value.trim() === '' || !Number.isFinite(number)) {
      setValueError(TEST_VALUE_NOT_A_NUMBER);
      return;
    }
    setValueError(undefined);
    post({ channel: channelKey, value: number });
  }

  const question = send.error instanceof ApiError && send.error.code === 'outside_valid_range' ? send.error.message : null;
  const asked = send.variables;

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
      <p className="text-xs text-ink-soft">
        The value is checked as a reading from this logger would be, then kept as a test reading: it is drawn apart on the channel’s chart and left out of
        diagnostics and alerts. You can remove your own test reading for 10 minutes after sending it.
      </p>
      {channel && <SafetyCautionNote channel={channel} />}
      {question && asked ? (
        <div
          role="alertdialog"
          aria-label="Confirm a value outside the valid range"
          className="grid gap-2 rounded-lg border border-alert/30 bg-alert/5 p-3 text-sm"
        >
          <p>{question}.</p>
          <div className="flex flex-wrap gap-2">
            <Button tone="primary" size="sm" onClick={() => post({ ...asked, confirmOutsideRange: true })}>
              Keep it as a test reading
            </Button>
            <Button size="sm" onClick={() => send.reset()}>
              Change the value
            </Button>
          </div>
        </div>
      ) : (
        send.isError && <Notice tone="alert">{send.error.message}</Notice>
      )}
      {send.data && <Verdict slug={slug} result={send.data} receivedAt={receivedAt} />}
      <RecentTestReadings slug={slug} loggerId={loggerId} />
    </div>
  );
}
