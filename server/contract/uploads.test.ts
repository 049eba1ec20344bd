import { describe, expect, it } from 'vitest';
import { uploadQuerySchema } from './uploads.ts';
import { issueKeySchema } from './loggers.ts';

/** The one-line message the API gives for a failed parse (`field: reason`, joined by "; "). */
const messageOf = (query: unknown): string | null => {
  const result = uploadQuerySchema.safeParse(query);
  return result.success ? null : result.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ');
};

describe('upload query (options as JSON text)', () => {
  it('parses the options into the reading layout, with its defaults', () => {
    const result = uploadQuerySchema.parse({ options: JSON.stringify({ format: 'long', timeColumn: 'ts', channelColumn: 'channel', valueColumn: 'value' }) });
    expect(result.options).toEqual({ format: 'long', delimiter: ',', timeColumn: 'ts', channelColumn: 'channel', valueColumn: 'value', timeFormat: 'auto' });
  });

  it('names a refused option by its own name, not as options.<name>', () => {
    expect(messageOf({ options: JSON.stringify({ format: 'tall', timeColumn: 'ts' }) })).toBe(
      'format: must be long (one reading a line) or wide (one column a channel)',
    );
    expect(messageOf({ options: JSON.stringify({ format: 'long', timeColumn: 'ts' }) })).toBe(
      'format: a long file needs its channel column and its value column named',
    );
    expect(messageOf({ options: JSON.stringify({ format: 'wide', timeColumn: 'ts', columns: { a: null } }) })).toBe(
      'columns: a wide file needs at least one column stored under a channel',
    );
  });

  it('refuses text that is not JSON, and a missing or empty options', () => {
    expect(messageOf({ options: '{format' })).toBe('options: could not be read (the form sends them; a script must send them as JSON)');
    expect(messageOf({ options: '' })).toBe('options: could not be read (the form sends them; a script must send them as JSON)');
    expect(messageOf({})).toMatch(/^options: /);
  });
});

describe('issuing an ingest key', () => {
  it('reads no body as no rotation, and keeps rotate when sent', () => {
    expect(issueKeySchema.parse(undefined)).toEqual({ rotate: false });
    expect(issueKeySchema.parse({ rotate: true })).toEqual({ rotate: true });
    expect(issueKeySchema.safeParse({ rotate: 'yes' }).success).toBe(false);
  });
});
