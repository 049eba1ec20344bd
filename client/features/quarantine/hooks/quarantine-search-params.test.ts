import { describe, expect, it } from 'vitest';
import { quarantineQuerySchema } from '@shared/contract/quarantine.ts';
import { readQuarantineFilters, writeQuarantineFilters } from './quarantine-search-params.ts';

describe('quarantine filters in the URL', () => {
  it('round-trips and leaves defaults out', () => {
    const filters = { loggerId: 5, reason: 'bad_time' as const, channel: 'air temp', cursor: '1796303000123.7.281474976710' };
    expect(writeQuarantineFilters(filters).toString()).toBe('loggerId=5&reason=bad_time&channel=air+temp&cursor=1796303000123.7.281474976710');
    expect(readQuarantineFilters(writeQuarantineFilters(filters))).toEqual(filters);
    expect(writeQuarantineFilters({ loggerId: null, reason: '', channel: '', cursor: null }).toString()).toBe('');
  });

  it('drops malformed values (an old page number included), and what it keeps the server’s quarantineQuerySchema accepts', () => {
    const read = readQuarantineFilters(new URLSearchParams('loggerId=-2&reason=lost&cursor=abc&page=4'));
    expect(read).toEqual({ loggerId: null, reason: '', channel: '', cursor: null });
    expect(writeQuarantineFilters(read).toString()).toBe('');
    const kept = readQuarantineFilters(new URLSearchParams('loggerId=17&reason=conflicts_with_stored&channel=rh_2&cursor=1796303000123.0.42'));
    expect(quarantineQuerySchema.safeParse({ ...Object.fromEntries(writeQuarantineFilters(kept)), pageSize: '50' }).success).toBe(true);
  });
});
