import { describe, expect, it } from 'vitest';
import { describeAlertRule } from './alert-rule-describe.ts';
import { durationWords } from '../messages.ts';

const watched = { channelId: 1, loggerId: 2, label: 'Cabinet', loggerName: 'Freezer 3', unit: '°C' };

describe('describeAlertRule', () => {
  it('says each kind in words', () => {
    expect(describeAlertRule({ kind: 'bounds', params: { low: null, high: -15, holdS: 300 }, watched })).toBe('Readings above -15 °C for at least 5 minutes');
    expect(describeAlertRule({ kind: 'bounds', params: { low: 2, high: 8, holdS: 0 }, watched })).toBe('Readings below 2 °C or above 8 °C');
    expect(describeAlertRule({ kind: 'bounds', params: { low: null, high: 8, holdS: 0, earlyWarning: { horizonMin: 40, chance: 0.8 } }, watched })).toBe(
      'Readings above 8 °C; warns when a crossing within 40 minutes is at least 80 % likely',
    );
    expect(describeAlertRule({ kind: 'rate', params: { maxPerMinute: 0.5, direction: 'rise' }, watched })).toBe('Rises faster than 0.5 °C per minute');
    expect(describeAlertRule({ kind: 'silence', params: { factor: 3 }, watched })).toBe('No reading for more than 3 × the expected interval');
    expect(describeAlertRule({ kind: 'unusual', params: { k: 5, periodH: 24, historyCycles: 3 }, watched })).toBe(
      'A reading more than 5 robust SD off its usual 24 h pattern',
    );
  });
});

describe('durationWords', () => {
  it('says a hold time in days, hours, minutes and seconds, leaving out the empty parts', () => {
    // 1 day = 86,400 s, 1 h = 3,600 s, 1 min = 60 s (SI Brochure, 9th ed., Table 8)
    expect(durationWords(300)).toBe('5 minutes');
    expect(durationWords(90)).toBe('1 minute 30 seconds');
    expect(durationWords(5400)).toBe('1 hour 30 minutes');
    expect(durationWords(604_800)).toBe('7 days');
    expect(durationWords(86_401)).toBe('1 day 1 second');
    expect(durationWords(1)).toBe('1 second');
    expect(durationWords(0)).toBe('0 seconds');
  });
});
