import { describe, expect, it } from 'vitest';
import { ruleHealthMail } from './rule-health-mail.ts';

const since = Date.UTC(2026, 11, 4, 9, 15);
const base = {
  to: 'ines@lab.example',
  labName: 'Hollowbrook Glasshouse',
  ruleName: 'Air odd',
  watched: 'Bench logger · Air temperature',
  reason: 'logger-silent' as const,
  detail: 'No reading for more than 3 expected intervals (the channel reports every 5 minutes).',
  since,
  at: since + 3 * 3_600_000,
  link: 'https://lagbook.example/labs/hollowbrook/channels/42',
  timeZone: 'Europe/Berlin',
};

describe('ruleHealthMail', () => {
  it('not watching: the rule, the channel, since when on the reader’s clock, the reason in words, what it means', () => {
    const m = ruleHealthMail({ ...base, kind: 'not-watching' });
    expect(m.subject).toBe('[Hollowbrook Glasshouse] Not watching: Air odd — Bench logger · Air temperature');
    expect(m.text).toContain(
      'The rule "Air odd" in Hollowbrook Glasshouse is not watching Bench logger · Air temperature since 2026-12-04 10:15:00 Europe/Berlin (09:15 UTC): the logger has gone quiet.',
    );
    expect(m.text).toContain('readings of this channel raise no alert from this rule');
    expect(m.text).toContain('no replacement for a certified alarm system');
    expect(m.html).toContain('Bench logger · Air temperature');
  });

  it('watching again: since when, and how long it was blind', () => {
    const m = ruleHealthMail({ ...base, kind: 'watching-again', timeZone: 'UTC' });
    expect(m.subject).toBe('[Hollowbrook Glasshouse] Watching again: Air odd — Bench logger · Air temperature');
    expect(m.text).toContain('watches Bench logger · Air temperature again since 2026-12-04 12:15:00 UTC.');
    expect(m.text).toContain('It was not watching from 2026-12-04 09:15:00 UTC (the logger has gone quiet)');
  });

  it('escapes names in the HTML part', () => {
    expect(ruleHealthMail({ ...base, kind: 'not-watching', ruleName: '<b>x</b>' }).html).toContain('&lt;b&gt;x&lt;/b&gt;');
  });
});
