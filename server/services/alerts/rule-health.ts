import type { RuleBlindReason, RuleHealth } from '../../contract/alerts.ts';
import type { AlertRuleHealthRecord } from '../../db/alert-rules.repo.ts';
import { SILENT_AFTER_INTERVALS } from '../channels.service.ts';
import { durationWords } from './rules/rule-step.ts';

/** What one evaluation of a value rule saw, for deciding whether the rule is watching. */
export interface HealthObservation {
  /** The evaluation's clock (epoch ms). */
  now: number;
  /** When the rule started watching (a blind state never starts before it). */
  watchingSince: number;
  /** The watched channel's (or its logger's) retirement, or null while in service. */
  retirement: { what: 'channel' | 'logger'; at: number } | null;
  /** Newest reading time of the channel, or null when it never had one. */
  lastReadingTs: number | null;
  /** The channel's expected interval (its own, else its logger's), seconds. */
  expectedIntervalS: number;
  /** Newest reading judged in this step, or null when none was. */
  judgedUpTo: number | null;
  /** Why the readings of this step could not be judged (the unusual-reading rule), and the first of them. */
  notJudged: { reason: 'too-little-history' | 'too-many-gaps'; detail: string; from: number } | null;
}

/** Blind reasons that come from a failed judgement: they last until readings are judged again. */
const JUDGEMENT_REASONS: ReadonlySet<RuleBlindReason> = new Set(['too-little-history', 'too-many-gaps']);

/**
 * Whether a value rule (bounds, rate, unusual) is watching after one evaluation step, from
 * what the step saw and the rule's previous health. Not watching, in this order: the channel
 * or its logger is retired; the channel never had a reading; the logger is silent — no reading
 * for longer than {@link SILENT_AFTER_INTERVALS} expected intervals, the channels table's rule;
 * the step's readings could not be judged (too little history, too many gaps). Else the rule
 * watches when it judged readings, or when its last blind reason has passed; a judgement
 * reason stays until readings are judged again. "Since" is the moment the rule first became
 * blind, kept while it stays blind even when the reason changes (the lab learns how long it
 * was unwatched, not how often the cause was renamed); a new blind spell starts at the
 * moment its cause began (the retirement, the silence limit passing, the first reading not
 * judged), never before the rule started watching nor after `now`. Silence rules have no
 * health: a silent target is their alert. Pure.
 */
export function decideRuleHealth(prev: RuleHealth, o: HealthObservation): RuleHealth {
  const lastJudgedAt = o.judgedUpTo === null ? prev.lastJudgedAt : Math.max(o.judgedUpTo, prev.lastJudgedAt ?? o.judgedUpTo);
  const blind = (reason: RuleBlindReason, detail: string, cause: number): RuleHealth => ({
    lastJudgedAt,
    notWatching: { reason, detail, since: prev.notWatching?.since ?? Math.min(Math.max(cause, o.watchingSince), o.now) },
  });
  if (o.retirement) {
    const detail =
      o.retirement.what === 'channel'
        ? 'The channel was retired; no more readings will come.'
        : "The channel's logger was retired; no more readings will come.";
    return blind('channel-retired', detail, o.retirement.at);
  }
  if (o.lastReadingTs === null) return blind('no-readings', 'No reading has arrived on this channel yet.', o.watchingSince);
  const silentAfterMs = SILENT_AFTER_INTERVALS * o.expectedIntervalS * 1000;
  if (o.now - o.lastReadingTs > silentAfterMs) {
    return blind(
      'logger-silent',
      `No reading for more than ${SILENT_AFTER_INTERVALS} expected intervals (the channel reports every ${durationWords(o.expectedIntervalS * 1000)}).`,
      o.lastReadingTs + silentAfterMs,
    );
  }
  if (o.notJudged) return blind(o.notJudged.reason, o.notJudged.detail, o.notJudged.from);
  if (o.judgedUpTo === null && prev.notWatching && JUDGEMENT_REASONS.has(prev.notWatching.reason)) return { lastJudgedAt, notWatching: prev.notWatching };
  return { lastJudgedAt, notWatching: null };
}

/** Which health mail a change calls for. */
export type HealthMailKind = 'not-watching' | 'watching-again';

/** A rule's recorded health after a step, and the mail to queue with it (if any). */
export interface HealthChange {
  record: AlertRuleHealthRecord;
  mail: HealthMailKind | null;
}

/** Minutes a rule may be blind before its subscribers are told, when neither the rule nor the lab sets a reminder delay. */
export const BLIND_MAIL_DEFAULT_MIN = 60;

/** The delay before the not-watching mail: the rule's reminder delay, else the lab's; 0 or none → {@link BLIND_MAIL_DEFAULT_MIN}. */
export function blindMailDelayMs(ruleReminderMin: number | null, labReminderMin: number | null | undefined): number {
  const min = ruleReminderMin ?? labReminderMin ?? 0;
  return (min > 0 ? min : BLIND_MAIL_DEFAULT_MIN) * 60_000;
}

/**
 * The recorded health after a step and the mail it owes, exactly once per blind spell: a rule
 * that stops watching starts a new spell (its episode number goes up); once it has been blind
 * for `delayMs` (see {@link blindMailDelayMs}) the not-watching mail is due and its time is
 * kept; when it watches again after that mail, the watching-again mail is due. A spell that
 * ends before its mail was due ends quietly. Both mails carry the episode as their sequence, so
 * the outbox's once-only key holds across crashes and reruns. Pure.
 */
export function healthChange(prev: AlertRuleHealthRecord, next: RuleHealth, now: number, delayMs: number): HealthChange {
  if (next.notWatching === null) {
    const owed = prev.notWatching !== null && prev.mailedAt !== null;
    return { record: { lastJudgedAt: next.lastJudgedAt, notWatching: null, episode: prev.episode, mailedAt: null }, mail: owed ? 'watching-again' : null };
  }
  const episode = prev.notWatching === null ? prev.episode + 1 : prev.episode;
  const mailedAt = prev.notWatching === null ? null : prev.mailedAt;
  const due = mailedAt === null && now - next.notWatching.since >= delayMs;
  return {
    record: { lastJudgedAt: next.lastJudgedAt, notWatching: next.notWatching, episode, mailedAt: due ? now : mailedAt },
    mail: due ? 'not-watching' : null,
  };
}

/** Whether two recorded healths are the same (the evaluator skips a write that would change nothing). */
export function sameHealth(a: AlertRuleHealthRecord, b: AlertRuleHealthRecord): boolean {
  return (
    a.lastJudgedAt === b.lastJudgedAt &&
    a.episode === b.episode &&
    a.mailedAt === b.mailedAt &&
    a.notWatching?.reason === b.notWatching?.reason &&
    a.notWatching?.detail === b.notWatching?.detail &&
    a.notWatching?.since === b.notWatching?.since
  );
}
