import type { OutgoingMail } from '../../integrations/mail/create-mailer.ts';
import type { AlertNotificationKind } from '../../db/notification-outbox.repo.ts';
import { wallClockText } from '../../policies/time-zones.ts';
import type { AlertStage } from '../../contract/alerts.ts';

/** Escapes text for HTML mail bodies. */
export function esc(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/** What one alert mail tells its reader. */
export interface AlertMailInput {
  to: string;
  labName: string;
  kind: AlertNotificationKind;
  /** Reminder number (1 for the first reminder); ignored for other kinds. */
  sequence: number;
  ruleName: string;
  /** What the rule watches ("Freezer 3 · Cabinet temperature"). */
  watched: string;
  /** The reading that decided it (value with unit, or null for silence) and its time (epoch ms). */
  reading: string | null;
  at: number;
  /** One sentence of what was seen. */
  detail: string;
  /** When the alert opened (for reminders and resolutions). */
  openedAt: number;
  /** The channel page around the moment, or the alert centre for logger-wide rules. */
  link: string;
  /** The logger's IANA time zone: times are given on its wall clock, and in UTC beside. */
  timeZone: string;
  /** The reader's own time zone, when they set one and it is another: their clock is added. */
  readerTimeZone?: string | null;
  /** 'expected' for a bounds rule's early warning (its own headline and caution); default 'crossed'. */
  stage?: AlertStage;
}

const isUtc = (zone: string) => zone === 'UTC' || zone === 'Etc/UTC';

/**
 * "2026-03-04 15:30:00 Europe/Berlin (14:30 UTC)", or "… UTC" alone for a logger on UTC; with
 * a reader's zone of their own that differs, their clock first in the brackets:
 * "2026-03-04 15:30:00 Europe/Berlin (your time 2026-03-04 09:30 America/New_York; 14:30 UTC)".
 */
export function timeText(ms: number, timeZone: string, readerTimeZone?: string | null): string {
  const utc = `${new Date(ms).toISOString().slice(0, 19).replace('T', ' ')} UTC`;
  const reader =
    readerTimeZone && readerTimeZone !== timeZone && !(isUtc(readerTimeZone) && isUtc(timeZone))
      ? `your time ${wallClockText(readerTimeZone, ms).slice(0, 16)} ${readerTimeZone}`
      : null;
  if (isUtc(timeZone)) return reader ? `${utc} (${reader})` : utc;
  const beside = reader ? `${reader}; ${utc.slice(11, 16)} UTC` : `${utc.slice(11, 16)} UTC`;
  return `${wallClockText(timeZone, ms)} ${timeZone} (${beside})`;
}

const HEADLINE: Record<AlertNotificationKind, string> = { opened: 'Alert', reminder: 'Still open', resolved: 'Resolved' };
/** An early warning's headlines: it is a projection, not a crossing, and reads as such from the subject on. */
const WARNING_HEADLINE: Record<AlertNotificationKind, string> = {
  opened: 'Early warning',
  reminder: 'Early warning still open',
  resolved: 'Early warning over',
};
const WARNING_CAUTION = 'An early warning is an estimate from past readings, not a safety system: the limit alert still opens if the limit is passed.';

/**
 * An alert e-mail (opened, reminder, resolved): the rule, what it watches, the reading and its
 * time, what was seen and a link to the channel at that time; with the caution that Lagbook is
 * no certified alarm system.
 */
export function alertMail(input: AlertMailInput): OutgoingMail {
  const when = (ms: number) => timeText(ms, input.timeZone, input.readerTimeZone);
  const warning = input.stage === 'expected';
  const headlines = warning ? WARNING_HEADLINE : HEADLINE;
  const headline = input.kind === 'reminder' ? `${headlines.reminder} (reminder ${input.sequence})` : headlines[input.kind];
  const subject = `[${input.labName}] ${headline}: ${input.ruleName} — ${input.watched}`;
  const lines = [
    `${headline}: the rule "${input.ruleName}" on ${input.watched} in ${input.labName}.`,
    '',
    `What was seen: ${input.detail}.`,
    input.reading !== null ? `Reading: ${input.reading} at ${when(input.at)}.` : `At: ${when(input.at)}.`,
    ...(input.kind !== 'opened' ? [`Open since: ${when(input.openedAt)}.`] : []),
    '',
    `See the channel at that time: ${input.link}`,
    '',
    ...(warning ? [WARNING_CAUTION] : []),
    "Lagbook's alerts depend on networks and mail delivery and are no replacement for a certified alarm system on critical equipment; follow your lab's own safety rules and local regulations.",
    'You receive this because you subscribed to the rule; unsubscribe on the alerts page of the lab.',
  ];
  const html = `<p><strong>${esc(headline)}</strong>: the rule “${esc(input.ruleName)}” on ${esc(input.watched)} in ${esc(input.labName)}.</p>
<p>What was seen: ${esc(input.detail)}.<br>${input.reading !== null ? `Reading: <strong>${esc(input.reading)}</strong> at ${esc(when(input.at))}.` : `At: ${esc(when(input.at))}.`}${input.kind !== 'opened' ? `<br>Open since: ${esc(when(input.openedAt))}.` : ''}</p>
<p><a href="${esc(input.link)}">See the channel at that time</a></p>
<p><small>${warning ? `${esc(WARNING_CAUTION)} ` : ''}Lagbook's alerts depend on networks and mail delivery and are no replacement for a certified alarm system on critical equipment; follow your lab's own safety rules and local regulations. You receive this because you subscribed to the rule; unsubscribe on the alerts page of the lab.</small></p>`;
  return { to: input.to, subject, text: lines.join('\n'), html };
}

/**
 * The channel page link around an alert moment: from a few hours before to an hour after (or
 * to the resolution), as epoch ms in the `from` and `to` query the channel page reads.
 */
export function channelLinkAt(publicUrl: string, labSlug: string, channelId: number, at: number, until?: number): string {
  const from = at - 6 * 3_600_000;
  const to = Math.max(until ?? at, at) + 3_600_000;
  return `${publicUrl}/labs/${encodeURIComponent(labSlug)}/channels/${channelId}?from=${from}&to=${to}`;
}
