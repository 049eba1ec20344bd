import { describe, expect, it } from 'vitest';
import { alertMail, channelLinkAt } from './alert-mail.ts';

const at = Date.UTC(2026, 2, 4, 14, 30);
const base = {
  to: 'ines@lab.example',
  labName: 'Hollowbrook Cryo Store',
  ruleName: 'Freezer too warm',
  watched: 'Freezer 3 · Cabinet temperature',
  reading: '-12.5 °C',
  at,
  detail: '-12.5 is above the high limit -15 for 300 s',
  openedAt: at,
  link: channelLinkAt('https://lagbook.example', 'hollowbrook', 42, at),
  timeZone: 'UTC',
};

describe('alertMail', () => {
  it('an opened alert names the rule, the reading, its time and links the channel at that time', () => {
    const m = alertMail({ ...base, kind: 'opened', sequence: 0 });
    expect(m.subject).toBe('[Hollowbrook Cryo Store] Alert: Freezer too warm — Freezer 3 · Cabinet temperature');
    expect(m.text).toContain('Reading: -12.5 °C at 2026-03-04 14:30:00 UTC.');
    expect(m.text).toContain(`https://lagbook.example/labs/hollowbrook/channels/42?from=${at - 6 * 3_600_000}&to=${at + 3_600_000}`);
    expect(m.text).toContain('no replacement for a certified alarm system');
    expect(m.text).not.toContain('Open since');
  });

  it('an early warning reads as one, from the subject on, with its own caution', () => {
    const opened = alertMail({ ...base, kind: 'opened', sequence: 0, stage: 'expected' });
    expect(opened.subject).toBe('[Hollowbrook Cryo Store] Early warning: Freezer too warm — Freezer 3 · Cabinet temperature');
    expect(opened.text).toContain('an estimate from past readings, not a safety system');
    expect(opened.html).toContain('an estimate from past readings, not a safety system');
    expect(opened.text).toContain('no replacement for a certified alarm system');
    const over = alertMail({ ...base, kind: 'resolved', sequence: 0, stage: 'expected' });
    expect(over.subject).toContain('Early warning over: Freezer too warm');
    const crossed = alertMail({ ...base, kind: 'opened', sequence: 0, stage: 'crossed' });
    expect(crossed.subject).toContain('] Alert: Freezer too warm');
    expect(crossed.text).not.toContain('not a safety system');
  });

  it('a reminder is numbered and says since when the alert is open', () => {
    const m = alertMail({ ...base, kind: 'reminder', sequence: 2, at: at + 7_200_000 });
    expect(m.subject).toContain('Still open (reminder 2): Freezer too warm');
    expect(m.text).toContain('Open since: 2026-03-04 14:30:00 UTC.');
  });

  it('gives times on the logger’s wall clock with UTC beside, across a daylight-saving change', () => {
    // IANA tz database: Europe/Berlin is UTC+1 until the last Sunday of March 2026 (29 March), UTC+2 after.
    const winter = alertMail({ ...base, kind: 'opened', sequence: 0, timeZone: 'Europe/Berlin' });
    expect(winter.text).toContain('Reading: -12.5 °C at 2026-03-04 15:30:00 Europe/Berlin (14:30 UTC).');
    const summer = alertMail({ ...base, kind: 'reminder', sequence: 1, at: Date.UTC(2026, 3, 2, 14, 30), timeZone: 'Europe/Berlin' });
    expect(summer.text).toContain('at 2026-04-02 16:30:00 Europe/Berlin (14:30 UTC).');
    expect(summer.text).toContain('Open since: 2026-03-04 15:30:00 Europe/Berlin (14:30 UTC).');
    expect(summer.html).toContain('2026-04-02 16:30:00 Europe/Berlin (14:30 UTC)');
  });

  it("adds the reader's own clock when they set a zone that differs from the logger's", () => {
    // IANA tz database: America/New_York is UTC−5 until the second Sunday of March 2026 (8 March),
    // UTC−4 after; Europe/Berlin as above; Asia/Tokyo is UTC+9 all year.
    const berlin = alertMail({ ...base, kind: 'opened', sequence: 0, timeZone: 'Europe/Berlin', readerTimeZone: 'America/New_York' });
    expect(berlin.text).toContain('at 2026-03-04 15:30:00 Europe/Berlin (your time 2026-03-04 09:30 America/New_York; 14:30 UTC).');
    const later = alertMail({
      ...base,
      kind: 'reminder',
      sequence: 1,
      at: Date.UTC(2026, 2, 10, 14, 30),
      timeZone: 'Europe/Berlin',
      readerTimeZone: 'America/New_York',
    });
    expect(later.text).toContain('at 2026-03-10 15:30:00 Europe/Berlin (your time 2026-03-10 10:30 America/New_York; 14:30 UTC).');
    // a logger on UTC, a reader in Tokyo: the next calendar day on the reader's clock
    const utc = alertMail({ ...base, kind: 'opened', sequence: 0, at: Date.UTC(2026, 2, 4, 20, 0), readerTimeZone: 'Asia/Tokyo' });
    expect(utc.text).toContain('at 2026-03-04 20:00:00 UTC (your time 2026-03-05 05:00 Asia/Tokyo).');
    // the same zone as the logger's, or none: nothing added
    expect(alertMail({ ...base, kind: 'opened', sequence: 0, timeZone: 'Europe/Berlin', readerTimeZone: 'Europe/Berlin' }).text).toContain(
      'Europe/Berlin (14:30 UTC).',
    );
    expect(alertMail({ ...base, kind: 'opened', sequence: 0, readerTimeZone: null }).text).not.toContain('your time');
  });

  it('escapes HTML in names', () => {
    const m = alertMail({ ...base, kind: 'resolved', sequence: 0, ruleName: '<b>x</b> & "y"' });
    expect(m.html).toContain('&lt;b&gt;x&lt;/b&gt; &amp; &quot;y&quot;');
    expect(m.html).not.toContain('<b>x</b>');
  });

  it('a silence alert has no reading', () => {
    const m = alertMail({ ...base, kind: 'opened', sequence: 0, reading: null, detail: 'no reading for 15 min (limit 10 min)' });
    expect(m.text).toContain('At: 2026-03-04 14:30:00 UTC.');
    expect(m.text).not.toContain('Reading:');
  });
});
