import { describe, expect, it } from 'vitest';
import { auditQuerySchema } from '@shared/contract/audit.ts';
import { readAuditFilters, toAuditQuery, writeAuditFilters } from './audit-search-params.ts';

const HOUR = 3_600_000;

describe('audit filters in the URL', () => {
  it('round-trips through search params and leaves defaults out', () => {
    const filters = { action: 'invitation.accepted' as const, actor: 'brennick', from: '2026-01-05', to: '2026-01-09', page: 3 };
    const params = writeAuditFilters(filters);
    expect(params.toString()).toBe('action=invitation.accepted&actor=brennick&from=2026-01-05&to=2026-01-09&page=3');
    expect(readAuditFilters(params)).toEqual(filters);
    expect(writeAuditFilters({ action: '', actor: '  ', from: '', to: '', page: 1 }).toString()).toBe('');
  });

  it('drops what is malformed instead of failing: unknown action, impossible day, bad page', () => {
    const read = readAuditFilters(new URLSearchParams('action=lab.deleted&from=2026-02-30&to=yesterday&page=0&actor=%20ab%20'));
    expect(read).toEqual({ action: '', actor: 'ab', from: '', to: '', page: 1 });
    expect(readAuditFilters(new URLSearchParams('page=2.5')).page).toBe(1);
  });
});

describe('toAuditQuery', () => {
  it('covers whole local days, from the first instant of `from` to the last millisecond of `to`', () => {
    const q = toAuditQuery({ action: '', actor: '', from: '2026-01-05', to: '2026-01-07', page: 1 }, 25);
    const from = new Date(q.from!);
    const to = new Date(q.to!);
    expect([from.getFullYear(), from.getMonth(), from.getDate(), from.getHours(), from.getMinutes()]).toEqual([2026, 0, 5, 0, 0]);
    expect([to.getDate(), to.getHours(), to.getMinutes(), to.getSeconds(), to.getMilliseconds()]).toEqual([7, 23, 59, 59, 999]);
    // Three days minus one millisecond (no time zone switches daylight-saving time on 5–7 January).
    expect(to.getTime() - from.getTime()).toBe(3 * 24 * HOUR - 1);
  });

  it('produces a query the server-side auditQuerySchema accepts unchanged', () => {
    const q = toAuditQuery({ action: 'member.removed', actor: 'olowe', from: '2026-03-01', to: '2026-03-01', page: 2 }, 25);
    const parsed = auditQuerySchema.safeParse(q);
    expect(parsed.success).toBe(true);
    expect(parsed.data).toEqual(q);
    expect(toAuditQuery({ action: '', actor: '', from: '', to: '', page: 1 }, 25)).toEqual({ page: 1, pageSize: 25 });
  });
});
