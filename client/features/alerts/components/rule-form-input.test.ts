import { describe, expect, it } from 'vitest';
import { checkRuleForm, EMPTY_RULE_FORM, errorsFromServerMessage, formFromRule, placeRuleErrors } from './rule-form-input.ts';

describe('the rule form', () => {
  it('makes a bounds rule body from the typed fields', () => {
    const r = checkRuleForm({ ...EMPTY_RULE_FORM, name: 'Freezer warm', target: 'channel:12', high: '-15', holdS: '300' });
    expect(r).toEqual({
      input: {
        name: 'Freezer warm',
        kind: 'bounds',
        channelId: 12,
        params: { low: null, high: -15, holdS: 300, earlyWarning: null },
        reminderAfterMin: null,
        enabled: true,
      },
    });
  });

  it('gives the server schema messages per field', () => {
    const r = checkRuleForm({ ...EMPTY_RULE_FORM, name: 'Band', target: 'channel:12', low: '9', high: '2', holdS: '-1' });
    expect(r).toEqual({ errors: { 'params.holdS': 'must not be negative (seconds)', 'params.low': 'must be below the high limit' } });
  });

  it('asks for the channel to watch first, in words, and still checks the other fields', () => {
    const r = checkRuleForm({ ...EMPTY_RULE_FORM, name: '', high: '1' });
    expect(r).toEqual({ errors: { channelId: 'Choose the channel to watch', name: expect.any(String) } });
    // a form otherwise valid still refuses to go without a channel
    expect(checkRuleForm({ ...EMPTY_RULE_FORM, name: 'x', high: '1' })).toEqual({ errors: { channelId: 'Choose the channel to watch' } });
  });

  it('says a refusal of a field the form does not show with its label, never its key', () => {
    expect(placeRuleErrors([{ path: ['enabled'], reason: 'must be yes or no (true or false)' }])).toEqual({
      body: 'Rule on: must be yes or no (true or false).',
    });
    expect(placeRuleErrors([{ path: ['params', 'low'], reason: 'must be below the high limit' }])).toEqual({ 'params.low': 'must be below the high limit' });
  });

  it('a silence rule may watch a logger', () => {
    const r = checkRuleForm({ ...EMPTY_RULE_FORM, name: 'Quiet', kind: 'silence', target: 'logger:7', factor: '4' });
    expect(r).toMatchObject({ input: { kind: 'silence', loggerId: 7, params: { factor: 4 } } });
  });

  it('splits server messages into fields', () => {
    expect(errorsFromServerMessage('params.low: must be below the high limit; name: must not be empty')).toEqual({
      'params.low': 'must be below the high limit',
      name: 'must not be empty',
    });
    expect(errorsFromServerMessage('No such channel in this lab.')).toEqual({ body: 'No such channel in this lab.' });
  });

  it('fills the change form from a stored rule of each kind, and gives back the same body', () => {
    const stored = [
      {
        name: 'Freezer warm',
        kind: 'bounds' as const,
        channelId: 12,
        loggerId: null,
        params: { low: null, high: -15, holdS: 300, earlyWarning: null },
        reminderAfterMin: 30,
      },
      {
        name: 'Cold room warm',
        kind: 'bounds' as const,
        channelId: 12,
        loggerId: null,
        params: { low: null, high: 8, holdS: 0, earlyWarning: { horizonMin: 40, chance: 0.85 } },
        reminderAfterMin: null,
      },
      { name: 'Quiet mast', kind: 'silence' as const, channelId: null, loggerId: 7, params: { factor: 4 }, reminderAfterMin: null },
      { name: 'Fast drop', kind: 'rate' as const, channelId: 12, loggerId: null, params: { maxPerMinute: 0.5, direction: 'fall' }, reminderAfterMin: 0 },
      { name: 'Odd night', kind: 'unusual' as const, channelId: 12, loggerId: null, params: { periodH: 24, k: 5, historyCycles: 3 }, reminderAfterMin: null },
    ];
    for (const rule of stored) {
      const form = formFromRule(rule);
      expect(form.name).toBe(rule.name);
      const checked = checkRuleForm(form);
      expect(checked).toMatchObject({ input: { name: rule.name, kind: rule.kind, params: rule.params, reminderAfterMin: rule.reminderAfterMin } });
    }
    expect(formFromRule(stored[0])).toMatchObject({ target: 'channel:12', low: '', high: '-15', holdS: '300', reminderAfterMin: '30' });
    expect(formFromRule(stored[1])).toMatchObject({ earlyWarning: 'on', horizonMin: '40', chancePct: '85' });
    expect(formFromRule(stored[2]).target).toBe('logger:7');
  });

  it('an early warning: off by default, on with the look-ahead and the chance typed in percent', () => {
    const base = { ...EMPTY_RULE_FORM, name: 'Cold room warm', target: 'channel:12', high: '8', holdS: '0' };
    expect(checkRuleForm(base)).toMatchObject({ input: { params: { earlyWarning: null } } });
    expect(checkRuleForm({ ...base, earlyWarning: 'on', horizonMin: '40', chancePct: '80' })).toMatchObject({
      input: { params: { high: 8, earlyWarning: { horizonMin: 40, chance: 0.8 } } },
    });
  });

  it('refuses the early-warning boxes in their own units', () => {
    const base = { ...EMPTY_RULE_FORM, name: 'Cold room warm', target: 'channel:12', high: '8', earlyWarning: 'on' as const };
    expect(checkRuleForm({ ...base, horizonMin: '2', chancePct: '120' })).toEqual({
      errors: {
        'params.earlyWarning.horizonMin': 'must be a whole number of minutes from 5 to 1,440 (one day)',
        'params.earlyWarning.chance': 'must be a percentage from 50 to 99',
      },
    });
    expect(checkRuleForm({ ...base, chancePct: 'lots' })).toEqual({ errors: { 'params.earlyWarning.chance': 'must be a percentage from 50 to 99' } });
  });
});
