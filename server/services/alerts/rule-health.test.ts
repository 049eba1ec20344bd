import { describe, expect, it } from 'vitest';
import type { RuleHealth } from '../../contract/alerts.ts';
import type { AlertRuleHealthRecord } from '../../db/alert-rules.repo.ts';
import { blindMailDelayMs, decideRuleHealth, healthChange, type HealthObservation } from './rule-health.ts';

const MIN = 60_000;
const now = Date.UTC(2026, 11, 4, 12, 0);
const watching: RuleHealth = { lastJudgedAt: now - 10 * MIN, notWatching: null };
/** A channel reporting every minute, last heard a minute ago, nothing judged in this step. */
const base: HealthObservation = {
  now,
  watchingSince: now - 86_400_000,
  retirement: null,
  lastReadingTs: now - MIN,
  expectedIntervalS: 60,
  judgedUpTo: null,
  notJudged: null,
};

describe('decideRuleHealth', () => {
  const cases: Array<{ name: string; prev: RuleHealth; seen: Partial<HealthObservation>; want: RuleHealth }> = [
    {
      name: 'judged readings: watching, last judged advances',
      prev: watching,
      seen: { judgedUpTo: now - MIN },
      want: { lastJudgedAt: now - MIN, notWatching: null },
    },
    {
      name: 'nothing new but the logger reports: still watching',
      prev: watching,
      seen: {},
      want: watching,
    },
    {
      name: 'never a reading: no-readings since the rule started watching',
      prev: { lastJudgedAt: null, notWatching: null },
      seen: { lastReadingTs: null },
      want: { lastJudgedAt: null, notWatching: { reason: 'no-readings', detail: 'No reading has arrived on this channel yet.', since: base.watchingSince } },
    },
    {
      name: 'silent for more than 3 expected intervals: logger-silent from the moment the limit passed',
      prev: watching,
      seen: { lastReadingTs: now - 10 * MIN },
      want: {
        lastJudgedAt: watching.lastJudgedAt,
        notWatching: {
          reason: 'logger-silent',
          detail: 'No reading for more than 3 expected intervals (the channel reports every 60 seconds).',
          since: now - 7 * MIN,
        },
      },
    },
    {
      name: 'exactly 3 intervals is not silent yet (the channels table rule: more than 3)',
      prev: watching,
      seen: { lastReadingTs: now - 3 * MIN },
      want: watching,
    },
    {
      name: 'retired channel wins over silence',
      prev: watching,
      seen: { retirement: { what: 'channel', at: now - 30 * MIN }, lastReadingTs: now - 60 * MIN },
      want: {
        lastJudgedAt: watching.lastJudgedAt,
        notWatching: { reason: 'channel-retired', detail: 'The channel was retired; no more readings will come.', since: now - 30 * MIN },
      },
    },
    {
      name: 'retired logger',
      prev: watching,
      seen: { retirement: { what: 'logger', at: now - 5 * MIN } },
      want: {
        lastJudgedAt: watching.lastJudgedAt,
        notWatching: { reason: 'channel-retired', detail: "The channel's logger was retired; no more readings will come.", since: now - 5 * MIN },
      },
    },
    {
      name: 'readings not judged: the reason from the rule, since the first reading not judged',
      prev: watching,
      seen: { notJudged: { reason: 'too-little-history', detail: 'Only two cycles.', from: now - 2 * MIN } },
      want: { lastJudgedAt: watching.lastJudgedAt, notWatching: { reason: 'too-little-history', detail: 'Only two cycles.', since: now - 2 * MIN } },
    },
    {
      name: 'a judgement reason stays while no new readings arrive',
      prev: { lastJudgedAt: null, notWatching: { reason: 'too-many-gaps', detail: 'Gaps.', since: now - 9 * MIN } },
      seen: {},
      want: { lastJudgedAt: null, notWatching: { reason: 'too-many-gaps', detail: 'Gaps.', since: now - 9 * MIN } },
    },
    {
      name: 'a silence that has passed clears without new judgement',
      prev: { lastJudgedAt: now - 20 * MIN, notWatching: { reason: 'logger-silent', detail: 'x', since: now - 15 * MIN } },
      seen: {},
      want: { lastJudgedAt: now - 20 * MIN, notWatching: null },
    },
    {
      name: 'a change of reason keeps "since" from the first blind moment',
      prev: { lastJudgedAt: null, notWatching: { reason: 'no-readings', detail: 'x', since: now - 50 * MIN } },
      seen: { notJudged: { reason: 'too-little-history', detail: 'Short.', from: now - MIN } },
      want: { lastJudgedAt: null, notWatching: { reason: 'too-little-history', detail: 'Short.', since: now - 50 * MIN } },
    },
    {
      name: 'a blind spell never starts before the rule started watching',
      prev: watching,
      seen: { watchingSince: now - 2 * MIN, lastReadingTs: now - 60 * MIN },
      want: {
        lastJudgedAt: watching.lastJudgedAt,
        notWatching: {
          reason: 'logger-silent',
          detail: 'No reading for more than 3 expected intervals (the channel reports every 60 seconds).',
          since: now - 2 * MIN,
        },
      },
    },
  ];
  for (const c of cases) it(c.name, () => expect(decideRuleHealth(c.prev, { ...base, ...c.seen })).toEqual(c.want));

  it('changes none of its inputs', () => {
    const prev = Object.freeze({ lastJudgedAt: 1, notWatching: Object.freeze({ reason: 'no-readings' as const, detail: 'x', since: 1 }) });
    expect(() => decideRuleHealth(prev, Object.freeze({ ...base, judgedUpTo: now }))).not.toThrow();
  });
});

