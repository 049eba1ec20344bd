import { describe, expect, it } from 'vitest';
import { addMonths, monthPartitionName, monthStartOf, nextMonthStart, parseMonthPartitionName, partitionClause } from './reading-partitions.ts';

/**
 * Month names and bounds of the partition layout. Epoch-millisecond month starts are checked
 * against GNU coreutils 9.1: `date -u -d 2026-11-01 +%s` → 1793491200 (and likewise for the other
 * dates below, ×1000).
 */
const NOV_2026 = 1793491200000; // date -u -d 2026-11-01 +%s
const DEC_2026 = 1796083200000; // date -u -d 2026-12-01 +%s
const JAN_2027 = 1798761600000; // date -u -d 2027-01-01 +%s
const FEB_2024 = 1706745600000; // date -u -d 2024-02-01 +%s
const MAR_2024 = 1709251200000; // date -u -d 2024-03-01 +%s

describe('month partition names and bounds', () => {
  it('builds and parses pYYYYMM names in one place', () => {
    expect(monthPartitionName(NOV_2026)).toBe('p202611');
    expect(monthPartitionName(NOV_2026 + 17 * 86_400_000 + 5)).toBe('p202611');
    expect(parseMonthPartitionName('p202611')).toBe(NOV_2026);
    expect(parseMonthPartitionName('p202701')).toBe(JAN_2027);
    for (const bad of ['p_before', 'p_future', 'p202613', 'p202600', 'p20261', 'x202611', 'p202611; DROP TABLE labs'])
      expect(parseMonthPartitionName(bad)).toBeNull();
  });

  it('month starts and ends in UTC, across a year end and a leap February', () => {
    expect(monthStartOf(DEC_2026 - 1)).toBe(NOV_2026);
    expect(nextMonthStart(DEC_2026)).toBe(JAN_2027);
    expect(addMonths(NOV_2026, 2)).toBe(JAN_2027);
    expect(addMonths(JAN_2027, -2)).toBe(NOV_2026);
    expect(nextMonthStart(FEB_2024) - FEB_2024).toBe(29 * 86_400_000);
    expect(nextMonthStart(FEB_2024)).toBe(MAR_2024);
  });

  it('the partition clause covers everything without gaps: p_before, each month, p_future', () => {
    expect(partitionClause('readings', NOV_2026, JAN_2027)).toBe(
      [
        'PARTITION BY RANGE (ts) (',
        `  PARTITION p_before VALUES LESS THAN (${NOV_2026}),`,
        `  PARTITION p202611 VALUES LESS THAN (${DEC_2026}),`,
        `  PARTITION p202612 VALUES LESS THAN (${JAN_2027}),`,
        `  PARTITION p202701 VALUES LESS THAN (${nextMonthStart(JAN_2027)}),`,
        '  PARTITION p_future VALUES LESS THAN MAXVALUE',
        ')',
      ].join('\n'),
    );
    expect(partitionClause('reading_rollups', NOV_2026, NOV_2026)).toContain('PARTITION BY RANGE (bucket_start)');
  });
});
