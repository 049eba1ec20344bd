import { describe, expect, it, vi } from 'vitest';
import { applyServerError, fieldFromServerError, fieldFromServerMessage, fieldsFromServerError } from './server-field-error.ts';
import { ApiError } from '../lib/api-client.ts';

// The answers below have the shape of the API's invalid-input answer (server/http/middleware/error-handler.ts).
const rangeRefused = new ApiError(400, 'invalid_input', 'Highest valid value: must be above the lowest valid value.', [
  { field: 'validMax', label: 'Highest valid value', reason: 'must be above the lowest valid value' },
]);

describe('fieldFromServerMessage (fallback for text-only answers)', () => {
  it('splits "field: reason" when the field belongs to the form', () => {
    expect(fieldFromServerMessage('email: an invitation to this address is already pending', ['email', 'role'])).toEqual({
      field: 'email',
      reason: 'an invitation to this address is already pending',
    });
  });

  it('returns null for a field the form does not have, or a message without a field', () => {
    expect(fieldFromServerMessage('slug: this address is already taken', ['email'])).toBeNull();
    expect(fieldFromServerMessage('The lab needs at least one admin.', ['email'])).toBeNull();
  });
});

describe('fieldsFromServerError', () => {
  it('places by the structured field, never by the label in the message', () => {
    expect(fieldFromServerError(rangeRefused, ['validMin', 'validMax'])).toEqual({ field: 'validMax', reason: 'must be above the lowest valid value' });
    // the label "Highest valid value" is no form field: the text split alone would find nothing
    expect(fieldFromServerMessage(rangeRefused.message, ['validMin', 'validMax'])).toBeNull();
  });

  it('keeps only the fields the form has, in the answer order', () => {
    const err = new ApiError(400, 'invalid_input', 'Channel key (2nd channel): is required. Lab name: is required.', [
      { field: 'channels.1.key', label: 'Channel key (2nd channel)', reason: 'is required' },
      { field: 'name', label: 'Lab name', reason: 'is required' },
    ]);
    expect(fieldsFromServerError(err, ['name', 'channels.1.key'])).toEqual([
      { field: 'channels.1.key', reason: 'is required' },
      { field: 'name', reason: 'is required' },
    ]);
    expect(fieldsFromServerError(err, ['site'])).toEqual([]);
  });

  it('falls back to the text form when the answer has no fields', () => {
    expect(fieldFromServerError(new ApiError(409, 'x', 'email: already waiting'), ['email'])).toEqual({ field: 'email', reason: 'already waiting' });
    expect(fieldFromServerError(new Error('plain'), ['email'])).toBeNull();
  });
});

describe('applyServerError', () => {
  it('puts each refused field on its field with the plain reason', () => {
    const setError = vi.fn();
    applyServerError(rangeRefused, ['validMin', 'validMax'], setError);
    expect(setError.mock.calls).toEqual([['validMax', { type: 'server', message: 'must be above the lowest valid value' }]]);
  });

  it('says on the form what it cannot place, with the labels', () => {
    const setError = vi.fn();
    const err = new ApiError(400, 'invalid_input', 'Name: is required. Site: is too long.', [
      { field: 'name', label: 'Name', reason: 'is required' },
      { field: 'site', label: 'Site', reason: 'is too long' },
    ]);
    applyServerError(err, ['name'], setError);
    expect(setError.mock.calls).toEqual([
      ['name', { type: 'server', message: 'is required' }],
      ['root.server', { type: 'server', message: 'Site: is too long.' }],
    ]);
  });

  it('puts a coded refusal on its mapped field, a text-form one on its field, and the rest on the form', () => {
    const setError = vi.fn();
    applyServerError(new ApiError(409, 'slug_taken', 'slug: this address is already taken'), ['name', 'slug'], setError);
    applyServerError(new ApiError(409, 'already_member', 'That person already belongs to this lab.'), ['email'], setError, {
      already_member: 'email',
    });
    applyServerError(new ApiError(0, 'network', 'Lagbook could not be reached.'), ['email'], setError);
    expect(setError.mock.calls).toEqual([
      ['slug', { type: 'server', message: 'this address is already taken' }],
      ['email', { type: 'server', message: 'That person already belongs to this lab.' }],
      ['root.server', { type: 'server', message: 'Lagbook could not be reached.' }],
    ]);
  });
});
