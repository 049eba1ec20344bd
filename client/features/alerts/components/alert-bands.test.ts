import { describe, expect, it } from 'vitest';
import { alertBands } from './alert-bands.ts';
import type { Alert } from '@shared/contract/alerts.ts';

const alert = (over: Partial<Alert>): Alert => ({
  id: 1,
  ruleId: 1,
  ruleName: 'Freezer warm',
  kind: 'bounds',
  stage: 'crossed',
  projection: null,
  channelId: 5,
  loggerId: null,
  open: false,
  openedAt: 100,
  openedValue: 1,
  openedDetail: '',
  resolvedAt: 200,
  resolvedValue: 0,
  resolvedDetail: '',
  remindersSent: 0,
  acknowledged: null,
  ...over,
});

describe('alertBands', () => {
  it('keeps an alert inside the range as it is', () => {
    expect(alertBands([alert({})], { from: 0, to: 1000 }, 5000)).toEqual([{ from: 100, to: 200, label: 'Freezer warm', open: false }]);
  });
  it('clips to the range and runs an open alert until now', () => {
    expect(alertBands([alert({ openedAt: 50, resolvedAt: null, open: true })], { from: 80, to: 1000 }, 600)).toEqual([
      { from: 80, to: 600, label: 'Freezer warm (open)', open: true },
    ]);
  });
  it('widens a very short alert to 1/200 of the range, inside the range', () => {
    expect(alertBands([alert({ openedAt: 500, resolvedAt: 501 })], { from: 0, to: 1000 }, 5000)).toEqual([
      { from: 500, to: 505, label: 'Freezer warm', open: false },
    ]);
    expect(alertBands([alert({ openedAt: 998, resolvedAt: 999 })], { from: 0, to: 1000 }, 5000)).toEqual([
      { from: 995, to: 1000, label: 'Freezer warm', open: false },
    ]);
  });
  it('names an early warning’s band as expected to cross', () => {
    expect(alertBands([alert({ stage: 'expected', openedAt: 50, resolvedAt: null, open: true })], { from: 80, to: 1000 }, 600)).toEqual([
      { from: 80, to: 600, label: 'Freezer warm — expected to cross (open)', open: true },
    ]);
  });
  it('drops alerts outside the range', () => {
    expect(alertBands([alert({ openedAt: 10, resolvedAt: 20 }), alert({ openedAt: 2000, resolvedAt: 3000 })], { from: 100, to: 1000 }, 5000)).toEqual([]);
  });
});
