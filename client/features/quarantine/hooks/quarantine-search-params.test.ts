import { describe, expect, it } from 'vitest';
import { quarantineQuerySchema } from '../../../../server/http/loggers/loggers.schema.ts';
import { readQuarantineFilters, writeQuarantineFilters } from './quarantine-search-params.ts';

describe('quarantine filters in the URL', () => {
  it('round-trips and leaves defaults out', () => {
    const filters = { loggerId: 5, reason: 'bad_time' as const, page: 3 };
    expect(writeQuarantineFilters(filters).toString()).toBe('loggerId=5&reason=bad_time&page=3');
    expect(readQuarantineFilters(writeQuarantineFilters(filters))).toEqual(filters);
    expect(writeQuarantineFilters({ loggerId: null, reason: '', page: 1 }).toString()).toBe('');
  });

  it('drops malformed values, and what it keeps the server’s quarantineQuerySchema accepts', () => {
    const read = readQuarantineFilters(new URLSearchParams('loggerId=-2&reason=lost&page=1.5'));
    expect(read).toEqual({ loggerId: null, reason: '', page: 1 });
    const kept = readQuarantineFilters(new URLSearchParams('loggerId=17&reason=conflicts_with_stored&page=4'));
    expect(quarantineQuerySchema.safeParse({ ...Object.fromEntries(writeQuarantineFilters(kept)), pageSize: '50' }).success).toBe(true);
  });
});
