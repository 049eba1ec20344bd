import { describe, expect, it } from 'vitest';
import { LAB_OWNED_TABLES } from '../../db/tenant-scope.ts';
import { DELETION_ORDER } from './deletion-order.ts';

describe('DELETION_ORDER', () => {
  it('names every lab-owned table exactly once (a table added to LAB_OWNED_TABLES must be added here too)', () => {
    expect(new Set(DELETION_ORDER).size).toBe(DELETION_ORDER.length);
    expect([...DELETION_ORDER].sort()).toEqual([...LAB_OWNED_TABLES].sort());
  });

  it('removes channels and ingest keys before the loggers they belong to, and the audit log last', () => {
    const at = (t: string) => DELETION_ORDER.indexOf(t as (typeof DELETION_ORDER)[number]);
    expect(at('channels')).toBeLessThan(at('loggers'));
    expect(at('ingest_keys')).toBeLessThan(at('loggers'));
    expect(DELETION_ORDER.at(-1)).toBe('audit_events');
  });
});
