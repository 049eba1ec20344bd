import { describe, expect, it } from 'vitest';
import { outsideRangeReason } from './test-reading.service.ts';

// Ranges and values invented for the check; the wording is the API's 409 message.
describe('outsideRangeReason', () => {
  const fridge = { validMin: -40, validMax: 60, unit: '°C' };

  it('names the whole range when both limits are set, and accepts the limits themselves', () => {
    expect(outsideRangeReason(-99999, fridge)).toBe('-99999 °C is outside the valid range -40…60 °C');
    expect(outsideRangeReason(60.5, fridge)).toBe('60.5 °C is outside the valid range -40…60 °C');
    expect(outsideRangeReason(-40, fridge)).toBeNull();
    expect(outsideRangeReason(60, fridge)).toBeNull();
  });

  it('names the one limit that is set, and says nothing without a range', () => {
    expect(outsideRangeReason(-1, { validMin: 0, validMax: null, unit: '%' })).toBe('-1 % is below the valid minimum 0 %');
    expect(outsideRangeReason(101, { validMin: null, validMax: 100, unit: '' })).toBe('101 is above the valid maximum 100');
    expect(outsideRangeReason(1e12, { validMin: null, validMax: null, unit: 'ppm' })).toBeNull();
  });
});
