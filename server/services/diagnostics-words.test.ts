import { describe, expect, it } from 'vitest';
import { channelDiagnostics, AnalysisInputError, rangeComparison, type AnalysisInputReason } from '../analysis/index.ts';
import {
  analysisRefusal,
  countWords,
  DIAGNOSTICS_FIELD_LABELS,
  durationWords,
  RESOLVED_PARAMETER_LABELS,
  stepAdjective,
} from '../contract/words/diagnostics.ts';

/** What a person-facing sentence must never hold: a camelCase identifier or a snake_case key. */
const IDENTIFIER = /\b[a-z]+[A-Z][A-Za-z0-9]*\b|\b[a-z]+_[a-z_]+\b/;

const TEN_MINUTES = { stepS: 600, difference: 0, seasonalDifference: 0 };

/** Runs `fn` and returns the AnalysisInputError it throws (fails the test when it throws none). */
function refusalOf(fn: () => unknown): AnalysisInputError {
  try {
    fn();
  } catch (error) {
    if (error instanceof AnalysisInputError) return error;
    throw error;
  }
  throw new Error('expected an AnalysisInputError');
}

/** n readings 10 minutes apart with a daily swing (behaviour check only, no reference values). */
function readings(n: number, stepMs = 600_000): { timestamps: number[]; values: number[] } {
  const timestamps = Array.from({ length: n }, (_, i) => i * stepMs);
  return { timestamps, values: timestamps.map((_, i) => 20 + Math.sin(i / 7) + (i % 3) / 10) };
}

describe('durationWords / stepAdjective / countWords', () => {
  it('names steps and cycles in whole units, as people say them', () => {
    expect(durationWords(600)).toBe('10 minutes');
    expect(durationWords(3_600)).toBe('1 hour');
    expect(durationWords(86_400)).toBe('1 day');
    expect(durationWords(90)).toBe('90 seconds');
    expect(durationWords(1)).toBe('1 second');
    expect(stepAdjective(3_600)).toBe('hourly');
    expect(stepAdjective(86_400)).toBe('daily');
    expect(stepAdjective(600)).toBe('10-minute');
    expect(stepAdjective(43_200)).toBe('12-hour');
    expect(stepAdjective(30)).toBe('30-second');
    expect(countWords(2016)).toBe('2,016');
  });
});

describe('analysisRefusal', () => {
  it('turns the engine’s too-short refusal after seasonal differencing into what was left, what is needed and what to do', () => {
    // 53 hourly cells, daily cycle removed by a seasonal difference: 29 values are left (the engine needs 30)
    const error = refusalOf(() =>
      channelDiagnostics(readings(53, 3_600_000), { step: 3_600_000, agg: 'mean', period: 24, seasonalDifference: 1, decomposition: 'none' }),
    );
    expect(error.detail).toEqual({ reason: 'too-few-after-differencing', need: 30, got: 29, period: 24 });
    expect(analysisRefusal(error.detail, { stepS: 3_600, difference: 0, seasonalDifference: 1 })).toBe(
      'After removing the daily cycle, 29 values are left and at least 30 are needed for the correlations and tests to mean anything. Choose a longer range or a shorter step.',
    );
  });

  it('names both differences when both were taken', () => {
    const text = analysisRefusal({ reason: 'too-few-after-differencing', need: 30, got: 8, period: 144 }, { stepS: 600, difference: 1, seasonalDifference: 1 });
    expect(text).toBe(
      'After removing the daily cycle and taking the change from step to step, 8 values are left and at least 30 are needed for the correlations and tests to mean anything. Choose a longer range or a shorter step.',
    );
  });

  it('reports a too-short range without differencing with its count and step', () => {
    const error = refusalOf(() => channelDiagnostics(readings(20), { step: 600_000, agg: 'mean', decomposition: 'none' }));
    expect(error.detail).toEqual({ reason: 'too-few-values', need: 30, got: 20 });
    expect(analysisRefusal(error.detail, TEN_MINUTES)).toBe(
      'The chosen range gave 20 values in 10-minute steps, and this analysis needs at least 30 to give dependable figures. Choose a longer range or a shorter step.',
    );
  });

  it('carries the typed reason through the comparison engine: range and counts', () => {
    const error = refusalOf(() => rangeComparison(readings(4), readings(40), { step: 600_000, agg: 'mean' }));
    expect(error.detail).toEqual({ reason: 'too-few-in-range', need: 10, got: 4, range: 'a' });
    expect(analysisRefusal(error.detail, TEN_MINUTES)).toBe(
      'Range A gave 4 values in 10-minute steps; comparing means needs at least 10 in each range. Choose a longer range or a shorter step.',
    );
  });

  it('says a constant range has nothing to analyse', () => {
    const flat = { timestamps: readings(60).timestamps, values: new Array(60).fill(4) };
    const error = refusalOf(() => channelDiagnostics(flat, { step: 600_000, agg: 'mean', decomposition: 'none', period: 'none' }));
    expect(error.detail.reason).toBe('constant');
    expect(analysisRefusal(error.detail, TEN_MINUTES)).toMatch(/^The readings do not change in the chosen range/);
  });

  it('writes every reason without identifiers, and a sentence that ends with what to do', () => {
    const reasons: AnalysisInputReason[] = [
      'too-few-values',
      'too-few-cells',
      'too-few-after-differencing',
      'too-few-pairs',
      'too-few-periods',
      'too-few-in-range',
      'too-few-independent',
      'period-too-long',
      'no-period',
      'constant',
      'straight-line',
      'too-many-cells',
      'unstable-model',
      'bad-option',
    ];
    const texts = new Set<string>();
    for (const reason of reasons) {
      const text = analysisRefusal({ reason, need: 30, got: 8, period: 144, range: 'b' }, { stepS: 600, difference: 1, seasonalDifference: 1 });
      expect(text, reason).not.toMatch(IDENTIFIER);
      expect(text, reason).toMatch(/\.$/);
      texts.add(text);
    }
    expect(texts.size).toBe(reasons.length); // one sentence of its own per reason
  });
});

describe('labels', () => {
  it('labels every query field and resolved parameter in words, never by its key', () => {
    for (const [key, label] of [...Object.entries(DIAGNOSTICS_FIELD_LABELS), ...Object.entries(RESOLVED_PARAMETER_LABELS)]) {
      expect(label, key).not.toMatch(IDENTIFIER);
      expect(label, key).not.toBe(key);
    }
  });
});
