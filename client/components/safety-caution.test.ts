import { describe, expect, it } from 'vitest';
import { needsSafetyCaution } from './safety-caution.ts';

// Channels of an invented field station (demo scenario); the rule is Lagbook's own.
const ch = (label: string, key: string, unit: string | null, quantity: string | null = null) => ({ label, key, unit, quantity });

describe('needsSafetyCaution', () => {
  it('flags cold-store temperatures and gas concentrations', () => {
    expect(needsSafetyCaution(ch('Seed freezer B', 'frz_b_t', '°C', 'temperature'))).toBe(true);
    expect(needsSafetyCaution(ch('Cold room air', 'coldroom_t', '°C'))).toBe(true);
    expect(needsSafetyCaution(ch('Incubator 2 temperature', 'inc2', '°C'))).toBe(true);
    expect(needsSafetyCaution(ch('Greenhouse CO2', 'gh_co2', 'ppm'))).toBe(true);
    expect(needsSafetyCaution(ch('Bench air', 'bench', '%', 'oxygen'))).toBe(true);
  });

  it('leaves ordinary field channels and dissolved oxygen alone', () => {
    expect(needsSafetyCaution(ch('Air temperature', 'air_t', '°C', 'temperature'))).toBe(false);
    expect(needsSafetyCaution(ch('Soil moisture', 'soil_vwc', '%'))).toBe(false);
    expect(needsSafetyCaution(ch('Pond dissolved oxygen', 'pond_do', 'mg/L', 'dissolved oxygen'))).toBe(false);
    // a capitalised label (the demo's brook gauge) is the same thing
    expect(needsSafetyCaution(ch('Dissolved oxygen saturation', 'do_sat', '%', null))).toBe(false);
    expect(needsSafetyCaution(ch('Incubator door', 'inc_door', 'open/closed'))).toBe(false);
  });
});
