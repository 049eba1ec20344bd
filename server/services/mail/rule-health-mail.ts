import type { OutgoingMail } from '../../integrations/mail/create-mailer.ts';
import type { RuleHealthNotificationKind } from '../../db/notification-outbox.repo.ts';
import type { RuleBlindReason } from '../../contract/alerts.ts';
import { RULE_BLIND_WORDS } from '../../contract/words/alerts.ts';
import { esc, timeText } from './alert-mail.ts';

/** What one rule-health mail tells its reader. */
export interface RuleHealthMailInput {
  to: string;
  labName: string;
  kind: RuleHealthNotificationKind;
  ruleName: string;
  /** What the rule watches ("Glasshouse logger · Air temperature"). */
  watched: string;
  /** Why the rule is (or was) not watching, and the sentence the evaluator recorded. */
  reason: RuleBlindReason;
  detail: string;
  /** When the rule stopped watching (epoch ms). */
  since: number;
  /** When it watches again (watching-again mail only). */
  at: number;
  /** The channel page. */
  link: string;
  /** The zone the reader's times are given in (see mailTimeZone), with UTC beside. */
  timeZone: string;
}

const CAUTION =
  "Lagbook's alerts depend on networks and mail delivery and are no replacement for a certified alarm system on critical equipment; follow your lab's own safety rules and local regulations.";
const WHY = 'You receive this because you subscribed to the rule; unsubscribe on the alerts page of the lab.';

/**
 * A rule-health e-mail: "not watching" — the rule cannot judge its channel and has not for
 * longer than its delay (what it means: readings raise no alert from it meanwhile) — or
 * "watching again", once it judges readings again. With the safety caution like alert mail.
 */
export function ruleHealthMail(input: RuleHealthMailInput): OutgoingMail {
  const when = (ms: number) => timeText(ms, input.timeZone);
  const why = RULE_BLIND_WORDS[input.reason];
  const blind = input.kind === 'not-watching';
  const headline = blind ? 'Not watching' : 'Watching again';
  const subject = `[${input.labName}] ${headline}: ${input.ruleName} — ${input.watched}`;
  const first = blind
    ? `The rule "${input.ruleName}" in ${input.labName} is not watching ${input.watched} since ${when(input.since)}: ${why}.`
    : `The rule "${input.ruleName}" in ${input.labName} watches ${input.watched} again since ${when(input.at)}.`;
  const second = blind
    ? `${input.detail} Until it watches again, readings of this channel raise no alert from this rule; you will get one more mail when it does.`
    : `It was not watching from ${when(input.since)} (${why}); readings from that time were not judged by it.`;
  const lines = [first, '', second, '', `See the channel: ${input.link}`, '', CAUTION, WHY];
  const html = `<p><strong>${esc(headline)}</strong>: ${esc(first)}</p>
<p>${esc(second)}</p>
<p><a href="${esc(input.link)}">See the channel</a></p>
<p><small>${esc(CAUTION)} ${esc(WHY)}</small></p>`;
  return { to: input.to, subject, text: lines.join('\n'), html };
}
