import { describe, expect, it } from 'vitest';
import { arSpectrum } from './ar-spectrum.ts';

describe('arSpectrum', () => {
  it("equals R's spec.ar on the AR(3) that ar(lh) chooses (R 4.2.2: spec.ar(ar(lh), n.freq = 6, plot = FALSE))", () => {
    // ar(lh): order 3, coefficients and var.pred as printed by R 4.2.2.
    const coefficients = [0.65340168, -0.06362084, -0.2269402];
    const variance = 0.1958671;
    const frequencies = [0, 0.1, 0.2, 0.3, 0.4, 0.5];
    // spec.ar(...)$spec, R 4.2.2 (the coefficients above are R's printed 8 digits, hence 1e-6 relative).
    const expected = [0.48246448167535388, 1.0375638509901457, 0.23550780217007911, 0.08136517797805351, 0.073316115362299983, 0.088214699811551084];
    frequencies.forEach((f, k) => expect(arSpectrum(coefficients, variance, f) / expected[k]).toBeCloseTo(1, 6));
  });

  it('is σ²/(1 + φ² − 2φ cos 2πf) for an AR(1) and σ² for white noise (Brockwell & Davis §4.4)', () => {
    for (const f of [0, 0.01, 0.25, 0.49]) {
      expect(arSpectrum([0.9], 2, f)).toBeCloseTo(2 / (1 + 0.81 - 1.8 * Math.cos(2 * Math.PI * f)), 10);
      expect(arSpectrum([], 2, f)).toBe(2);
    }
  });
});