describe('healthChange (the blind and recovery mail, once each)', () => {
  const blindSince = now - 30 * MIN;
  const blind: RuleHealth = { lastJudgedAt: null, notWatching: { reason: 'too-little-history', detail: 'Short.', since: blindSince } };
  const fresh: AlertRuleHealthRecord = { lastJudgedAt: null, notWatching: null, episode: 0, mailedAt: null };
  const hour = 60 * MIN;

  it('a new blind spell counts an episode and mails nothing before the delay', () => {
    expect(healthChange(fresh, blind, now, hour)).toEqual({ record: { ...blind, episode: 1, mailedAt: null }, mail: null });
  });
  it('after the delay the not-watching mail is due once, and its time kept', () => {
    const first = healthChange({ ...fresh, ...blind, episode: 1 }, blind, blindSince + hour, hour);
    expect(first).toEqual({ record: { ...blind, episode: 1, mailedAt: blindSince + hour }, mail: 'not-watching' });
    const again = healthChange(first.record, blind, blindSince + 2 * hour, hour);
    expect(again).toEqual({ record: first.record, mail: null });
  });
  it('watching again after the mail: the watching-again mail, once', () => {
    const mailed: AlertRuleHealthRecord = { ...blind, episode: 1, mailedAt: blindSince + hour };
    const back = healthChange(mailed, { lastJudgedAt: now, notWatching: null }, now + hour, hour);
    expect(back).toEqual({ record: { lastJudgedAt: now, notWatching: null, episode: 1, mailedAt: null }, mail: 'watching-again' });
    expect(healthChange(back.record, { lastJudgedAt: now, notWatching: null }, now + 2 * hour, hour).mail).toBeNull();
  });
  it('a spell that ends before its mail was due ends quietly', () => {
    expect(healthChange({ ...blind, episode: 1, mailedAt: null }, { lastJudgedAt: now, notWatching: null }, now, hour).mail).toBeNull();
  });
  it('the next spell is a new episode, so its mails are new outbox keys', () => {
    const after: AlertRuleHealthRecord = { lastJudgedAt: now, notWatching: null, episode: 1, mailedAt: null };
    expect(healthChange(after, blind, now, hour).record.episode).toBe(2);
  });
  it('the delay: the rule’s reminder delay, else the lab’s, 0 or none → 1 hour', () => {
    expect([
      blindMailDelayMs(15, 60),
      blindMailDelayMs(null, 30),
      blindMailDelayMs(0, 30),
      blindMailDelayMs(null, 0),
      blindMailDelayMs(null, undefined),
    ]).toEqual([15 * MIN, 30 * MIN, hour, hour, hour]);
  });
});
