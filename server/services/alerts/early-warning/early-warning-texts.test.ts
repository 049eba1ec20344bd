import { describe, expect, it } from 'vitest';
import type { StoredProjection } from '../../../db/alerts.repo.ts';
import { bandDecimals, chanceText, warningOpenedText, warningResolvedText } from './early-warning-texts.ts';

const projection: StoredProjection = {
  model: 'ARMA(1,1) on the remainder after the daily cycle',
  limit: 8,
  side: 'high',
  horizonMin: 40,
  chance: 0.8312,
  medianMinutesToCross: 25,
  interval: { level: 0.8, lower: 6.9312, upper: 8.4071 },
  from: 0,
  unit: '°C',
  path: [],
};

describe('early-warning texts', () => {
  it('names the chance, limit with unit, horizon, model and interval', () => {
    expect(warningOpenedText('Cold room 3 · Air', projection, '°C')).toBe(
      'Cold room 3 · Air is likely (p ≈ 0.83) to rise above 8 °C within 40 minutes at its present course — ARMA(1,1) on the remainder after the daily cycle; 80 % interval 6.9–8.4 °C at 40 minutes',
    );
  });

  it('says "fall below" for a low limit and leaves out a missing unit', () => {
    expect(
      warningOpenedText('Tank · Level', { ...projection, side: 'low', limit: 0.25, interval: { level: 0.8, lower: 0.2213, upper: 0.3391 } }, ''),
    ).toContain(
      'to fall below 0.25 within 40 minutes at its present course — ARMA(1,1) on the remainder after the daily cycle; 80 % interval 0.22–0.34 at 40 minutes',
    );
  });

  it('gives the band as many decimals as its width warrants', () => {
    expect(bandDecimals(1.48)).toBe(1);
    expect(bandDecimals(12)).toBe(0);
    expect(bandDecimals(0.118)).toBe(2);
    expect(bandDecimals(0)).toBe(2);
  });

  it('never prints a simulated share as certain', () => {
    expect(chanceText(1)).toBe('0.99');
    expect(chanceText(0)).toBe('0.01');
    expect(chanceText(0.805)).toBe('0.81');
  });

  it('says why a warning resolved', () => {
    expect(warningResolvedText({ why: 'crossed' }, '°C')).toBe('the limit was passed: the limit alert takes over');
    expect(warningResolvedText({ why: 'fell-back', projection: { ...projection, chance: 0.41 } }, '°C')).toBe(
      'the projection fell back (p ≈ 0.41 of passing 8 °C within 40 minutes)',
    );
    expect(warningResolvedText({ why: 'not-projected', detail: 'the channel has had no reading for 2 hours' }, '°C')).toBe(
      'no projection can be made now: the channel has had no reading for 2 hours',
    );
    expect(warningResolvedText({ why: 'rule-changed' }, '°C')).toBe('the early warning was switched off on the rule');
  });
});
