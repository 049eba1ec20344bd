/** Shared check values for the chart option tests whose time axes must tick at Berlin midnights. */
// Berlin midnights around the two daylight-saving Sundays of 2026 (29 March, 25 October), from the IANA
// time zone database as Python 3.11's zoneinfo reads it (`/usr/bin/python3`:
// `datetime(2026, 3, 30, tzinfo=ZoneInfo('Europe/Berlin')).astimezone(timezone.utc)` → 2026-03-29T22:00Z).
export const BERLIN_MARCH = { from: Date.parse('2026-03-26T12:00:00Z'), to: Date.parse('2026-03-31T12:00:00Z') };
export const BERLIN_MARCH_MIDNIGHTS = [
  '2026-03-26T23:00:00.000Z',
  '2026-03-27T23:00:00.000Z',
  '2026-03-28T23:00:00.000Z',
  '2026-03-29T22:00:00.000Z',
  '2026-03-30T22:00:00.000Z',
];
export const BERLIN_OCTOBER = { from: Date.parse('2026-10-23T12:00:00Z'), to: Date.parse('2026-10-27T12:00:00Z') };
export const BERLIN_OCTOBER_MIDNIGHTS = ['2026-10-23T22:00:00.000Z', '2026-10-24T22:00:00.000Z', '2026-10-25T23:00:00.000Z', '2026-10-26T23:00:00.000Z'];
export type TimeAxis = { axisTick: { customValues: number[] }; axisLabel: { customValues: number[]; formatter: (v: number) => string } };
export const isoTicks = (x: TimeAxis) => x.axisTick.customValues.map((t) => new Date(t).toISOString());
