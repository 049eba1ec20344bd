import { describe, expect, it } from 'vitest';
import { ValidationError } from '../../errors.ts';
import { boundsParamsSchema } from '../../contract/alerts.ts';
import { InvalidAlertRuleError, parseRuleInput } from './alert-errors.ts';

// A PATCH's new params are checked against the stored rule's kind by the service; a failure is
// invalid input like any other (400 invalid_input), while a rule that cannot work stays 422.
describe('parseRuleInput', () => {
  it('answers the parsed value, defaults filled in', () => {
    expect(parseRuleInput(boundsParamsSchema, { high: 8 }, 'params')).toEqual({ low: null, high: 8, holdS: 0, earlyWarning: null });
  });

  it('refuses with 400 invalid_input, every field named by its label and kept by key under the prefix', () => {
    let caught: unknown;
    try {
      parseRuleInput(boundsParamsSchema, { low: 10, high: 8, holdS: -1 }, 'params');
    } catch (err) {
      caught = err;
    }
    expect(caught).toBeInstanceOf(ValidationError);
    const err = caught as ValidationError;
    expect(err.status).toBe(400);
    expect(err.code).toBe('invalid_input');
    expect(err.message).toBe('Outside the limits for at least (seconds): must not be negative (seconds). Low limit: must be below the high limit.');
    expect(err.details).toEqual([
      { field: 'params.holdS', label: 'Outside the limits for at least (seconds)', reason: 'must not be negative (seconds)' },
      { field: 'params.low', label: 'Low limit', reason: 'must be below the high limit' },
    ]);
  });

  it('names the request as a whole when the failure has no path and no prefix is given', () => {
    expect(() => parseRuleInput(boundsParamsSchema, 'not an object')).toThrow(/^The request: must be a group of fields\.$/);
  });
});

describe('InvalidAlertRuleError', () => {
  it('is the 422 invalid_rule refusal of a well-formed rule that cannot work', () => {
    const err = new InvalidAlertRuleError('params.periodH: must span at least two expected intervals of the channel (60 s each)');
    expect([err.status, err.code]).toEqual([422, 'invalid_rule']);
  });
});
