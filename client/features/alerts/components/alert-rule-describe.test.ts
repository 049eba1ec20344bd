import { describe, expect, it } from 'vitest';
import { describeAlertRule } from './alert-rule-describe.ts';

const watched = { channelId: 1, loggerId: 2, label: 'Cabinet', loggerName: 'Freezer 3', unit: '°C' };

describe('describeAlertRule', () => {
  it('says each kind in words', () => {
    expect(describeAlertRule({ kind: 'bounds', params: { low: null, high: -15, holdS: 300 }, watched })).toBe('Readings above -15 °C for at least 300 s');
    expect(describeAlertRule({ kind: 'bounds', params: { low: 2, high: 8, holdS: 0 }, watched })).toBe('Readings below 2 °C or above 8 °C');
    expect(describeAlertRule({ kind: 'rate', params: { maxPerMinute: 0.5, direction: 'rise' }, watched })).toBe('Rises faster than 0.5 °C per minute');
    expect(describeAlertRule({ kind: 'silence', params: { factor: 3 }, watched })).toBe('No reading for more than 3 × the expected interval');
    expect(describeAlertRule({ kind: 'unusual', params: { k: 5, periodH: 24, historyCycles: 3 }, watched })).toBe(
      'A reading more than 5 robust SD off its usual 24 h pattern',
    );
  });
});
