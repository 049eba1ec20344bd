import { describe, expect, it } from 'vitest';
import { createLogWriter } from '../../log-writer.ts';
import type { AlertEvaluator, EvaluationSummary } from './alert-evaluator.ts';
import { alertIngestNudge } from './alert-triggers.ts';
import type { StoredBatch } from '../ingest/ingest-hooks.ts';

const done: EvaluationSummary = { ran: true, opened: 0, resolved: 0, reminders: 0, sent: 0, failed: 0, errors: 0 };

const batch = (tenantId: number, channelId: number) =>
  ({ accepted: 1, target: { tenantId, loggerId: 1 }, channels: [{ channelId }] }) as unknown as StoredBatch;

describe('the after-ingest alert nudge', () => {
  it('settle runs what is waiting at once and resolves only after every run has ended', async () => {
    const calls: Array<[number, number[]]> = [];
    const ended: number[] = [];
    const evaluator = {
      evaluateChannels: async (tenantId: number, channelIds: number[]) => {
        calls.push([tenantId, [...channelIds].sort()]);
        await new Promise((resolve) => setTimeout(resolve, 30));
        ended.push(tenantId);
        return done;
      },
    } as unknown as AlertEvaluator;
    const nudge = alertIngestNudge({ evaluator, logger: createLogWriter({ silent: true }), delayMs: 60_000 });
    nudge.afterCommit!(batch(7, 2));
    nudge.afterCommit!(batch(7, 1));
    nudge.afterCommit!(batch(9, 4));
    expect(calls).toEqual([]); // waiting for the (long) gathering delay
    await nudge.settle();
    expect(calls).toEqual([
      [7, [1, 2]],
      [9, [4]],
    ]);
    expect(ended).toEqual([7, 9]);
    await nudge.settle(); // nothing left: resolves at once
    expect(calls).toHaveLength(2);
  });
});
