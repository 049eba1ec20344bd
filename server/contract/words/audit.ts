import type { AuditAction } from '../audit.ts';

/**
 * Words of the audit log: the labels of its filters, and the sentence each recorded action is
 * shown with — our own plain words, never the payment service's event names or internal codes
 * (the raw action and its recorded details stay available on demand). One sentence builder per
 * action of AUDIT_ACTIONS: the type makes a missing one a compile error and the unit test fails.
 */

/** Fields of the audit log's filters. */
export const AUDIT_LABELS = {
  action: 'What happened',
  actor: 'Done by',
  from: 'From',
  to: 'To',
  page: 'Page',
  pageSize: 'Entries per page',
} as const;

/** What a sentence is built from: the entry as recorded. */
export interface AuditSentenceInput {
  action: string;
  /** Who did it (null: Lagbook itself, an operator, or a deleted account). */
  actor: { name: string } | null;
  /** The summary written when the action was recorded (older entries may name raw events). */
  summary: string;
  details: Record<string, unknown> | null;
}

type Builder = (e: AuditSentenceInput, who: string) => string;

const text = (v: unknown): string | null => (typeof v === 'string' && v.trim() !== '' ? v : null);
const count = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);
/** "1 row", "3 rows" (with thousands separators). */
export const plural = (n: number, one: string, many = `${one}s`) => `${n.toLocaleString('en-GB')} ${n === 1 ? one : many}`;

/** The subscription states in words. */
const STATUS_WORDS: Record<string, string> = {
  none: 'no subscription',
  active: 'paid up',
  past_due: 'payment overdue',
  canceled: 'cancelled',
};
const statusWords = (v: unknown) => STATUS_WORDS[String(v)] ?? 'changed';

/** Why the payment service changed something, from the event type an older summary names. */
function becauseOf(summary: string): string {
  const event = /\(Stripe ([\w.]+)\)/.exec(summary)?.[1] ?? '';
  if (event === 'invoice.paid') return ' after payment';
  if (event === 'invoice.payment_failed') return ' after a failed payment';
  if (event === 'checkout.session.completed') return ' after checkout';
  if (event === 'customer.subscription.deleted') return ' as the subscription ended';
  if (event.startsWith('customer.subscription.')) return ' as the subscription changed';
  return ' by the payment service';
}

