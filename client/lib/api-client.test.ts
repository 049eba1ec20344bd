import { afterEach, describe, expect, it, vi } from 'vitest';
import { ApiError, apiFetch } from './api-client.ts';

afterEach(() => vi.unstubAllGlobals());

/** A fetch that answers once with `status` and the JSON `body`. */
function answering(status: number, body: unknown) {
  vi.stubGlobal(
    'fetch',
    vi.fn(async () => new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } })),
  );
}

async function failure(): Promise<ApiError> {
  try {
    await apiFetch('/api/v1/labs/x/loggers', { method: 'POST', body: '{}' });
  } catch (err) {
    if (err instanceof ApiError) return err;
  }
  throw new Error('expected an ApiError');
}

// Answers shaped as the server's error middleware writes them (server/http/middleware/error-handler.ts).
describe('apiFetch errors', () => {
  it('carries the refused fields by key beside the message for people', async () => {
    const fields = [{ field: 'validMax', label: 'Highest valid value', reason: 'must be above the lowest valid value' }];
    answering(400, { error: { code: 'invalid_input', message: 'Highest valid value: must be above the lowest valid value.', fields } });
    const err = await failure();
    expect([err.status, err.code, err.message]).toEqual([400, 'invalid_input', 'Highest valid value: must be above the lowest valid value.']);
    expect(err.fields).toEqual(fields);
  });

  it('has no fields for an answer without them, and drops malformed entries', async () => {
    answering(409, { error: { code: 'same_plan', message: 'The lab is already on the Transect plan.' } });
    expect((await failure()).fields).toEqual([]);
    answering(400, {
      error: { code: 'invalid_input', message: 'x', fields: [{ field: 'name' }, 'name', { field: 'site', label: 'Site', reason: 'is too long' }] },
    });
    expect((await failure()).fields).toEqual([{ field: 'site', label: 'Site', reason: 'is too long' }]);
  });
});
