import { describe, expect, it } from 'vitest';
import type { LabOverviewAnswer, OverviewChannel } from '@shared/contract/overview.ts';
import { attentionEntries, durationText, rangeText } from './attention-items.ts';

const NOW = '2026-11-24T12:00:00.000Z';

const channel = (id: number, over: Partial<OverviewChannel> = {}): OverviewChannel => ({
  id,
  key: `ch${id}`,
  label: `Channel ${id}`,
  quantity: 'temperature',
  unit: '°C',
  logger: { id: 7, name: 'Mast 2' },
  status: 'live',
  intervalS: 60,
  lastReading: { time: '2026-11-24T11:59:00.000Z', value: 4 },
  validMin: null,
  validMax: null,
  ...over,
});

/** An overview with one of every attention item, listed deliberately out of order. */
function everything(): LabOverviewAnswer {
  return {
    now: NOW,
    loggerCount: 3,
    empty: false,
    firstSteps: [],
    plan: {
      planName: 'Seedling',
      ingestionRefused: false,
      usage: [
        { measure: 'readings', used: 850, allowed: 1000, level: 80 },
        { measure: 'loggers', used: 1, allowed: 5, level: 0 },
        { measure: 'members', used: 4, allowed: 4, level: 100 },
        { measure: 'quarantinedRows', used: 0, allowed: 10, level: 0 },
      ],
    },
    keys: {
      neverUsed: [{ logger: { id: 11, name: 'Greenhouse' }, since: NOW }],
      neverUsedCount: 1,
      withoutKey: [{ logger: { id: 12, name: 'Spare' }, since: NOW }],
      withoutKeyCount: 1,
    },
    quarantine: { waiting: 12_000, byReason: [{ reason: 'bad_time', count: 10_000, atLeast: true, latestAt: NOW }] },
    channels: {
      total: 3,
      counts: { live: 1, silent: 1, 'out-of-range': 1, 'no-data': 0 },
      silent: [channel(2, { status: 'silent', intervalS: 300, lastReading: { time: '2026-11-24T09:00:00.000Z', value: 1 } })],
      outOfRange: [channel(3, { status: 'out-of-range', validMin: -25, validMax: -15, lastReading: { time: NOW, value: -8.5 } })],
    },
    alerts: {
      openCount: 2,
      recent: [
        {
          id: 99,
          ruleName: 'Freezer warm',
          openedAt: NOW,
          detail: '-8.5 is above -15',
          acknowledged: false,
          channel: { id: 3, label: 'Channel 3' },
          logger: null,
        },
      ],
    },
    lastUpload: null,
  };
}

describe('attentionEntries', () => {
  it('lists the most urgent first: open alerts, out of range, silent, quarantine, unused keys, no key, plan', () => {
    const entries = attentionEntries(everything(), 'fern-lab', (r) => `label:${r}`);
    expect(entries.map((e) => e.kind)).toEqual(['open-alerts', 'out-of-range', 'silent', 'quarantine', 'unused-key', 'no-key', 'plan', 'plan']);
  });

  it('links each entry to where it is dealt with', () => {
    const entries = attentionEntries(everything(), 'fern-lab', (r) => `label:${r}`);
    expect(entries.map((e) => e.href)).toEqual([
      '/labs/fern-lab/alerts',
      '/labs/fern-lab/channels/3',
      '/labs/fern-lab/channels/2',
      '/labs/fern-lab/quarantine?reason=bad_time',
      '/labs/fern-lab/loggers/11',
      '/labs/fern-lab/loggers/12',
      '/labs/fern-lab/billing',
      '/labs/fern-lab/billing',
    ]);
  });

  it('says what is wrong in plain words', () => {
    const [alerts, range, silent, quarantine, , , nearly, full] = attentionEntries(everything(), 'fern-lab', (r) => `label:${r}`);
    expect(alerts).toMatchObject({ title: '2 open alerts', detail: 'Newest: Freezer warm on Channel 3.' });
    expect(range).toMatchObject({ title: 'Channel 3 is out of range', detail: 'Last value -8.5 °C on Mast 2; valid is -25 to -15 °C.' });
    expect(silent).toMatchObject({ title: 'Channel 2 is silent', detail: 'No reading from Mast 2 for 3 hours; one is expected every 5 minutes.' });
    expect(quarantine).toMatchObject({ title: '10,000 or more rows waiting in quarantine', detail: 'Reason: label:bad_time.' });
    expect(nearly.title).toBe('Near the plan’s limit: stored readings');
    expect(full).toMatchObject({ title: 'Plan limit reached: members and pending invitations', detail: '4 of 4 on the Seedling plan.' });
  });

  it('adds nothing for parts the role cannot see or that need no attention', () => {
    const o = everything();
    const guestView: LabOverviewAnswer = { now: o.now, loggerCount: 3, empty: false, firstSteps: [], channels: o.channels, alerts: o.alerts };
    expect(attentionEntries(guestView, 'x', String).map((e) => e.kind)).toEqual(['open-alerts', 'out-of-range', 'silent']);
    const calm: LabOverviewAnswer = {
      ...o,
      alerts: { openCount: 0, recent: [] },
      channels: { ...o.channels!, silent: [], outOfRange: [] },
      quarantine: { waiting: 0, byReason: [] },
      keys: { neverUsed: [], neverUsedCount: 0, withoutKey: [], withoutKeyCount: 0 },
      plan: { ...o.plan!, usage: o.plan!.usage.map((u) => ({ ...u, level: 0 as const })) },
    };
    expect(attentionEntries(calm, 'x', String)).toEqual([]);
  });

  it('keeps the channel on channel entries (for the safety caution) and escapes the slug and reason in links', () => {
    const entries = attentionEntries(everything(), 'lab with space', String);
    expect(entries[1].channel?.id).toBe(3);
    expect(entries[3].href).toBe('/labs/lab%20with%20space/quarantine?reason=bad_time');
  });
});

describe('wording helpers', () => {
  it('durations in the largest whole unit', () => {
    expect(durationText(59_000)).toBe('1 minute');
    expect(durationText(119 * 60_000)).toBe('119 minutes');
    expect(durationText(3 * 3_600_000)).toBe('3 hours');
    expect(durationText(49 * 3_600_000)).toBe('2 days');
  });

  it('one-sided ranges', () => {
    expect(rangeText(channel(1, { validMax: 30 }))).toBe('at most 30 °C');
    expect(rangeText(channel(1, { validMin: 0, unit: null }))).toBe('at least 0');
  });
});