/** A plan's name: from the recorded summary ("… from Seedling to Transect …"), else its key in words. */
function planNames(e: AuditSentenceInput): { from: string; to: string } {
  const m = /from (.+?) to (.+?)(?: plan)?(?: \(|$)/.exec(e.summary);
  const key = (v: unknown) => {
    const k = text(v) ?? 'another';
    return k.charAt(0).toUpperCase() + k.slice(1).replace(/[-_]+/g, ' ');
  };
  return { from: m?.[1]?.replace(/^the /, '').replace(/ plan$/, '') ?? key(e.details?.from), to: m?.[2]?.replace(/ plan$/, '') ?? key(e.details?.to) };
}

/** The stored summary, kept when it is already our own sentence (its author is named in it). */
const asRecorded: Builder = (e) => tidy(e.summary);

/** Our own summaries wrote "row(s)"; a sentence says "rows". */
function tidy(s: string): string {
  return s.replace(/\b(row|channel|day)\(s\)/g, '$1s').replace(/\s*\(Stripe [\w.]+\)/g, '');
}

const LAYOUT_WORDS: Record<string, string> = { auto: 'read automatically', pattern: 'a pattern of their own' };

function bulkSentence(e: AuditSentenceInput, who: string): string {
  const action = (e.details?.action ?? {}) as Record<string, unknown>;
  const c = (e.details?.counts ?? {}) as Record<string, unknown>;
  const selected = count(c.selected) ?? 0;
  const stored = (count(c.stored) ?? 0) + (count(c.alreadyStored) ?? 0);
  const still = count(c.stillQuarantined) ?? 0;
  const outcome = `${plural(stored, 'row')} stored, ${plural(still, 'row')} still in quarantine`;
  switch (action.kind) {
    case 'discard':
      return `${who} discarded ${plural(count(c.discarded) ?? selected, 'quarantined row')}${text(action.reason) ? `: ${String(action.reason)}` : ''}`;
    case 'reread': {
      const layout = text(action.timeFormat) ?? 'auto';
      const how = layout === 'pattern' ? `the pattern ${text(action.timePattern) ?? ''}`.trim() : (LAYOUT_WORDS[layout] ?? 'another time layout');
      return `${who} read the times of ${plural(selected, 'quarantined row')} again (${how}): ${outcome}`;
    }
    case 'shift': {
      const minutes = count(action.offsetMinutes) ?? 0;
      return `${who} moved the times of ${plural(selected, 'quarantined row')} ${minutes < 0 ? 'back' : 'forward'} by ${plural(Math.abs(minutes), 'minute')}: ${outcome}`;
    }
    case 'map-channel':
      return `${who} stored ${plural(selected, 'quarantined row')} under another channel: ${outcome}`;
    default:
      return tidy(e.summary);
  }
}

/** One sentence per recorded action. */
export const AUDIT_SENTENCES: Record<AuditAction, Builder> = {
  'lab.created': asRecorded,
  'lab.updated': asRecorded,
  'lab.exported': (e, who) =>
    `${who} downloaded a full export of the lab${count(e.details?.channels) !== null ? ` (${plural(count(e.details?.channels)!, 'channel')})` : ''}`,
  'invitation.created': (e, who) =>
    text(e.details?.email) ? `${who} invited ${String(e.details!.email)} as ${text(e.details?.role) ?? 'a member'}` : asRecorded(e, who),
  'invitation.resent': (e, who) => (text(e.details?.email) ? `${who} sent the invitation to ${String(e.details!.email)} again` : asRecorded(e, who)),
  'invitation.revoked': (e, who) => (text(e.details?.email) ? `${who} withdrew the invitation to ${String(e.details!.email)}` : asRecorded(e, who)),
  'invitation.accepted': (e, who) => (text(e.details?.role) ? `${who} joined the lab as ${String(e.details!.role)}` : asRecorded(e, who)),
  'member.role-changed': asRecorded,
  'member.removed': asRecorded,
  'member.left': asRecorded,
  'logger.registered': asRecorded,
  'logger.updated': asRecorded,
  'logger.retired': asRecorded,
  'channel.added': asRecorded,
  'channel.updated': asRecorded,
  'channel.retired': asRecorded,
  'ingest-key.issued': asRecorded,
  'ingest-key.rotated': asRecorded,
  'ingest-key.revoked': asRecorded,
  'logger.test-reading': (e, who) => {
    const channel = text(e.details?.channel);
    if (!e.details?.wouldGet) return asRecorded(e, who);
    return `${who} sent a test reading${channel ? ` of "${channel}"` : ''}; a logger's reading like it would go to quarantine, so nothing was kept`;
  },
  'logger.test-reading-removed': asRecorded,
  'logger.uploaded': (e, who) => {
    const d = e.details ?? {};
    if (count(d.accepted) === null) return asRecorded(e, who);
    return `${who} uploaded a history file: ${plural(count(d.accepted)!, 'reading')} stored, ${plural(count(d.quarantined) ?? 0, 'row')} quarantined${d.stopped ? ' (stopped early)' : ''}`;
  },
  'quarantine.discarded': (e, who) =>
    count(e.details?.count) !== null ? `${who} discarded ${plural(count(e.details?.count)!, 'quarantined row')}` : asRecorded(e, who),
  'quarantine.resubmitted': (e, who) => {
    const d = e.details ?? {};
    if (count(d.accepted) === null) return asRecorded(e, who);
    return `${who} sent quarantined rows again: ${plural(count(d.accepted)!, 'row')} stored, ${plural(count(d.quarantinedAgain) ?? 0, 'row')} back in quarantine`;
  },
  'quarantine.bulk-reread': bulkSentence,
  'quarantine.bulk-shifted': bulkSentence,
  'quarantine.bulk-channel-mapped': bulkSentence,
  'quarantine.bulk-discarded': bulkSentence,
  'alert-rule.created': asRecorded,
  'alert-rule.updated': asRecorded,
  'alert-rule.deleted': asRecorded,
  'alert.acknowledged': asRecorded,
  'token.created': asRecorded,
  'token.revoked': asRecorded,
  'billing.checkout-started': asRecorded,
  'billing.plan-change-requested': asRecorded,
  'billing.plan-changed': (e) => {
    const { from, to } = planNames(e);
    return `Plan changed from ${from} to ${to}${becauseOf(e.summary)}`;
  },
  'billing.status-changed': (e) => {
    const to = e.details?.to;
    const grace = text(e.details?.graceUntil)?.slice(0, 10);
    if (to === 'past_due') return `Payment failed: the subscription is overdue${grace ? ` (the lab keeps its plan until ${grace})` : ''}`;
    return `Subscription ${statusWords(to) === 'cancelled' ? 'cancelled' : `now ${statusWords(to)}`}${becauseOf(e.summary)} (was ${statusWords(e.details?.from)})`;
  },
  'note.created': asRecorded,
  'note.updated': asRecorded,
  'note.deleted': asRecorded,
  'note-kind.created': asRecorded,
  'note-kind.updated': asRecorded,
};

/**
 * The sentence an audit entry is shown with: the action's own builder, or for an action this
 * version does not know (kept as recorded) the stored summary. Ends with a full stop.
 */
export function auditSentence(e: AuditSentenceInput): string {
  const who = e.actor?.name ?? 'Lagbook';
  const build = (AUDIT_SENTENCES as Record<string, Builder | undefined>)[e.action] ?? asRecorded;
  const sentence = build(e, who).trim();
  return /[.!?]$/.test(sentence) ? sentence : `${sentence}.`;
}
