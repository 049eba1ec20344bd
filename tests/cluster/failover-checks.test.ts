import { describe, expect, it } from 'vitest';
import { emptyStoredFindings, judgeCycles, judgeStoredRows } from '../support/cluster-checks.ts';
import { readingTs, readingValue, type BatchRecord, type LoggerSchedule } from '../support/cluster-loggers.ts';

/**
 * The fault test's own checkers, on planted faults (no cluster needed): a check that cannot fail
 * would let the fault test pass on a broken cluster, so each defect it looks for is planted here
 * once and must be reported, and a clean run must report none.
 */
const S: LoggerSchedule = { batchSize: 4, stepMs: 200, startTs: Date.UTC(2026, 11, 4, 8), pauseMs: 0, retryMs: 0, warmEvery: 3 };

/** The rows a correct server stores for `batches` of logger `index`. */
function storedFor(index: number, batches: number[]): Map<number, number> {
  const rows = new Map<number, number>();
  for (const b of batches) for (let k = 0; k < S.batchSize; k++) rows.set(readingTs(S, b, k), readingValue(S, index, b, k));
  return rows;
}

const acked = (batch: number, duplicates = 0, failedAttempts = 0): BatchRecord => ({
  batch,
  acknowledged: true,
  failedAttempts,
  answer: { accepted: S.batchSize - duplicates, duplicates, quarantined: 0 },
});
const unacked = (batch: number): BatchRecord => ({ batch, acknowledged: false, failedAttempts: 1 });

function judge(ledger: BatchRecord[], stored: Map<number, number>) {
  const f = emptyStoredFindings();
  judgeStoredRows(f, 0, stored, [{ run: { ledgers: [ledger] }, schedule: S }]);
  return f;
}

describe('stored readings against the loggers’ ledgers', () => {
  it('a clean run: every acknowledged reading once, an unacknowledged batch wholly stored or absent, a committed-then-failed batch counted', () => {
    const f = judge([acked(0), acked(1, S.batchSize, 2), acked(2), unacked(3), unacked(4)], storedFor(0, [0, 1, 2, 3]));
    expect(f).toMatchObject({ acknowledged: 12, stored: 16, missing: 0, wrongValue: 0, unknown: 0, partlyDuplicateAnswers: 0, unexplainedDuplicates: 0 });
    expect(f.unacknowledged).toEqual({ whole: 1, absent: 1, partial: 0 });
    expect(f.committedBeforeFailure).toBe(1);
    expect(f.examples).toEqual([]);
  });

  it('reports a lost reading, a changed value, a row nobody sent and a half-stored batch', () => {
    const stored = storedFor(0, [0, 1]);
    stored.delete(readingTs(S, 0, 2)); // lost
    stored.set(readingTs(S, 1, 0), -273); // changed
    stored.set(readingTs(S, 9, 0), 20); // from no batch in the ledger
    stored.set(readingTs(S, 2, 0), readingValue(S, 0, 2, 0)); // half of an unacknowledged batch
    stored.set(readingTs(S, 2, 1), readingValue(S, 0, 2, 1));
    const f = judge([acked(0), acked(1), unacked(2)], stored);
    expect({ missing: f.missing, wrongValue: f.wrongValue, unknown: f.unknown, partial: f.unacknowledged.partial }).toEqual({
      missing: 1,
      wrongValue: 1,
      unknown: 1,
      partial: 1,
    });
    expect(f.examples).toHaveLength(4);
  });

  it('reports an answer that found part of its batch already stored, and "all duplicates" on a first attempt', () => {
    const f = judge([acked(0, 2, 1), acked(1, S.batchSize, 0)], storedFor(0, [0, 1]));
    expect({ partly: f.partlyDuplicateAnswers, unexplained: f.unexplainedDuplicates, missing: f.missing }).toEqual({ partly: 1, unexplained: 1, missing: 0 });
  });

  it('chamber 1 reads above the alert limit in every third batch; the other chambers never do', () => {
    expect([0, 1, 2, 3, 4, 5].map((b) => readingValue(S, 0, b, 0) > 30)).toEqual([false, false, true, false, false, true]);
    expect([0, 1, 2, 3, 4, 5].some((b) => readingValue(S, 1, b, 0) > 30)).toBe(false);
  });
});

describe('evaluator cycles in job_runs', () => {
  const T = Date.UTC(2026, 11, 4, 9); // a whole minute: periods of 5 s start on it
  const row = (s: number, finished = true) => ({ periodStart: T + s * 1000, holder: 'vm:1:a', startedAt: '', finishedAt: finished ? 'done' : null });

  it('one row per whole period in the range; the failover window may miss rows', () => {
    const rows = [0, 5, 20, 25].map((s) => row(s));
    const f = judgeCycles(rows, { from: T, to: T + 30_000 }, { from: T + 11_000, to: T + 14_000 }, 5);
    expect(f.missingInWindow).toEqual([T + 10_000]);
    expect(f.missing).toEqual([T + 15_000]);
    expect(f.expected).toBe(5); // 0, 5, 15, 20, 25 (10 lies in the window)
  });

  it('a cycle that never finished is reported; a period cut by the end of the range is not expected', () => {
    const f = judgeCycles([row(0), row(5, false)], { from: T - 2_000, to: T + 12_000 }, { from: 0, to: 0 }, 5);
    expect(f).toMatchObject({ expected: 2, missing: [], unfinished: [T + 5_000] });
  });
});
