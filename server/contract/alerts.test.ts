import { describe, expect, it } from 'vitest';
import { acknowledgeAlertSchema, alertIdParams, channelAlertsQuery, listAlertsQuery, ruleIdParams } from './alerts.ts';

/** The first `field: reason` line zod gives for an input, as the mount function would write it. */
const firstIssue = (result: { success: boolean; error?: { issues: Array<{ path: PropertyKey[]; message: string }> } }) =>
  result.error ? `${result.error.issues[0].path.join('.') || 'body'}: ${result.error.issues[0].message}` : null;

// The alert routes' inputs now parsed by the mount function (they were parsed inside the handlers).
describe('alert route inputs', () => {
  it('acknowledge: no body at all means no note (the handler used to read `req.body ?? {}`); the note is trimmed and bounded', () => {
    expect(acknowledgeAlertSchema.parse(undefined)).toEqual({ note: '' });
    expect(acknowledgeAlertSchema.parse({})).toEqual({ note: '' });
    expect(acknowledgeAlertSchema.parse({ note: '  Door left open; closed.  ' })).toEqual({ note: 'Door left open; closed.' });
    expect(firstIssue(acknowledgeAlertSchema.safeParse({ note: 'x'.repeat(501) }))).toBe('note: must be at most 500 characters');
    expect(firstIssue(acknowledgeAlertSchema.safeParse({ note: 7 }))).toBe('note: must be text');
  });

  it('path ids are positive whole numbers with `field: reason` messages', () => {
    expect(ruleIdParams.parse({ ruleId: '12' })).toEqual({ ruleId: 12 });
    expect(firstIssue(ruleIdParams.safeParse({ ruleId: 'abc' }))).toBe('ruleId: must be a number');
    expect(firstIssue(alertIdParams.safeParse({ alertId: '0' }))).toBe('alertId: must be above 0');
    expect(firstIssue(alertIdParams.safeParse({ alertId: '1.5' }))).toBe('alertId: must be a whole number');
  });

  it('the alert list defaults to everything of the last 7 days and bounds `days`', () => {
    expect(listAlertsQuery.parse({})).toEqual({ status: 'all', days: 7 });
    expect(listAlertsQuery.parse({ status: 'open', days: '30', channelId: '4' })).toEqual({ status: 'open', days: 30, channelId: 4 });
    expect(firstIssue(listAlertsQuery.safeParse({ days: '367' }))).toBe('days: must be at most 366');
    expect(firstIssue(listAlertsQuery.safeParse({ status: 'closed' }))).toBe('status: must be open or all');
  });

  it("a channel's alert range takes epoch ms or ISO 8601 with a zone, like the channel browser", () => {
    // 2026-03-01T00:00:00Z is 1772323200000 ms after the epoch (date -ud 2026-03-01 +%s, ×1000)
    expect(channelAlertsQuery.parse({ from: '2026-03-01T00:00:00Z', to: '1772409600000' })).toEqual({ from: 1772323200000, to: 1772409600000 });
    expect(channelAlertsQuery.parse({})).toEqual({});
    expect(firstIssue(channelAlertsQuery.safeParse({ from: 'yesterday' }))).toMatch(
      /^from: must be a date and time with its zone, e.g. 2026-03-01T00:00:00Z, or milliseconds since 1970/,
    );
  });
});
