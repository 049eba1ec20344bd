import { describe, expect, it, vi } from 'vitest';
import { applyServerError, fieldFromServerMessage } from './server-field-error.ts';
import { ApiError } from '../lib/api-client.ts';

// Messages below are quoted from the API contract for issue 4 (labs-api-contract.md).
describe('fieldFromServerMessage', () => {
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

describe('applyServerError', () => {
  it('puts a field message on the field, a coded one on its mapped field, and the rest on the form', () => {
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
